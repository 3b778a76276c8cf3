import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Bank } from '../../../../../shared/schemas/bank';
import type { ListPage } from '../../../../../shared/schemas/common';
import type { DecayRun, DecayRunReview } from '../../../../../shared/schemas/decay-run';
import type { Visit } from '../../../../../shared/schemas/visit';
import { apiFetch } from '../../../lib/api-client';
import { decayRunKeys } from './get-decay-runs';

/** Most visits the review queue shows at once (the one waiting longest first). */
export const REVIEW_QUEUE_SIZE = 100;

/**
 * Query keys of the review queue, under the decay runs' keys (invalidating `decayRunKeys.all`
 * reads the queue again too).
 */
export const reviewKeys = {
  all: [...decayRunKeys.all, 'review'] as const,
  queue: () => [...reviewKeys.all, 'queue'] as const,
  visit: (visitId: string) => [...reviewKeys.all, 'visit', visitId] as const,
  bank: (bankId: string) => [...reviewKeys.all, 'bank', bankId] as const,
};

/**
 * The visits waiting for review, the one waiting longest first: the logged ones, and reviewed
 * ones holding a corrected run still waiting.
 */
export async function getReviewQueue(): Promise<ListPage<Visit>> {
  const params = new URLSearchParams({ pageSize: String(REVIEW_QUEUE_SIZE) });
  return apiFetch<ListPage<Visit>>(`/api/review-queue?${params}`);
}

/** One visit as it is now (its state moves to reviewed with its last run's review). */
export async function getReviewedVisit(visitId: string): Promise<Visit> {
  return apiFetch<Visit>(`/api/visits/${encodeURIComponent(visitId)}`);
}

/** A bank with its baseline (whether a decay run set it decides whether a run is offered as its baseline). */
export async function getReviewBank(bankId: string): Promise<Bank> {
  return apiFetch<Bank>(`/api/banks/${encodeURIComponent(bankId)}`);
}

export const reviewQueueQueryOptions = () =>
  queryOptions({ queryKey: reviewKeys.queue(), queryFn: getReviewQueue });

export const reviewVisitQueryOptions = (visitId: string) =>
  queryOptions({ queryKey: reviewKeys.visit(visitId), queryFn: () => getReviewedVisit(visitId) });

export const reviewBankQueryOptions = (bankId: string) =>
  queryOptions({ queryKey: reviewKeys.bank(bankId), queryFn: () => getReviewBank(bankId) });

export const useReviewQueue = () => useQuery(reviewQueueQueryOptions());

export const useReviewBank = (bankId: string) => useQuery(reviewBankQueryOptions(bankId));

/** Accepts or queries one run (its current version), optionally making it the bank's baseline. */
export async function reviewDecayRun(runId: string, review: DecayRunReview): Promise<DecayRun> {
  return apiFetch<DecayRun>(`/api/decay-runs/${encodeURIComponent(runId)}/review`, {
    method: 'POST',
    body: JSON.stringify(review),
  });
}

/**
 * The review as a mutation. On success `onReviewed` is told first (before the queue is read
 * again and the visit may leave it), then the run, the visit's runs and lists, the visit (it may
 * have become reviewed) and the bank (its baseline may have moved) are read again.
 */
export function useReviewDecayRun(options: { onReviewed?: (run: DecayRun) => void } = {}) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({
      run,
      review,
    }: {
      run: Pick<DecayRun, 'id' | 'visitId' | 'bankId'>;
      review: DecayRunReview;
    }) => reviewDecayRun(run.id, review),
    onSuccess: async (answer, { run }) => {
      options.onReviewed?.(answer);
      client.setQueryData(decayRunKeys.detail(answer.id), answer);
      await Promise.all([
        client.invalidateQueries({ queryKey: decayRunKeys.lists() }),
        client.invalidateQueries({ queryKey: reviewKeys.visit(run.visitId) }),
        client.invalidateQueries({ queryKey: reviewKeys.bank(run.bankId) }),
        client.invalidateQueries({ queryKey: reviewKeys.queue() }),
      ]);
    },
    onError: async (_error, { run }) => {
      // someone else corrected or reviewed it meanwhile: show the runs as they are now
      await client.invalidateQueries({ queryKey: decayRunKeys.visit(run.visitId) });
    },
  });
}

/** Marks a logged visit reviewed by hand: for a visit that holds no decay run (nothing to accept or query). */
export async function markVisitReviewed(visit: Pick<Visit, 'id' | 'version'>): Promise<Visit> {
  return apiFetch<Visit>(`/api/visits/${encodeURIComponent(visit.id)}/transitions`, {
    method: 'POST',
    body: JSON.stringify({ action: 'review', version: visit.version }),
  });
}

export function useMarkVisitReviewed(options: { onReviewed?: (visit: Visit) => void } = {}) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (visit: Pick<Visit, 'id' | 'version'>) => markVisitReviewed(visit),
    onSuccess: async (visit) => {
      options.onReviewed?.(visit);
      client.setQueryData(reviewKeys.visit(visit.id), visit);
      await client.invalidateQueries({ queryKey: reviewKeys.queue() });
    },
  });
}
