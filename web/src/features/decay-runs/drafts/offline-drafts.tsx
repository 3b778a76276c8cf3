import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { RunCapture } from '../components/capture/run-capture';
import { useDrafts, type RunDraft } from './draft-store';

const STATUS_WORDS: Record<RunDraft['status'], string> = {
  capturing: 'being captured',
  ready: 'saved, waiting to be sent',
  sending: 'saved, waiting to be sent',
  sent: 'sent',
  refused: 'refused by the server',
};

/**
 * The decay runs kept on this phone, for the page shown when Ebbline opens without a
 * connection (nobody can be signed in then): each with its readings count and state, so the
 * technician sees nothing was lost. A run being captured that kept its visit's and bank's facts
 * goes on here: the same capture, from those facts, saved on the phone and sent once the
 * connection returns.
 */
export function OfflineDrafts() {
  const all = useDrafts();
  const drafts = all.filter((draft) => draft.status !== 'sent');
  const [openId, setOpenId] = useState<string | null>(null);
  const open = openId ? all.find((draft) => draft.clientId === openId) : undefined;
  if (open?.snapshot) {
    return (
      <RunCapture
        key={open.clientId}
        facts={open.snapshot}
        initialDraft={open}
        drafts={all}
        onClose={() => setOpenId(null)}
        closeLabel="← Kept on this phone"
      />
    );
  }
  if (drafts.length === 0) {
    return <p className="text-base text-tide-900">No decay runs are waiting on this phone.</p>;
  }
  return (
    <section aria-label="Decay runs kept on this phone" className="space-y-2">
      <h2 className="text-lg font-semibold text-tide-950">Kept on this phone</h2>
      <ul className="space-y-2" data-testid="offline-drafts">
        {drafts.map((draft) => (
          <li
            key={draft.clientId}
            data-testid="offline-draft"
            data-client-id={draft.clientId}
            data-status={draft.status}
            className="rounded-lg border border-tide-200 px-3 py-2 text-base text-tide-950"
          >
            <span className="font-medium">
              Decay run of {new Date(draft.createdAtMs).toLocaleString()}
            </span>
            {draft.snapshot ? (
              <span className="block text-sm text-tide-800">
                {draft.snapshot.cabinetTag} · {draft.snapshot.bankPosition}
              </span>
            ) : null}
            <span className="block text-sm text-tide-800">
              {readingsCount(draft)} · {STATUS_WORDS[draft.status]}
            </span>
            {draft.refusal ? (
              <span className="block text-sm text-tide-800">{draft.refusal}</span>
            ) : null}
            {draft.status === 'capturing' && draft.snapshot ? (
              <Button
                variant="primary"
                className="mt-2 min-h-12 w-full text-base"
                onClick={() => setOpenId(draft.clientId)}
              >
                Go on with this run
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
    </section>
  );
}

function readingsCount(draft: RunDraft): string {
  const count = draft.body.samples?.length ?? 0;
  return count === 1 ? '1 reading' : `${count} readings`;
}
