import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ShutdownWindowImportPreview } from '../../../../../shared/schemas/shutdown-window-import';
import { uploadImportFile, type ImportUploadOptions } from '../../../lib/upload';
import { shutdownWindowKeys } from './shutdown-windows';

/** Where the template downloads from (GET, an attachment). */
export const WINDOW_IMPORT_TEMPLATE_URL = '/api/shutdown-windows/import/template';

/** Uploads the CSV to POST /api/shutdown-windows/import/preview or POST /api/shutdown-windows/import. Throws ApiError. */
export function uploadShutdownWindows(options: ImportUploadOptions): Promise<ShutdownWindowImportPreview> {
  return uploadImportFile<ShutdownWindowImportPreview>(
    { preview: '/api/shutdown-windows/import/preview', commit: '/api/shutdown-windows/import' },
    options,
  );
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
