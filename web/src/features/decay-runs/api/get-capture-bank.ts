import { queryOptions, useQuery } from '@tanstack/react-query';
import { useMemo } from 'react';
import { bankEngineInputs, type BankEngineInputs } from '../../../../../shared/domain';
import type { Bank } from '../../../../../shared/schemas/bank';
import { apiFetch } from '../../../lib/api-client';
import { decayRunKeys } from './get-decay-runs';

/** One bank as the register keeps it: what a capture judges its readings with. */
export async function getCaptureBank(bankId: string): Promise<Bank> {
  return apiFetch<Bank>(`/api/banks/${encodeURIComponent(bankId)}`);
}

/** The bank of a capture; kept a day, so a capture started online keeps its live verdict offline. */
export const captureBankQueryOptions = (bankId: string) =>
  queryOptions({
    queryKey: [...decayRunKeys.all, 'capture-bank', bankId] as const,
    queryFn: () => getCaptureBank(bankId),
    staleTime: 5 * 60_000,
    gcTime: 24 * 3_600_000,
  });

/**
 * The engine's inputs of a bank for a live verdict (the same mapping the server uses), or null
 * while the bank is loading, when it cannot be loaded (offline), or when its design has no revision.
 */
export function useCaptureEngine(bankId: string): {
  engine: BankEngineInputs | null;
  bank: Bank | undefined;
  isPending: boolean;
} {
  const bank = useQuery(captureBankQueryOptions(bankId));
  const engine = useMemo(() => (bank.data ? bankEngineInputs(bank.data) : null), [bank.data]);
  return { engine, bank: bank.data, isPending: bank.isPending };
}
