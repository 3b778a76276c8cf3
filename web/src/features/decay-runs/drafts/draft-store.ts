import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import { useMemo, useSyncExternalStore } from 'react';
import type { BankEngineInputs } from '../../../../../shared/domain';
import type { DecayRun, DecayRunInput } from '../../../../../shared/schemas/decay-run';

/**
 * A decay run kept on this phone until the server has it: created when a capture starts,
 * filled in as readings and observations come, marked ready when saved, then sent by
 * <DraftSync /> with its client-generated id (a retry is never a second run).
 */
export interface RunDraft {
  /** The id sent as the run's clientId; the server keeps one run per clientId. */
  clientId: string;
  visitId: string;
  bankId: string;
  createdAtMs: number;
  updatedAtMs: number;
  /**
   * capturing: readings still coming; ready: saved, waiting to be sent; sending: on its way;
   * sent: the server holds it (`run`); refused: the server said no (`refusal`), kept for the technician.
   */
  status: DraftStatus;
  /** Becomes the POST body. */
  body: Partial<DecayRunInput> & { clientId: string; bankId: string };
  /** The stored run once sent. */
  run?: DecayRun;
  /** Plain words when the server refused it (kept, never deleted silently). */
  refusal?: string;
  /** Who made it on this phone (the signed-in person then); only their sync sends it. */
  ownerId?: string;
  /** How many times sending failed for a passing reason (network, server away); drives the backoff. */
  failedAttempts?: number;
  /** When the last passing failure happened. */
  lastFailedAtMs?: number;
  /**
   * What the capture shows and judges with, kept when the run starts online, so the run can be
   * continued when Ebbline is opened again without a connection. Older drafts have none.
   */
  snapshot?: CaptureSnapshot;
}

/** The visit's and bank's facts a capture needs, as they were when the run started. */
export interface CaptureSnapshot {
  cabinetTag: string;
  bankPosition: string;
  /** The wait marked on the cabinet, minutes; null when not on record. */
  markedWaitMinutes: number | null;
  /** The τ the guided capture times its prompts from, seconds. */
  expectedTauSeconds: number;
  /** The bank's engine inputs for the live verdict; null when they were not at hand. */
  engine: BankEngineInputs | null;
}

export type DraftStatus = 'capturing' | 'ready' | 'sending' | 'sent' | 'refused';

/** The statuses in which the technician may still change a draft. */
const EDITABLE: ReadonlySet<DraftStatus> = new Set(['capturing', 'ready', 'refused']);

interface DraftsSchema extends DBSchema {
  drafts: { key: string; value: RunDraft; indexes: { visitId: string } };
}

const DATABASE_NAME = 'ebbline-drafts';
const STORE = 'drafts';
const CHANNEL_NAME = 'ebbline-drafts';

let databasePromise: Promise<IDBPDatabase<DraftsSchema>> | undefined;

function database(): Promise<IDBPDatabase<DraftsSchema>> {
  databasePromise ??= openDB<DraftsSchema>(DATABASE_NAME, 1, {
    upgrade(db) {
      const store = db.createObjectStore(STORE, { keyPath: 'clientId' });
      store.createIndex('visitId', 'visitId');
    },
    // another tab opens a newer version (after an update): let it, and reopen on next use
    blocking() {
      void databasePromise?.then((db) => db.close());
      databasePromise = undefined;
    },
    terminated() {
      databasePromise = undefined;
    },
  });
  return databasePromise;
}

// ---- live updates: listeners in this tab, a BroadcastChannel to the other tabs ----

type Listener = () => void;
const changeListeners = new Set<Listener>();
const sendListeners = new Set<Listener>();
let channel: BroadcastChannel | undefined;

function broadcastChannel(): BroadcastChannel | undefined {
  if (channel || typeof BroadcastChannel === 'undefined') return channel;
  channel = new BroadcastChannel(CHANNEL_NAME);
  channel.onmessage = (event: MessageEvent<{ type?: string }>) => {
    if (event.data?.type === 'changed') void refreshSnapshot();
  };
  return channel;
}

function notifyChanged(): void {
  broadcastChannel()?.postMessage({ type: 'changed' });
  void refreshSnapshot();
}

/** Calls `listener` when a draft was created, changed or removed, in this tab or another one. */
export function subscribeToDrafts(listener: Listener): () => void {
  broadcastChannel();
  changeListeners.add(listener);
  if (snapshot === undefined) void refreshSnapshot();
  return () => changeListeners.delete(listener);
}

/** Calls `listener` when a draft was marked ready in this tab: the sync sends it now. */
export function onSendRequested(listener: Listener): () => void {
  sendListeners.add(listener);
  return () => sendListeners.delete(listener);
}

// ---- the owner stamped on new drafts ----

let currentOwnerId: string | undefined;

/** The signed-in person new drafts belong to (set by <DraftSync />). */
export function setDraftOwner(userId: string | undefined): void {
  currentOwnerId = userId;
}

// ---- reads and writes ----

function newClientId(): string {
  return crypto.randomUUID();
}

