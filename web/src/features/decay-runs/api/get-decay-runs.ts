import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DecayRun } from '../../../../../shared/schemas/decay-run';
import { apiFetch } from '../../../lib/api-client';

/** The stored decay runs' query keys, general to specific; every helper invalidates through them. */
export const decayRunKeys = {
  all: ['decay-runs'] as const,
  lists: () => [...decayRunKeys.all, 'list'] as const,
  visit: (visitId: string) => [...decayRunKeys.lists(), 'visit', visitId] as const,
  bank: (bankId: string) => [...decayRunKeys.lists(), 'bank', bankId] as const,
  details: () => [...decayRunKeys.all, 'detail'] as const,
  detail: (runId: string) => [...decayRunKeys.details(), runId] as const,
};

/** The runs stored on a visit, newest first, every version. */
export async function getVisitDecayRuns(visitId: string): Promise<DecayRun[]> {
  return (
    await apiFetch<{ items: DecayRun[] }>(`/api/visits/${encodeURIComponent(visitId)}/decay-runs`)
  ).items;
}

/** The runs stored on a bank, newest first, every version. */
export async function getBankDecayRuns(bankId: string): Promise<DecayRun[]> {
  return (
    await apiFetch<{ items: DecayRun[] }>(`/api/banks/${encodeURIComponent(bankId)}/decay-runs`)
  ).items;
}

/** One stored run (any version). */
export async function getDecayRun(runId: string): Promise<DecayRun> {
  return apiFetch<DecayRun>(`/api/decay-runs/${encodeURIComponent(runId)}`);
}

export const visitDecayRunsQueryOptions = (visitId: string) =>
  queryOptions({
    queryKey: decayRunKeys.visit(visitId),
    queryFn: () => getVisitDecayRuns(visitId),
  });

export const bankDecayRunsQueryOptions = (bankId: string) =>
  queryOptions({ queryKey: decayRunKeys.bank(bankId), queryFn: () => getBankDecayRuns(bankId) });

export const decayRunQueryOptions = (runId: string) =>
  queryOptions({ queryKey: decayRunKeys.detail(runId), queryFn: () => getDecayRun(runId) });

export const useVisitDecayRuns = (visitId: string) => useQuery(visitDecayRunsQueryOptions(visitId));

export const useBankDecayRuns = (bankId: string) => useQuery(bankDecayRunsQueryOptions(bankId));

export const useDecayRun = (runId: string) => useQuery(decayRunQueryOptions(runId));
