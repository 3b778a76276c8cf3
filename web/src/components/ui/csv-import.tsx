import type { UseMutationResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { isImportRowRefusal, type ImportUploadOptions } from '../../lib/upload';
import { useImportUpload } from '../../lib/use-import-upload';
import { Badge } from './badge';
import { Button, buttonClass } from './button';
import { Card } from './card';
import { ErrorPanel } from './error-panel';
import { ProgressBar } from './progress-bar';

/** The pieces of a CSV import screen: file picker, its status, the preview's problems and questions. */

interface ImportProblem {
  row: number;
  column: string;
  reason: string;
}

interface ImportQuestion {
  row: number;
  column: string;
  message: string;
}

/** What a preview says of the whole file, for its summary and its commit bar. */
interface ImportCounts {
  rowCount: number;
  validCount: number;
  problemCount: number;
  questionCount: number;
  ignoredColumns: string[];
}

/** What every import preview carries that its screen shows. */
export interface ImportPreviewShape extends ImportCounts {
  fileName: string;
  problems: ImportProblem[];
  problemsNotListed: number;
  questions: ImportQuestion[];
  questionsNotListed: number;
  committed: boolean;
}

/** Checks in the browser what the server checks too, so a wrong file is named before it is sent. */
export function csvFileProblem(file: File, maxBytes: number): string | null {
  if (!/\.csv$/i.test(file.name)) return `${file.name} is not a .csv file. In your spreadsheet, save as “CSV (comma or semicolon separated)”.`;
  if (file.size > maxBytes) return `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${maxBytes / 1024 / 1024} MB. Split it and import the parts.`;
  if (file.size === 0) return `${file.name} is empty.`;
  return null;
}

/** The file's columns, folded away: name, a star when required, and a hint. */
export function ImportColumnsList({ columns }: { columns: ReadonlyArray<{ name: string; required: boolean; hint: string }> }) {
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer font-medium text-tide-600">The columns</summary>
      <ul className="mt-2 grid gap-1 sm:grid-cols-2">
        {columns.map((c) => (
          <li key={c.name}>
            <span className="font-mono">{c.name}</span>
            {c.required ? <span className="text-eol-600"> *</span> : null} <span className="text-tide-600">{c.hint}</span>
          </li>
        ))}
      </ul>
    </details>
  );
}

/**
 * Choosing the CSV file: a button-styled label over a hidden file input (`id` ties them), then the
 * chosen file's name and size; the chosen file, problem found below it, upload progress, and an
 * error the server gave that is not about the rows.
 */
export function CsvFilePicker({
  id,
  file,
  onChoose,
  localProblem,
  pending,
  progress,
  error,
}: {
  id: string;
  file: File | null;
  onChoose: (file: File | undefined) => void;
  localProblem: string | null;
  pending: boolean;
  progress: number;
  error: Error | null;
}) {
  return (
    <>
      <div className="mt-4 flex flex-wrap items-center gap-3">
        <input
          type="file"
          accept=".csv,text/csv"
          className="sr-only"
          id={id}
          data-testid="import-file"
          onChange={(e) => {
            onChoose(e.target.files?.[0]);
            // the same file, fixed and chosen again, must fire a change too
            e.target.value = '';
          }}
        />
        <label htmlFor={id} className={buttonClass('primary')}>
          {file ? 'Choose another file' : 'Choose a CSV file'}
        </label>
        {file ? (
          <span className="text-sm text-tide-800">
            {file.name} · {(file.size / 1024).toFixed(1)} KB
          </span>
        ) : null}
      </div>
      {localProblem ? (
        <p role="alert" className="mt-3 text-sm font-medium text-eol-600">
          {localProblem}
        </p>
      ) : null}
      {pending ? (
        <div className="mt-4">
          <ProgressBar fraction={progress} label={progress < 1 ? `Uploading ${file?.name ?? ''}` : 'Checking every row…'} />
        </div>
      ) : null}
      {error && !isImportRowRefusal(error) ? (
        <div className="mt-4">
          <ErrorPanel title="The file could not be read">{error.message}</ErrorPanel>
        </div>
      ) : null}
    </>
  );
}

/** The preview's counts as badges; `children` (more badges) go before the columns left out. */
export function ImportSummary({ preview, children }: { preview: ImportCounts; children?: ReactNode }) {
  return (
    <div className="mb-4 flex flex-wrap gap-2 text-sm" data-testid="import-summary">
      <Badge>{preview.rowCount} rows</Badge>
      <Badge tone="ok">{preview.validCount} ready</Badge>
      {preview.problemCount ? <Badge tone="danger">{preview.problemCount} problems</Badge> : null}
      {preview.questionCount ? <Badge tone="warn">{preview.questionCount} to check</Badge> : null}
      {children}
      {preview.ignoredColumns.length ? <Badge tone="muted">left out: {preview.ignoredColumns.join(', ')}</Badge> : null}
    </div>
  );
}

