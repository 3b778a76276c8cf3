import { useMutation } from '@tanstack/react-query';
import type {
  Bank,
  BankBaselineInput,
  BankDetail,
  BankInput,
  BankReplacementInput,
  BankUpdate,
} from '../../../../../shared/schemas/bank';
import { apiFetch } from '../../../lib/api-client';
import { createResourceApi } from './resource';

/** GET/POST /api/banks, GET/PATCH/DELETE /api/banks/:bankId, GET …/audit. */
export const banksApi = createResourceApi<Bank, BankDetail, BankInput, BankUpdate>('banks', '/api/banks');

/** PUT /api/banks/:bankId/baseline (reliability engineers). */
export const setBankBaseline = (bankId: string, input: BankBaselineInput) =>
  apiFetch<BankDetail>(`/api/banks/${bankId}/baseline`, { method: 'PUT', body: JSON.stringify(input) });

/** POST /api/banks/:bankId/replacement: answers with the new bank. */
export const replaceBank = (bankId: string, input: BankReplacementInput) =>
  apiFetch<BankDetail>(`/api/banks/${bankId}/replacement`, { method: 'POST', body: JSON.stringify(input) });

export function useSetBankBaseline(bankId: string) {
  const invalidate = banksApi.useInvalidate();
  return useMutation({ mutationFn: (input: BankBaselineInput) => setBankBaseline(bankId, input), onSuccess: () => invalidate(bankId) });
}

export function useReplaceBank(bankId: string) {
  const invalidate = banksApi.useInvalidate();
  return useMutation({ mutationFn: (input: BankReplacementInput) => replaceBank(bankId, input), onSuccess: () => invalidate(bankId) });
}
