import { describe, expect, it } from 'vitest';
import type { DecayRun, DecayRunInput } from '../../../../../shared/schemas/decay-run';
import type { RunDraft } from '../../../../../web/src/features/decay-runs/drafts/draft-store';
import {
  KEEP_SENT_DRAFTS_MS,
  classifySendFailure,
  isWaitingToSend,
  refusalMessage,
  retryDelayMs,
  sendDraftsRound,
  type DraftSendStore,
  type SubmitRun,
} from '../../../../../web/src/features/decay-runs/drafts/send-drafts';
import { ApiError } from '../../../../../web/src/lib/api-client';

const VISIT = '0f6d1c1e-2c7a-4b52-9d0e-6f1b8a7e4c01';
const BANK = '5a3e9b20-1d4f-4c8e-a6b7-2e9f0c1d3b42';
const ME = 'a1b2c3d4-0000-4000-8000-000000000001';

let counter = 0;
function draft(overrides: Partial<RunDraft> = {}): RunDraft {
  counter += 1;
  const clientId = overrides.clientId ?? `00000000-0000-4000-8000-${String(counter).padStart(12, '0')}`;
  return {
    clientId,
    visitId: VISIT,
    bankId: BANK,
    createdAtMs: counter,
    updatedAtMs: counter,
    status: 'ready',
    body: { clientId, bankId: BANK, source: 'typed', samples: [{ tSeconds: 0, volts: 600 }] },
    ownerId: ME,
    ...overrides,
  };
}

/** Drafts in a Map, changed one at a time like the IndexedDB store. */
function memoryStore(drafts: RunDraft[]): DraftSendStore & { all: Map<string, RunDraft> } {
  const all = new Map(drafts.map((d) => [d.clientId, structuredClone(d)]));
  return {
    all,
    async list() {
      return [...all.values()].map((d) => structuredClone(d)).sort((a, b) => a.createdAtMs - b.createdAtMs);
    },
    async change(clientId, change) {
      const current = all.get(clientId);
      if (!current) throw new Error('gone');
      const next = change(structuredClone(current));
      all.set(clientId, structuredClone(next));
      return next;
    },
    async discard(clientId) {
      all.delete(clientId);
    },
  };
}

function storedRun(body: DecayRunInput): DecayRun {
  return { id: `run-${body.clientId}`, clientId: body.clientId, visitId: VISIT, bankId: body.bankId } as DecayRun;
}

/**
 * A server keeping one run per clientId, as the API does; `answers` scripts what the next
 * calls do: 'ok' stores and answers, 'lost' stores but the answer never arrives, or an error to throw.
 */
function fakeServer(answers: Array<'ok' | 'lost' | Error> = []) {
  const runs = new Map<string, DecayRun>();
  const calls: string[] = [];
  const submit: SubmitRun = async (_visitId, body) => {
    calls.push(body.clientId);
    const answer = answers.shift() ?? 'ok';
    if (answer instanceof Error) throw answer;
    const run = runs.get(body.clientId) ?? storedRun(body);
    runs.set(body.clientId, run);
    if (answer === 'lost') throw new ApiError(0, 'network', 'Ebbline cannot reach its server.');
    return run;
  };
  return { submit, runs, calls };
}

const network = () => new ApiError(0, 'network', 'Ebbline cannot reach its server.');

