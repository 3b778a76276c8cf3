import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ShutdownWindowImportPreview } from '../../../../../shared/schemas/shutdown-window-import';
import { ApiError } from '../../../lib/api-client';
import { shutdownWindowKeys } from './shutdown-windows';

/** Where the template downloads from (GET, an attachment). */
export const WINDOW_IMPORT_TEMPLATE_URL = '/api/shutdown-windows/import/template';

export interface WindowUploadOptions {
  file: File;
  /** Preview only (nothing stored) or commit every row. */
  mode: 'preview' | 'commit';
  csrfToken: string | null;
  /** The person has checked the file's unlikely values and keeps them (commit only). */
  confirmed?: boolean;
  /** Fraction of the file sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
}

/**
 * Uploads the CSV with XMLHttpRequest (fetch cannot report upload progress) to
 * POST /api/shutdown-windows/import/preview or POST /api/shutdown-windows/import. Throws ApiError.
 */
export function uploadShutdownWindows({ file, mode, csrfToken, confirmed, onProgress }: WindowUploadOptions): Promise<ShutdownWindowImportPreview> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', mode === 'preview' ? '/api/shutdown-windows/import/preview' : '/api/shutdown-windows/import');
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
        resolve(body as ShutdownWindowImportPreview);
        return;
      }
      const error = (body as { error?: { code?: string; message?: string; issues?: Array<{ path: string; message: string }> } })?.error;
      reject(new ApiError(xhr.status, error?.code ?? `http-${xhr.status}`, error?.message ?? `The server answered ${xhr.status}.`, error?.issues));
    };
    const form = new FormData();
    if (confirmed) form.append('confirmed', 'true');
    form.append('file', file);
    xhr.send(form);
  });
}

export function useUploadShutdownWindows() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadShutdownWindows,
    onSuccess: async (result) => {
      if (result.committed) await client.invalidateQueries({ queryKey: shutdownWindowKeys.all });
    },
  });
}
