import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportPreview } from '../../../../../shared/schemas/cabinet-import';
import { ApiError } from '../../../lib/api-client';
import { areasApi } from './areas';
import { cabinetsApi } from './cabinets';

/** Where the template downloads from (GET, an attachment). */
export const CABINET_IMPORT_TEMPLATE_URL = '/api/cabinets/import/template';

export interface UploadOptions {
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

/**
 * Uploads the CSV with XMLHttpRequest (fetch cannot report upload progress) to
 * POST /api/cabinets/import/preview or POST /api/cabinets/import. Throws ApiError like apiFetch.
 */
export function uploadCabinetRegister({ file, mode, csrfToken, confirmed, onProgress }: UploadOptions): Promise<ImportPreview> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', mode === 'preview' ? '/api/cabinets/import/preview' : '/api/cabinets/import');
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
        resolve(body as ImportPreview);
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

export function useUploadCabinetRegister() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: uploadCabinetRegister,
    onSuccess: async (result) => {
      if (!result.committed) return;
      await Promise.all([
        client.invalidateQueries({ queryKey: cabinetsApi.keys.all }),
        client.invalidateQueries({ queryKey: areasApi.keys.all }),
      ]);
    },
  });
}
