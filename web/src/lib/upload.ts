import { ApiError, errorDetails } from './api-client';

export interface ImportUploadOptions {
  file: File;
  /** Preview only (nothing stored) or commit every row. */
  mode: 'preview' | 'commit';
  /** The session's CSRF token, sent as X-CSRF-Token. */
  csrfToken: string | null;
  /** The person has checked the file's unlikely values and keeps them (commit only). */
  confirmed?: boolean;
  /** Fraction of the file sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
}

/** Where an import sends its file: the preview (nothing stored) and the commit. */
export interface ImportUploadPaths {
  preview: string;
  commit: string;
}

/** True for an import the server refused for its rows (problems, or questions not confirmed). */
export function isImportRowRefusal(error: unknown): boolean {
  return error instanceof ApiError && (error.code === 'import-rejected' || error.code === 'confirmation-needed');
}

/**
 * Uploads a file as multipart form data (field `file`, and `confirmed=true` when the person keeps
 * the unlikely values) with XMLHttpRequest, since fetch cannot report upload progress, to the
 * preview or the commit path. Resolves with the JSON answer; throws ApiError like apiFetch.
 */
export function uploadImportFile<T>(
  paths: ImportUploadPaths,
  { file, mode, csrfToken, confirmed, onProgress }: ImportUploadOptions,
): Promise<T> {
  const form = new FormData();
  if (confirmed) form.append('confirmed', 'true');
  form.append('file', file);
  return uploadForm<T>(mode === 'preview' ? paths.preview : paths.commit, form, { csrfToken, onProgress });
}

/** How a form upload is sent: the session's CSRF token and a progress callback. */
export interface FormUploadOptions {
  /** The session's CSRF token, sent as X-CSRF-Token. */
  csrfToken: string | null;
  /** Fraction of the body sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
}

/**
 * Posts a multipart form with XMLHttpRequest (fetch cannot report upload progress). Resolves
 * with the JSON answer; throws ApiError like apiFetch (status 0, code `network`, when the server
 * cannot be reached).
 */
export function uploadForm<T>(path: string, form: FormData, { csrfToken, onProgress }: FormUploadOptions): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.setRequestHeader('Accept', 'application/json');
    if (csrfToken) xhr.setRequestHeader('X-CSRF-Token', csrfToken);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'Ebbline cannot reach its server. Check the connection and try again.'));
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress?.(1);
        resolve(body as T);
        return;
      }
      const error = (body as { error?: { code?: string; message?: string; issues?: Array<{ path: string; message: string }> } })?.error;
      reject(
        new ApiError(
          xhr.status,
          error?.code ?? `http-${xhr.status}`,
          error?.message ?? `The server answered ${xhr.status}.`,
          error?.issues,
          undefined,
          errorDetails(error),
        ),
      );
    };
    xhr.send(form);
  });
}
