import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useSyncExternalStore } from 'react';
import type { DecayRun } from '../../../../../shared/schemas/decay-run';
import { decayRunKeys } from '../api/get-decay-runs';
import { submitDecayRun } from '../api/submit-decay-run';
import { changeDraft, discardDraft, listDrafts, onSendRequested, setDraftOwner, useDrafts } from './draft-store';
import { sendDraftsRound, type DraftSendStore } from './send-drafts';

const SYNC_LOCK = 'ebbline-draft-sync';

const store: DraftSendStore = { list: () => listDrafts(), change: changeDraft, discard: discardDraft };

/**
 * Sends the saved decay-run drafts of this phone, mounted once for a signed-in person: at
 * start (drafts left 'sending' by a tab closed mid-send go again), when the connection comes
 * back, when a draft is marked ready, when the page is shown again, and after a passing
 * failure with a growing wait. Nothing is tried while the browser says it is offline. One
 * tab sends at a time (a Web Lock); the server keeps one run per clientId whatever happens.
 * Renders nothing.
 */
export function DraftSync({
  userId,
  onSent,
}: {
  /** The signed-in person: new drafts are theirs, and only theirs are sent. */
  userId?: string;
  /** Called after runs were stored (the app refreshes what they change, e.g. the visit). */
  onSent?: (runs: DecayRun[]) => void;
}) {
  const queryClient = useQueryClient();
  const onSentRef = useRef(onSent);
  useEffect(() => {
    onSentRef.current = onSent;
  });

  useEffect(() => {
    setDraftOwner(userId);
    let stopped = false;
    let running = false;
    let again = false;
    let forceNext = false;
    let timer: ReturnType<typeof setTimeout> | undefined;

    const round = async (force: boolean) => {
      const result = await sendDraftsRound({
        store,
        submit: submitDecayRun,
        ownerId: userId,
        nowMs: () => Date.now(),
        force,
      });
      if (result.sent.length > 0) {
        void queryClient.invalidateQueries({ queryKey: decayRunKeys.all });
        onSentRef.current?.(result.sent);
      }
      return result.nextAttemptAtMs;
    };

    const kick = (force: boolean) => {
      if (stopped) return;
      forceNext ||= force;
      if (running) {
        again = true;
        return;
      }
      if (!navigator.onLine) return; // the 'online' event starts the next round
      running = true;
      const forced = forceNext;
      forceNext = false;
      // older browsers have no Web Locks: two tabs may then both send, which the server absorbs
      const locks = navigator.locks as LockManager | undefined;
      const work: Promise<number | undefined> = locks
        ? locks.request(SYNC_LOCK, () => round(forced)).then((nextAtMs) => nextAtMs)
        : round(forced);
      void work
        .then((nextAtMs) => {
          if (timer) clearTimeout(timer);
          timer = undefined;
          if (!stopped && nextAtMs !== undefined) {
            timer = setTimeout(() => kick(false), Math.max(0, nextAtMs - Date.now()));
          }
        })
        .catch(() => {
          // IndexedDB unavailable or closed under us: try again a little later
          if (!stopped) timer = setTimeout(() => kick(false), 10_000);
        })
        .finally(() => {
          running = false;
          if (again) {
            again = false;
            kick(false);
          }
        });
    };

    const onOnline = () => kick(true);
    const onVisible = () => {
      if (document.visibilityState === 'visible') kick(false);
    };
    window.addEventListener('online', onOnline);
    document.addEventListener('visibilitychange', onVisible);
    const stopListening = onSendRequested(() => kick(true));
    kick(true);
    return () => {
      stopped = true;
      if (timer) clearTimeout(timer);
      window.removeEventListener('online', onOnline);
      document.removeEventListener('visibilitychange', onVisible);
      stopListening();
    };
  }, [userId, queryClient]);

  return null;
}

function subscribeToConnection(listener: () => void): () => void {
  window.addEventListener('online', listener);
  window.addEventListener('offline', listener);
  return () => {
    window.removeEventListener('online', listener);
    window.removeEventListener('offline', listener);
  };
}

/** True while the browser says it has a connection; live. */
export function useOnline(): boolean {
  return useSyncExternalStore(
    subscribeToConnection,
    () => navigator.onLine,
    () => true,
  );
}

/**
 * Says plainly when the phone is offline that readings are kept on it and sent later, and,
 * online, how many saved runs are still waiting or were refused by the server.
 */
export function ConnectionNote({
  unreachable = false,
}: {
  /** The server could not be reached although the phone says it is online (a dead connection). */
  unreachable?: boolean;
}) {
  const online = useOnline();
  const drafts = useDrafts();
  const waiting = drafts.filter((draft) => draft.status === 'ready' || draft.status === 'sending').length;
  const refused = drafts.filter((draft) => draft.status === 'refused').length;

  if (!online || unreachable) {
    return (
      <div
        role="status"
        data-testid="connection-note"
        data-online={online ? 'unreachable' : 'false'}
        className="mb-4 rounded-lg border border-spark-400/60 bg-spark-300/25 px-4 py-3 text-base text-tide-950"
      >
        <p className="font-semibold">{online ? 'Ebbline cannot reach its server.' : 'You are offline.'}</p>
        <p>
          Readings are kept on this phone and sent by themselves when the connection returns.
          {waiting > 0 ? ` ${runs(waiting)} waiting to be sent.` : ''}
        </p>
      </div>
    );
  }
  if (waiting === 0 && refused === 0) return null;
  return (
    <div
      role="status"
      data-testid="connection-note"
      data-online="true"
      className="mb-4 rounded-lg border border-tide-200 bg-tide-50 px-4 py-3 text-base text-tide-900"
    >
      {waiting > 0 ? <p>Sending {runs(waiting)} kept on this phone…</p> : null}
      {refused > 0 ? (
        <p className="font-semibold">
          The server refused {runs(refused)}: the readings are kept on this phone; open the visit to see why.
        </p>
      ) : null}
    </div>
  );
}

function runs(count: number): string {
  return count === 1 ? '1 decay run' : `${count} decay runs`;
}
