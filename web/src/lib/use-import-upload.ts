import type { UseMutationResult } from '@tanstack/react-query';
import { useState } from 'react';
import { isImportRowRefusal, type ImportUploadOptions } from './upload';

/** What every import preview carries that the import screen's flow needs. */
interface ImportResult {
  committed: boolean;
}

/**
 * The state of an import screen: the file chosen (checked in the browser first with
 * `fileProblem`), the upload's progress, the preview, and whether its unlikely values are checked.
 * `choose` previews a file; `commit` imports it; a commit refused for problems or questions found
 * since the preview shows them as the preview does.
 */
export function useImportUpload<T extends ImportResult>({
  upload,
  csrfToken,
  fileProblem,
}: {
  upload: UseMutationResult<T, Error, ImportUploadOptions>;
  csrfToken: string | null;
  fileProblem: (file: File) => string | null;
}) {
  const [file, setFile] = useState<File | null>(null);
  const [localProblem, setLocalProblem] = useState<string | null>(null);
  const [progress, setProgress] = useState(0);
  const [preview, setPreview] = useState<T | null>(null);
  // the unlikely values of this preview are checked; a new preview asks again
  const [questionsChecked, setQuestionsChecked] = useState(false);

  const send = (chosen: File, mode: 'preview' | 'commit') => {
    setProgress(0);
    upload.mutate(
      { file: chosen, mode, csrfToken, confirmed: mode === 'commit' && questionsChecked, onProgress: setProgress },
      {
        onSuccess: (result) => {
          if (!result.committed) setQuestionsChecked(false);
          setPreview(result);
        },
        onError: (error) => {
          if (isImportRowRefusal(error)) send(chosen, 'preview');
        },
      },
    );
  };
  const choose = (chosen: File | undefined) => {
    setPreview(null);
    upload.reset();
    if (!chosen) return;
    const problem = fileProblem(chosen);
    setLocalProblem(problem);
    setFile(problem ? null : chosen);
    if (!problem) send(chosen, 'preview');
  };
  const commit = () => {
    if (file) send(file, 'commit');
  };
  /** Back to choosing a file, after an import. */
  const startAgain = () => {
    setPreview(null);
    setFile(null);
  };
  return { file, localProblem, progress, preview, questionsChecked, setQuestionsChecked, choose, commit, startAgain };
}