/**
 * The problems of the file by row and column. `notListedNote` words the line under the table when
 * more problems were found than listed (by default it counts them and says how many are shown).
 */
export function ImportProblemsTable({
  preview,
  notListedNote,
}: {
  preview: { problemCount: number; problems: ImportProblem[]; problemsNotListed: number };
  notListedNote?: ReactNode;
}) {
  return (
    <div className="overflow-x-auto rounded-xl border border-eol-600/30 bg-white">
      <table className="w-full text-left text-sm" data-testid="import-problems">
        <caption className="bg-eol-600/5 px-4 py-2 text-left font-bold text-eol-600">
          {preview.problemCount.toLocaleString('en-GB')} problem{preview.problemCount === 1 ? '' : 's'} to fix
          {preview.problemsNotListed > 0 ? ` (the first ${preview.problems.length} listed)` : ''}: nothing is imported until every row is
          right
        </caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2 sm:px-4">Row</th>
            <th className="px-3 py-2 sm:px-4">Column</th>
            <th className="px-3 py-2 sm:px-4">Reason</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {preview.problems.map((p, i) => (
            <tr key={`${p.row}-${p.column}-${i}`} data-testid="import-problem" data-row={p.row} data-column={p.column}>
              <td className="px-3 py-2 font-mono sm:px-4">{p.row}</td>
              <td className="whitespace-nowrap px-3 py-2 font-mono sm:px-4">{p.column || '—'}</td>
              <td className="min-w-40 px-3 py-2 sm:px-4">{p.reason}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {preview.problemsNotListed > 0 ? (
        <p className="px-3 py-2 text-sm font-medium text-eol-600 sm:px-4" data-testid="import-problems-not-listed">
          {notListedNote ?? (
            <>
              …and {preview.problemsNotListed.toLocaleString('en-GB')} more problem{preview.problemsNotListed === 1 ? '' : 's'} not listed
              here (the first {preview.problems.length} are shown). Fix these, then upload the file again to see the rest.
            </>
          )}
        </p>
      ) : null}
    </div>
  );
}

/**
 * The file's unlikely values, with the box the person ticks to keep them. Separate from the
 * problems: a question does not stop the import once the values are checked. `checkAgainst` ends
 * the caption with what to check them against; `listsNotListed` says under the table how many
 * more were found than listed.
 */
export function ImportQuestionsPanel({
  preview,
  checked,
  onCheckedChange,
  checkAgainst,
  listsNotListed = true,
}: {
  preview: { questionCount: number; questions: ImportQuestion[]; questionsNotListed: number };
  checked: boolean;
  onCheckedChange: (checked: boolean) => void;
  checkAgainst?: string;
  listsNotListed?: boolean;
}) {
  const count = preview.questionCount;
  return (
    <div className="overflow-x-auto rounded-xl border border-watch-600/40 bg-white" data-testid="import-questions-panel">
      <table className="w-full text-left text-sm" data-testid="import-questions">
        <caption className="bg-spark-300/15 px-4 py-2 text-left font-bold text-watch-600">
          Are you sure? {count.toLocaleString('en-GB')} unlikely value{count === 1 ? '' : 's'}
          {preview.questionsNotListed > 0 ? ` (the first ${preview.questions.length} listed)` : ''}
          {checkAgainst ? `: check ${count === 1 ? 'it' : 'them'} against ${checkAgainst} before importing` : ''}
        </caption>
        <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
          <tr>
            <th className="px-3 py-2 sm:px-4">Row</th>
            {/* on a phone the column's name goes under the row number, so the question keeps the width */}
            <th className="hidden px-3 py-2 sm:table-cell sm:px-4">Column</th>
            <th className="px-3 py-2 sm:px-4">Question</th>
          </tr>
        </thead>
        <tbody className="divide-y divide-tide-100">
          {preview.questions.map((q, i) => (
            <tr key={`${q.row}-${q.column}-${i}`} data-testid="import-question" data-row={q.row} data-column={q.column}>
              <td className="px-3 py-2 align-top font-mono sm:px-4 sm:align-middle">
                {q.row}
                <span className="block text-xs text-tide-600 sm:hidden">{q.column}</span>
              </td>
              <td className="hidden whitespace-nowrap px-3 py-2 font-mono sm:table-cell sm:px-4">{q.column}</td>
              <td className="px-3 py-2 sm:px-4">{q.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {listsNotListed && preview.questionsNotListed > 0 ? (
        <p className="px-3 py-2 text-sm font-medium text-watch-600 sm:px-4" data-testid="import-questions-not-listed">
          …and {preview.questionsNotListed.toLocaleString('en-GB')} more not listed here (the first {preview.questions.length} are shown).
        </p>
      ) : null}
      <label className="flex min-h-11 items-center gap-3 border-t border-watch-600/20 px-3 py-2 text-sm font-medium text-tide-900 sm:px-4">
        <input
          type="checkbox"
          className="h-5 w-5 shrink-0 accent-tide-600"
          checked={checked}
          onChange={(e) => onCheckedChange(e.target.checked)}
          data-testid="import-questions-checked"
        />
        I have checked these values
      </label>
    </div>
  );
}

/**
 * The import button (its label as `children`) and what stands in its way: problems to fix, or
 * unlikely values not yet checked.
 */
export function ImportCommitBar({
  preview,
  questionsChecked,
  disabled,
  onCommit,
  children,
}: {
  preview: ImportCounts;
  questionsChecked: boolean;
  disabled: boolean;
  onCommit: () => void;
  children: ReactNode;
}) {
  return (
    <div className="mt-4 flex flex-wrap items-center gap-3 border-t border-tide-100 pt-4">
      <Button
        variant="primary"
        disabled={preview.problemCount > 0 || (preview.questionCount > 0 && !questionsChecked) || disabled}
        onClick={onCommit}
      >
        {children}
      </Button>
      <span className="text-sm text-tide-800">
        {preview.problemCount
          ? 'Fix the rows above in your file and choose it again.'
          : preview.questionCount && !questionsChecked
            ? 'Check the unlikely values above: correct them in your file, or tick the box to keep them.'
            : 'All rows go in together, or none do.'}
      </span>
    </div>
  );
}

/**
 * The steps of a CSV import, as cards: choose the file (`intro`, the columns, the picker), check
 * the rows of the preview (its problems, its questions, then `rows`) and import them all, and
 * what was imported (`doneMessage`, `doneLink`, and starting again).
 */
export function CsvImportSteps<T extends ImportPreviewShape>({
  upload,
  csrfToken,
  maxBytes,
  fileInputId,
  intro,
  columns,
  summaryBadges,
  problemsNotListedNote,
  questionsCheckAgainst,
  questionsListNotListed,
  rows,
  commitLabel,
  doneMessage,
  doneLink,
}: {
  upload: UseMutationResult<T, Error, ImportUploadOptions>;
  csrfToken: string | null;
  maxBytes: number;
  fileInputId: string;
  intro: ReactNode;
  columns: ReadonlyArray<{ name: string; required: boolean; hint: string }>;
  summaryBadges?: (preview: T) => ReactNode;
  problemsNotListedNote?: (preview: T) => ReactNode;
  questionsCheckAgainst?: string;
  questionsListNotListed?: boolean;
  rows: (preview: T) => ReactNode;
  commitLabel: (preview: T) => ReactNode;
  doneMessage: (preview: T) => ReactNode;
  doneLink: ReactNode;
}) {
  const { file, localProblem, progress, preview, questionsChecked, setQuestionsChecked, choose, commit, startAgain } = useImportUpload({
    upload,
    csrfToken,
    fileProblem: (chosen) => csvFileProblem(chosen, maxBytes),
  });
  return (
    <>
      <Card title="1 · Choose the file">
        <p className="text-sm text-tide-800">{intro}</p>
        <ImportColumnsList columns={columns} />
        <CsvFilePicker
          id={fileInputId}
          file={file}
          onChoose={choose}
          localProblem={localProblem}
          pending={upload.isPending}
          progress={progress}
          error={upload.error}
        />
      </Card>

      {preview && !preview.committed ? (
        <Card title="2 · Check the rows">
          <ImportSummary preview={preview}>{summaryBadges?.(preview)}</ImportSummary>
          <div className="space-y-4">
            {preview.problemCount ? <ImportProblemsTable preview={preview} notListedNote={problemsNotListedNote?.(preview)} /> : null}
            {preview.questionCount ? (
              <ImportQuestionsPanel
                preview={preview}
                checked={questionsChecked}
                onCheckedChange={setQuestionsChecked}
                checkAgainst={questionsCheckAgainst}
                listsNotListed={questionsListNotListed}
              />
            ) : null}
            {rows(preview)}
          </div>
          <ImportCommitBar preview={preview} questionsChecked={questionsChecked} disabled={upload.isPending || !file} onCommit={commit}>
            {commitLabel(preview)}
          </ImportCommitBar>
        </Card>
      ) : null}

      {preview?.committed ? (
        <Card title="Imported">
          <p className="text-tide-900" role="status" data-testid="import-done">
            {doneMessage(preview)}
          </p>
          <div className="mt-3 flex flex-wrap gap-2">
            {doneLink}
            <Button onClick={startAgain}>Import another file</Button>
          </div>
        </Card>
      ) : null}
    </>
  );
}
