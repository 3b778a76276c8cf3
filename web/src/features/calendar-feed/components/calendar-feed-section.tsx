import { useState } from 'react';
import type { IssuedCalendarFeed } from '../../../../../shared/schemas/calendar-feed';
import { Button } from '../../../components/ui/button';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant, fromNow } from '../../../lib/dates';
import { useCreateCalendarFeed } from '../api/create-calendar-feed';
import { useCalendarFeed } from '../api/get-calendar-feed';
import { useRevokeCalendarFeed } from '../api/revoke-calendar-feed';

/**
 * The profile's calendar feed: make a private address for the person's visits, copy it into a
 * calendar app (with plain steps for the common ones), make a new one, or turn it off.
 */
export function CalendarFeedSection() {
  const feed = useCalendarFeed();
  const create = useCreateCalendarFeed();
  const revoke = useRevokeCalendarFeed();
  const [issued, setIssued] = useState<IssuedCalendarFeed | null>(null);
  const [confirming, setConfirming] = useState<'new' | 'off' | null>(null);

  const makeAddress = () => {
    setConfirming(null);
    create.mutate(undefined, { onSuccess: setIssued });
  };
  const turnOff = () => {
    setConfirming(null);
    revoke.mutate(undefined, { onSuccess: () => setIssued(null) });
  };

  return (
    <div className="space-y-4" data-testid="calendar-feed">
      <p className="text-sm leading-relaxed text-tide-800">
        See your visits in the calendar you already use (Outlook, Google Calendar, Apple Calendar or
        your phone’s). Ebbline gives you a private web address; your calendar app checks it for
        changes by itself. The address works like a password: anyone who has it can see your visits,
        so keep it to yourself.
      </p>
      {feed.isPending ? (
        <Spinner label="Loading your calendar address…" />
      ) : feed.isError ? (
        <ErrorPanel title="Your calendar address could not be loaded">
          {feed.error.message}
        </ErrorPanel>
      ) : issued ? (
        <IssuedAddress feed={issued} onDone={() => setIssued(null)} />
      ) : feed.data.feed ? (
        <p className="text-sm text-tide-900" data-testid="calendar-feed-state">
          Your calendar address is in use, made {formatInstant(feed.data.feed.createdAt)}.{' '}
          <span className="text-tide-600">
            {feed.data.feed.lastUsedAt
              ? `A calendar app last fetched it ${fromNow(feed.data.feed.lastUsedAt)}.`
              : 'No calendar app has fetched it yet.'}
          </span>
        </p>
      ) : (
        <p className="text-sm text-tide-900" data-testid="calendar-feed-state">
          You have no calendar address.
        </p>
      )}

      {create.isError ? (
        <p role="alert" className="text-sm text-eol-600">
          {create.error.message}
        </p>
      ) : null}
      {revoke.isError ? (
        <p role="alert" className="text-sm text-eol-600">
          {revoke.error.message}
        </p>
      ) : null}

      {feed.isSuccess ? (
        confirming === 'new' ? (
          <Confirm
            question="Make a new address? The one in use stops working: you will add the new one to your calendar app."
            yes="Yes, make a new address"
            onYes={makeAddress}
            onNo={() => setConfirming(null)}
          />
        ) : confirming === 'off' ? (
          <Confirm
            question="Turn the address off? Your calendar app stops getting your visits from it."
            yes="Yes, turn off"
            danger
            onYes={turnOff}
            onNo={() => setConfirming(null)}
          />
        ) : (
          <div className="flex flex-wrap gap-2">
            {feed.data.feed || issued ? (
              <>
                <Button onClick={() => setConfirming('new')} disabled={create.isPending}>
                  {create.isPending ? 'Making…' : 'Make a new address'}
                </Button>
                <Button
                  variant="danger"
                  onClick={() => setConfirming('off')}
                  disabled={revoke.isPending}
                >
                  {revoke.isPending ? 'Turning off…' : 'Turn off'}
                </Button>
              </>
            ) : (
              <Button variant="primary" onClick={makeAddress} disabled={create.isPending}>
                {create.isPending ? 'Making…' : 'Make a calendar address'}
              </Button>
            )}
          </div>
        )
      ) : null}
    </div>
  );
}

function Confirm({
  question,
  yes,
  danger = false,
  onYes,
  onNo,
}: {
  question: string;
  yes: string;
  danger?: boolean;
  onYes: () => void;
  onNo: () => void;
}) {
  return (
    <div
      role="group"
      aria-label="Confirm"
      className="rounded-lg border border-tide-200 bg-tide-50 p-3"
    >
      <p className="text-sm text-tide-900">{question}</p>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button variant={danger ? 'danger' : 'primary'} size="sm" onClick={onYes}>
          {yes}
        </Button>
        <Button size="sm" onClick={onNo}>
          Keep it as it is
        </Button>
      </div>
    </div>
  );
}

/** The new address, shown this once, with a copy button and how to add it. */
function IssuedAddress({ feed, onDone }: { feed: IssuedCalendarFeed; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  return (
    <div
      role="status"
      className="rounded-xl border-2 border-spark-400 bg-spark-300/20 p-4"
      data-testid="issued-calendar-feed"
    >
      <p className="font-bold text-tide-900">
        Copy your calendar address now: it is shown only this once.
      </p>
      <p className="mt-1 text-sm text-tide-800">
        Ebbline keeps only a fingerprint of it. If you lose it, make a new address here; the old one
        then stops working.
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <code
          className="min-w-0 basis-full break-all rounded-lg bg-white px-3 py-2 font-mono text-sm text-tide-950 ring-1 ring-tide-200"
          data-testid="calendar-feed-url"
        >
          {feed.url}
        </code>
        <Button
          variant="primary"
          onClick={() => {
            void navigator.clipboard?.writeText(feed.url).then(() => setCopied(true));
          }}
        >
          {copied ? 'Copied' : 'Copy address'}
        </Button>
        <a
          href={feed.webcalUrl}
          className="inline-flex min-h-10 items-center rounded-lg border border-tide-200 bg-white px-4 py-2 text-sm font-medium text-tide-800 hover:bg-tide-50"
        >
          Open in my calendar app
        </a>
      </div>
      <h3 className="mt-4 text-sm font-bold text-tide-900">How to add it to your calendar</h3>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-tide-800">
        <li>
          <strong>Outlook</strong>: Add calendar, then Subscribe from web; paste the address and
          choose Import.
        </li>
        <li>
          <strong>Google Calendar</strong> (on a computer): beside Other calendars choose +, then
          From URL; paste the address and choose Add calendar. It then shows on your phone too.
        </li>
        <li>
          <strong>iPhone or iPad</strong>: Settings, Calendar, Accounts, Add Account, Other, Add
          Subscribed Calendar; paste the address. <strong>Mac</strong>: in Calendar, File, New
          Calendar Subscription.
        </li>
        <li>
          <strong>Android</strong>: add it in Google Calendar on a computer as above; your phone
          picks it up.
        </li>
      </ul>
      <p className="mt-2 text-sm text-tide-800">
        Your visits appear with the cabinet, banks, shutdown window and the safety cautions.
        Calendar apps check for changes every few hours (Google Calendar can take up to a day), so a
        change made just now may show later. Plan and change visits in Ebbline: the calendar only
        shows them.
      </p>
      <Button className="mt-3" onClick={onDone}>
        Done
      </Button>
    </div>
  );
}
