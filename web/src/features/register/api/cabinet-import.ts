import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportPreview } from '../../../../../shared/schemas/cabinet-import';
import { uploadImportFile, type ImportUploadOptions } from '../../../lib/upload';
import { areasApi } from './areas';
import { cabinetsApi } from './cabinets';

/** Where the template downloads from (GET, an attachment). */
export const CABINET_IMPORT_TEMPLATE_URL = '/api/cabinets/import/template';

/** Uploads the CSV to POST /api/cabinets/import/preview or POST /api/cabinets/import. Throws ApiError like apiFetch. */
export function uploadCabinetRegister(options: ImportUploadOptions): Promise<ImportPreview> {
  return uploadImportFile<ImportPreview>({ preview: '/api/cabinets/import/preview', commit: '/api/cabinets/import' }, options);
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
