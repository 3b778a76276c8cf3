import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BankDesign, BankDesignInput, BankDesignRevision, BankDesignUpdate } from '../../../../../shared/schemas/bank-design';
import { apiFetch } from '../../../lib/api-client';
import { createResourceApi } from './resource';

/** GET/POST /api/bank-designs, GET/PATCH/DELETE /api/bank-designs/:designId, GET …/audit. */
export const bankDesignsApi = createResourceApi<BankDesign, BankDesign, BankDesignInput, BankDesignUpdate>(
  'bank-designs',
  '/api/bank-designs',
);

/** GET /api/bank-designs/:designId/versions: every revision, newest first. */
export const getBankDesignRevisions = async (designId: string) =>
  (await apiFetch<{ items: BankDesignRevision[] }>(`/api/bank-designs/${designId}/versions`)).items;

export const bankDesignRevisionsOptions = (designId: string) =>
  queryOptions({ queryKey: [...bankDesignsApi.keys.detail(designId), 'revisions'] as const, queryFn: () => getBankDesignRevisions(designId) });

export const useBankDesignRevisions = (designId: string) => useQuery(bankDesignRevisionsOptions(designId));
