import { useMutation } from '@tanstack/react-query';
import type { LoggerColumnCandidates, LoggerFilePreview } from '../../../../../shared/schemas/logger-file';
import { ApiError, currentCsrfToken } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';

/** What one logger-file preview sends. */
export interface LoggerFileUpload {
  file: File;
  /** The time column by header text or 1-based number, when the file's names do not tell. */
  timeColumn?: string;
  /** The voltage column by header text or 1-based number, when the file's names do not tell. */
  voltsColumn?: string;
  /** Fraction of the file sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
}

/**
 * Reads a logger or oscilloscope file on the server (`POST /api/logger-files/preview`, multipart
 * `file`, `timeColumn?`, `voltsColumn?`): the readings, ready to judge. Nothing is stored.
 * Throws ApiError; a 422 `columns-ambiguous` carries the columns to choose from
 * ({@link columnCandidatesOf}).
 */
export function previewLoggerFile({ file, timeColumn, voltsColumn, onProgress }: LoggerFileUpload): Promise<LoggerFilePreview> {
  const form = new FormData();
  if (timeColumn) form.append('timeColumn', timeColumn);
  if (voltsColumn) form.append('voltsColumn', voltsColumn);
  // the file last: the fields are read before the file's bytes arrive
  form.append('file', file);
  return uploadForm<LoggerFilePreview>('/api/logger-files/preview', form, { csrfToken: currentCsrfToken(), onProgress });
}

/** The columns to choose from when the server could not tell them by their names, else null. */
export function columnCandidatesOf(error: unknown): LoggerColumnCandidates | null {
  if (!(error instanceof ApiError) || error.code !== 'columns-ambiguous') return null;
  const candidates = error.details.candidates as LoggerColumnCandidates | undefined;
  return candidates && Array.isArray(candidates.columns) ? candidates : null;
}

/** Reads a logger file (nothing is stored, so nothing to invalidate). */
export function usePreviewLoggerFile() {
  return useMutation({ mutationFn: previewLoggerFile });
}