/** Starts a draft for one bank of a visit; the clientId is made here, once. */
export async function createDraft({
  visitId,
  bankId,
  source,
  snapshot,
}: {
  visitId: string;
  bankId: string;
  source: DecayRunInput['source'];
  snapshot?: CaptureSnapshot;
}): Promise<RunDraft> {
  const nowMs = Date.now();
  const clientId = newClientId();
  const draft: RunDraft = {
    clientId,
    visitId,
    bankId,
    createdAtMs: nowMs,
    updatedAtMs: nowMs,
    status: 'capturing',
    body: { clientId, bankId, source },
    ...(currentOwnerId ? { ownerId: currentOwnerId } : {}),
    ...(snapshot ? { snapshot } : {}),
  };
  const db = await database();
  await db.add(STORE, draft);
  notifyChanged();
  return draft;
}

/**
 * Merges `patch` into the draft's body (fields given replace the stored ones; clientId and
 * bankId stay). Throws when the draft is gone or already on its way or sent (a sent run is
 * corrected, never edited).
 */
export async function updateDraft(clientId: string, patch: Partial<RunDraft['body']>): Promise<RunDraft> {
  const updated = await changeDraft(clientId, (draft) => {
    if (!EDITABLE.has(draft.status)) {
      throw new Error(`This run has been ${draft.status === 'sent' ? 'sent' : 'handed to the sync'}: it can no longer be changed.`);
    }
    return {
      ...draft,
      updatedAtMs: Date.now(),
      body: { ...draft.body, ...patch, clientId: draft.clientId, bankId: draft.bankId },
    };
  });
  return updated;
}

/** The draft with this clientId, or undefined. */
export async function getDraft(clientId: string): Promise<RunDraft | undefined> {
  const db = await database();
  return db.get(STORE, clientId);
}

/** The drafts on this phone (of one visit when given), oldest first. */
export async function listDrafts({ visitId }: { visitId?: string } = {}): Promise<RunDraft[]> {
  const db = await database();
  const drafts = visitId === undefined ? await db.getAll(STORE) : await db.getAllFromIndex(STORE, 'visitId', visitId);
  return drafts.sort(byCreation);
}

/** Removes a draft (the technician threw it away, or a sent one is tidied up). */
export async function discardDraft(clientId: string): Promise<void> {
  const db = await database();
  await db.delete(STORE, clientId);
  notifyChanged();
}

/** The run is saved: status 'ready', and the sync is asked to send it now. */
export async function markReady(clientId: string): Promise<void> {
  await changeDraft(clientId, (draft) => {
    if (!EDITABLE.has(draft.status)) return draft;
    return { ...draft, status: 'ready', refusal: undefined, failedAttempts: 0, lastFailedAtMs: undefined, updatedAtMs: Date.now() };
  });
  for (const listener of sendListeners) listener();
}

/**
 * Reads the draft, applies `change` and writes the result in one readwrite transaction (two
 * tabs never overwrite each other's change). `change` may throw to refuse.
 * For the sync's status changes; screens use updateDraft and markReady.
 */
export async function changeDraft(clientId: string, change: (draft: RunDraft) => RunDraft): Promise<RunDraft> {
  const db = await database();
  const tx = db.transaction(STORE, 'readwrite');
  const draft = await tx.store.get(clientId);
  if (!draft) {
    tx.abort();
    await tx.done.catch(() => undefined);
    throw new Error('This draft is no longer on this phone.');
  }
  let next: RunDraft;
  try {
    next = change(draft);
  } catch (error) {
    tx.abort();
    await tx.done.catch(() => undefined);
    throw error;
  }
  if (next !== draft) await tx.store.put(next);
  await tx.done;
  if (next !== draft) notifyChanged();
  return next;
}

function byCreation(a: RunDraft, b: RunDraft): number {
  return a.createdAtMs - b.createdAtMs || a.clientId.localeCompare(b.clientId);
}

// ---- React: a live snapshot of every draft on this phone ----

const NO_DRAFTS: RunDraft[] = [];
let snapshot: RunDraft[] | undefined;
let refreshing: Promise<void> | undefined;
let refreshAgain = false;

async function refreshSnapshot(): Promise<void> {
  if (refreshing) {
    refreshAgain = true;
    return refreshing;
  }
  refreshing = (async () => {
    do {
      refreshAgain = false;
      try {
        snapshot = await listDrafts();
      } catch {
        // IndexedDB unavailable (private mode on some browsers): nothing to show
        snapshot = NO_DRAFTS;
      }
    } while (refreshAgain);
    refreshing = undefined;
    for (const listener of changeListeners) listener();
  })();
  return refreshing;
}

function getSnapshot(): RunDraft[] {
  return snapshot ?? NO_DRAFTS;
}

/** Every draft on this phone, live (updates across components and tabs), oldest first. */
export function useDrafts(): RunDraft[] {
  return useSyncExternalStore(subscribeToDrafts, getSnapshot, () => NO_DRAFTS);
}

/** The drafts of one visit, live (updates across components and tabs), oldest first. */
export function useVisitDrafts(visitId: string): RunDraft[] {
  const drafts = useDrafts();
  return useMemo(() => drafts.filter((draft) => draft.visitId === visitId), [drafts, visitId]);
}