describe('sending the drafts', () => {
  it('when a saved draft is sent and the server stores it, then it is marked sent with the run', async () => {
    const ready = draft();
    const store = memoryStore([ready]);
    const server = fakeServer();
    const sentRuns: DecayRun[] = [];
    const result = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1000, onSent: (run) => sentRuns.push(run) });
    expect(result.sent).toHaveLength(1);
    expect(sentRuns.map((r) => r.clientId)).toEqual([ready.clientId]);
    const after = store.all.get(ready.clientId);
    expect(after?.status).toBe('sent');
    expect(after?.run?.clientId).toBe(ready.clientId);
    expect(server.runs.size).toBe(1);
  });

  it('when drafts are still being captured or already sent, then they are not sent', async () => {
    const store = memoryStore([draft({ status: 'capturing' }), draft({ status: 'sent', updatedAtMs: 900 }), draft({ status: 'refused' })]);
    const server = fakeServer();
    await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1000 });
    expect(server.calls).toEqual([]);
  });

  it('when a draft was left sending by a tab closed mid-send, then it is sent again and the server still holds one run', async () => {
    const left = draft({ status: 'sending' });
    const server = fakeServer();
    server.runs.set(left.clientId, storedRun(left.body as DecayRunInput)); // the first send did arrive
    const store = memoryStore([left]);
    const result = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1000 });
    expect(result.sent).toHaveLength(1);
    expect(store.all.get(left.clientId)?.status).toBe('sent');
    expect(server.runs.size).toBe(1);
  });

  it('when the answer of a send is lost, then the retry sends the same clientId and the server holds one run', async () => {
    const ready = draft();
    const store = memoryStore([ready]);
    const server = fakeServer(['lost', 'ok']);
    const first = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1000 });
    expect(first.failed).toBe(1);
    expect(store.all.get(ready.clientId)?.status).toBe('ready');
    const second = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1000, force: true });
    expect(second.sent).toHaveLength(1);
    expect(server.calls).toEqual([ready.clientId, ready.clientId]);
    expect(server.runs.size).toBe(1);
  });

  it('when the network is down, then the draft stays ready, the round stops and the next try waits 2 s', async () => {
    const a = draft();
    const b = draft();
    const store = memoryStore([a, b]);
    const server = fakeServer([network()]);
    const result = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 10_000 });
    expect(server.calls).toEqual([a.clientId]); // b is not tried: it would fail the same way
    expect(store.all.get(a.clientId)).toMatchObject({ status: 'ready', failedAttempts: 1, lastFailedAtMs: 10_000 });
    expect(store.all.get(b.clientId)?.status).toBe('ready');
    expect(result.nextAttemptAtMs).toBe(12_000);
  });

  it('when a draft is waiting out its backoff, then a plain round skips it and a forced one (back online, saved) sends it', async () => {
    const waiting = draft({ failedAttempts: 3, lastFailedAtMs: 10_000 }); // next try at 18 000
    const store = memoryStore([waiting]);
    const server = fakeServer();
    const skipped = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 15_000 });
    expect(server.calls).toEqual([]);
    expect(skipped.nextAttemptAtMs).toBe(18_000);
    const due = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 18_000 });
    expect(due.sent).toHaveLength(1);

    const other = draft({ failedAttempts: 5, lastFailedAtMs: 10_000 });
    const store2 = memoryStore([other]);
    const forced = await sendDraftsRound({ store: store2, submit: server.submit, ownerId: ME, nowMs: () => 10_001, force: true });
    expect(forced.sent).toHaveLength(1);
    expect(store2.all.get(other.clientId)).toMatchObject({ status: 'sent', failedAttempts: 0 });
  });

  it('when the server is unavailable (503), then the draft stays ready and is tried again', async () => {
    const ready = draft();
    const store = memoryStore([ready]);
    const server = fakeServer([new ApiError(503, 'database-unavailable', 'Ebbline’s database is away for a moment.')]);
    await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 0 });
    expect(store.all.get(ready.clientId)).toMatchObject({ status: 'ready', failedAttempts: 1 });
    expect(store.all.get(ready.clientId)?.refusal).toBeUndefined();
  });

  it('when the server refuses the run (400 naming a field), then the draft is kept as refused with its words', async () => {
    const ready = draft();
    const store = memoryStore([ready]);
    const refusal = new ApiError(400, 'invalid-input', 'The decay run is not valid.', [{ path: 'samples', message: 'Give at least one reading.' }]);
    const server = fakeServer([refusal]);
    const result = await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 0 });
    expect(result.refused).toHaveLength(1);
    const kept = store.all.get(ready.clientId);
    expect(kept?.status).toBe('refused');
    expect(kept?.refusal).toBe('The decay run is not valid. (samples: Give at least one reading.)');
    expect(kept?.body.samples).toEqual(ready.body.samples); // the readings stay
    // a refused draft is not sent again by itself
    await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 1e9, force: true });
    expect(server.calls).toHaveLength(1);
  });

  it('when a draft was made by someone else signed in on this phone, then it waits for them', async () => {
    const theirs = draft({ ownerId: 'someone-else' });
    const mine = draft();
    const unowned = draft({ ownerId: undefined });
    const store = memoryStore([theirs, mine, unowned]);
    const server = fakeServer();
    await sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 0 });
    expect(server.calls).toEqual([mine.clientId, unowned.clientId]);
    expect(isWaitingToSend(store.all.get(theirs.clientId)!, 'someone-else')).toBe(true);
  });

  it('when two rounds run at once (two tabs), then the server still holds one run per draft', async () => {
    const ready = draft();
    const store = memoryStore([ready]);
    const server = fakeServer();
    await Promise.all([
      sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 0 }),
      sendDraftsRound({ store, submit: server.submit, ownerId: ME, nowMs: () => 0 }),
    ]);
    expect(server.runs.size).toBe(1);
    expect(store.all.get(ready.clientId)?.status).toBe('sent');
  });

  it('when a sent draft is older than a week, then it is tidied away; a newer one stays', async () => {
    const old = draft({ status: 'sent', updatedAtMs: 0 });
    const recent = draft({ status: 'sent', updatedAtMs: KEEP_SENT_DRAFTS_MS });
    const store = memoryStore([old, recent]);
    await sendDraftsRound({ store, submit: fakeServer().submit, ownerId: ME, nowMs: () => KEEP_SENT_DRAFTS_MS + 1 });
    expect([...store.all.keys()]).toEqual([recent.clientId]);
  });
});

describe('what a failed send means', () => {
  it.each([
    [new ApiError(0, 'network', 'x'), 'retry'],
    [new ApiError(500, 'internal', 'x'), 'retry'],
    [new ApiError(503, 'database-unavailable', 'x'), 'retry'],
    [new ApiError(408, 'http-408', 'x'), 'retry'],
    [new ApiError(429, 'http-429', 'x'), 'retry'],
    [new ApiError(401, 'not-signed-in', 'x'), 'retry'],
    [new ApiError(403, 'csrf-failed', 'x'), 'retry'],
    [new TypeError('Failed to fetch'), 'retry'],
    [new ApiError(400, 'invalid-input', 'x'), 'refuse'],
    [new ApiError(403, 'forbidden', 'x'), 'refuse'],
    [new ApiError(404, 'not-found', 'x'), 'refuse'],
    [new ApiError(409, 'visit-not-open', 'x'), 'refuse'],
    [new ApiError(422, 'client-id-reused', 'x'), 'refuse'],
  ] as const)('when the send fails with %s, then it is a %s', (error, kind) => {
    expect(classifySendFailure(error)).toBe(kind);
  });

  it('when the refusal names no field, then its message alone is kept', () => {
    expect(refusalMessage(new ApiError(409, 'visit-not-open', 'This visit is closed.'))).toBe('This visit is closed.');
  });

  it('when sends keep failing, then the waits double from 2 s and stop growing at 5 minutes', () => {
    expect([0, 1, 2, 3, 4].map(retryDelayMs)).toEqual([0, 2_000, 4_000, 8_000, 16_000]);
    expect(retryDelayMs(20)).toBe(300_000);
  });
});
