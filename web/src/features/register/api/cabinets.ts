import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Cabinet, CabinetInput, CabinetLabel, CabinetUpdate } from '../../../../../shared/schemas/cabinet';
import { apiFetch } from '../../../lib/api-client';
import { createResourceApi } from './resource';

/** GET/POST /api/cabinets, GET/PATCH/DELETE /api/cabinets/:cabinetId, GET …/audit. */
export const cabinetsApi = createResourceApi<Cabinet, Cabinet, CabinetInput, CabinetUpdate>('cabinets', '/api/cabinets');

/** GET /api/cabinets/:cabinetId/label: the page address (from APP_URL) and its QR code. */
export const getCabinetLabel = (cabinetId: string) => apiFetch<CabinetLabel>(`/api/cabinets/${cabinetId}/label`);

export const cabinetLabelOptions = (cabinetId: string) =>
  queryOptions({ queryKey: [...cabinetsApi.keys.detail(cabinetId), 'label'] as const, queryFn: () => getCabinetLabel(cabinetId) });

export const useCabinetLabel = (cabinetId: string) => useQuery(cabinetLabelOptions(cabinetId));
