import type { DecayRun, DecayRunInput } from '../../../../../shared/schemas/decay-run';
import { ApiError } from '../../../lib/api-client';
import type { RunDraft } from './draft-store';

/**
 * The sending rules of the drafts, apart from IndexedDB and React so they can be tested with
 * a store and a fetch of the test's own: which drafts go, what an answer does to a draft,
 * how long to wait before trying again.
 */

/** What the sync needs of the draft store. */
export interface DraftSendStore {
  list(): Promise<RunDraft[]>;
  /** Reads, changes and writes one draft atomically; `change` returning its argument writes nothing. */
  change(clientId: string, change: (draft: RunDraft) => RunDraft): Promise<RunDraft>;
  discard(clientId: string): Promise<void>;
}

/** Sends one draft's body; resolves with the stored run (201 or 200), throws ApiError otherwise. */
export type SubmitRun = (visitId: string, body: DecayRunInput) => Promise<DecayRun>;

/** A failure that may pass (retry later) or an answer that will not change (refused). */
export type FailureKind = 'retry' | 'refuse';

/**
 * How a failed send is treated: the network down (status 0), the server unavailable (5xx,
 * 503), a timeout or too many requests (408, 429), a session that ended (401) or a security
 * token of an old session (csrf-failed) pass: the draft stays ready and is sent again. Any
 * other 4xx is the server's answer on the run itself: the draft is refused, with its words.
 */
export function classifySendFailure(error: unknown): FailureKind {
  if (!(error instanceof ApiError)) return 'retry';
  const { status, code } = error;
  if (status === 0 || status >= 500 || status === 408 || status === 429 || status === 401) return 'retry';
  if (code === 'csrf-failed') return 'retry';
  return status >= 400 ? 'refuse' : 'retry';
}

/** The server's refusal in plain words, with the fields it named. */
export function refusalMessage(error: unknown): string {
  if (!(error instanceof ApiError)) return error instanceof Error ? error.message : 'The server refused this run.';
  const fields = error.issues.map((issue) => (issue.path ? `${issue.path}: ${issue.message}` : issue.message));
  return fields.length > 0 ? `${error.message} (${fields.join('; ')})` : error.message;
}

const FIRST_RETRY_MS = 2_000;
const LONGEST_RETRY_MS = 5 * 60_000;

/** Wait before the next try after `failedAttempts` passing failures: 2 s, 4 s, 8 s … at most 5 min. */
export function retryDelayMs(failedAttempts: number): number {
  if (failedAttempts <= 0) return 0;
  return Math.min(LONGEST_RETRY_MS, FIRST_RETRY_MS * 2 ** (failedAttempts - 1));
}

/** When a draft may be tried again (ms since epoch); 0 when now. */
export function nextAttemptAtMs(draft: RunDraft): number {
  if (!draft.failedAttempts || draft.lastFailedAtMs === undefined) return 0;
  return draft.lastFailedAtMs + retryDelayMs(draft.failedAttempts);
}

/**
 * True when this person's sync sends the draft: saved (ready), or left 'sending' by a tab
 * closed mid-send (the server keeps one run per clientId, so sending again is safe).
 * A draft made by someone else signed in on this phone waits for them.
 */
export function isWaitingToSend(draft: RunDraft, ownerId: string | undefined): boolean {
  if (draft.status !== 'ready' && draft.status !== 'sending') return false;
  return draft.ownerId === undefined || ownerId === undefined || draft.ownerId === ownerId;
}

/** Sent drafts are tidied away after a week: the server holds the run. */
export const KEEP_SENT_DRAFTS_MS = 7 * 24 * 3600_000;

export interface SendRoundResult {
  sent: DecayRun[];
  refused: RunDraft[];
  /** Drafts that failed for a passing reason this round. */
  failed: number;
  /** When the next try is due (ms since epoch), or undefined when nothing waits. */
  nextAttemptAtMs?: number;
}

/**
 * One round of sending: every draft waiting to be sent whose backoff has run out (all of
 * them when `force`, e.g. the connection came back or the technician just saved) is marked
 * sending, sent, and marked sent (with the run) or refused (with the server's words); a
 * passing failure puts it back to ready with one more failed attempt. A network failure
 * ends the round: the others would fail the same way. Sent drafts older than a week go.
 * One round at a time per phone (the caller holds a lock).
 */
export async function sendDraftsRound({
  store,
  submit,
  ownerId,
  nowMs,
  force = false,
  onSent,
}: {
  store: DraftSendStore;
  submit: SubmitRun;
  ownerId: string | undefined;
  /** The clock, read by the caller. */
  nowMs: () => number;
  force?: boolean;
  onSent?: (run: DecayRun, draft: RunDraft) => void;
}): Promise<SendRoundResult> {
  const result: SendRoundResult = { sent: [], refused: [], failed: 0 };
  const drafts = await store.list();
  for (const draft of drafts) {
    if (draft.status === 'sent' && nowMs() - draft.updatedAtMs > KEEP_SENT_DRAFTS_MS) await store.discard(draft.clientId);
  }
  const waiting = drafts.filter((draft) => isWaitingToSend(draft, ownerId));
  for (const candidate of waiting) {
    if (!force && nextAttemptAtMs(candidate) > nowMs()) {
      result.nextAttemptAtMs = earliest(result.nextAttemptAtMs, nextAttemptAtMs(candidate));
      continue;
    }
    const taken = await store.change(candidate.clientId, (draft) =>
      isWaitingToSend(draft, ownerId) ? { ...draft, status: 'sending' } : draft,
    );
    if (taken.status !== 'sending') continue;

    let run: DecayRun;
    try {
      run = await submit(taken.visitId, taken.body as DecayRunInput);
    } catch (error) {
      if (classifySendFailure(error) === 'refuse') {
        const refused = await store.change(taken.clientId, (draft) => ({
          ...draft,
          status: 'refused',
          refusal: refusalMessage(error),
          updatedAtMs: nowMs(),
        }));
        result.refused.push(refused);
        continue;
      }
      const failedAtMs = nowMs();
      const failed = await store.change(taken.clientId, (draft) => ({
        ...draft,
        status: 'ready',
        failedAttempts: (draft.failedAttempts ?? 0) + 1,
        lastFailedAtMs: failedAtMs,
      }));
      result.failed += 1;
      result.nextAttemptAtMs = earliest(result.nextAttemptAtMs, nextAttemptAtMs(failed));
      if (error instanceof ApiError && (error.status === 0 || error.status === 503)) break;
      continue;
    }
    const sent = await store.change(taken.clientId, (draft) => ({
      ...draft,
      status: 'sent',
      run,
      refusal: undefined,
      failedAttempts: 0,
      lastFailedAtMs: undefined,
      updatedAtMs: nowMs(),
    }));
    result.sent.push(run);
    onSent?.(run, sent);
  }
  // drafts left untried by a network failure go with the failed one's next try
  return result;
}

function earliest(a: number | undefined, b: number): number {
  return a === undefined ? b : Math.min(a, b);
}
