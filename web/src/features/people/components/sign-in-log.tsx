import { useState } from 'react';
import { isRole, ROLE_LABELS } from '../../../../../shared/constants/roles';
import {
  ACCESS_EVENT_KINDS,
  ACCESS_EVENT_LABELS,
  type AccessEventKind,
  type AccessEventView,
} from '../../../../../shared/schemas/access-event';
import { Badge } from '../../../components/ui/badge';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant } from '../../../lib/dates';
import { useAccessEvents } from '../api/get-access-events';

const TONE: Partial<Record<AccessEventKind, 'ok' | 'danger' | 'warn' | 'spark' | 'muted'>> = {
  'sign-in': 'ok',
  'sign-in-failed': 'danger',
  'sign-out': 'muted',
  'roles-changed': 'spark',
  deactivated: 'danger',
  reactivated: 'ok',
};

const REASONS: Record<string, string> = {
  'wrong-password': 'wrong login or password',
  'locked-out': 'paused after too many failures',
  deactivated: 'account deactivated',
  'state-mismatch': 'answer did not match a started sign-in',
  expired: 'sign-in took too long',
  rejected: 'provider’s answer failed the checks',
  'provider-error': 'refused at the sign-in service',
  'email-taken': 'e-mail used by another account',
};

function roleList(value: unknown): string {
  const roles = Array.isArray(value) ? value.filter(isRole) : [];
  return roles.length ? roles.map((r) => ROLE_LABELS[r]).join(', ') : 'no role';
}

/** A short name for a browser from its user agent ("Chrome on Linux"). */
function browserName(userAgent: string | null): string {
  if (!userAgent) return 'unknown browser';
  const browser = /Edg\//.test(userAgent)
    ? 'Edge'
    : /Firefox\//.test(userAgent)
      ? 'Firefox'
      : /Chrom(e|ium)\//.test(userAgent)
        ? 'Chrome'
        : /Safari\//.test(userAgent)
          ? 'Safari'
          : userAgent.split(/[\s/]/)[0] || 'browser';
  const system = /Android/.test(userAgent)
    ? 'Android'
    : /iPhone|iPad/.test(userAgent)
      ? 'iOS'
      : /Windows/.test(userAgent)
        ? 'Windows'
        : /Mac OS X/.test(userAgent)
          ? 'macOS'
          : /Linux/.test(userAgent)
            ? 'Linux'
            : '';
  return system ? `${browser} on ${system}` : browser;
}

function describe(event: AccessEventView): string {
  const d = event.detail;
  switch (event.kind) {
    case 'sign-in':
      return d.firstSignIn
        ? `first sign-in, roles from the directory: ${roleList(d.rolesFromProvider)}`
        : '';
    case 'sign-in-failed':
      return [
        event.login ? `as “${event.login}”` : '',
        REASONS[String(d.reason)] ?? String(d.reason ?? ''),
      ]
        .filter(Boolean)
        .join(', ');
    case 'roles-changed':
      return `${roleList(d.from)} → ${roleList(d.to)}`;
    case 'token-created':
    case 'token-revoked':
      return typeof d.name === 'string' ? `“${d.name}”` : '';
    default:
      return '';
  }
}

/** The sign-in log for admins: newest first, filterable by kind. */
export function SignInLog() {
  const [kind, setKind] = useState<AccessEventKind | ''>('');
  const events = useAccessEvents({ kind });
  const items = events.data?.pages.flat() ?? [];

  return (
    <div className="space-y-4">
      <label className="flex items-center gap-2 text-sm text-tide-800">
        Show
        <select
          value={kind}
          onChange={(e) => setKind(e.target.value as AccessEventKind | '')}
          className="rounded-lg border border-tide-200 bg-white px-3 py-2 text-sm shadow-sm"
        >
          <option value="">everything</option>
          {ACCESS_EVENT_KINDS.map((k) => (
            <option key={k} value={k}>
              {ACCESS_EVENT_LABELS[k]}
            </option>
          ))}
        </select>
      </label>
      {events.isPending ? (
        <Spinner label="Loading the sign-in log…" />
      ) : events.isError ? (
        <ErrorPanel title="The sign-in log could not be loaded">{events.error.message}</ErrorPanel>
      ) : items.length === 0 ? (
        <p className="rounded-xl border border-dashed border-tide-200 bg-white/60 p-6 text-tide-800">
          Nothing recorded yet.
        </p>
      ) : (
        <ol
          className="divide-y divide-tide-100 overflow-hidden rounded-xl border border-tide-100 bg-white shadow-sm"
          data-testid="sign-in-log"
        >
          {items.map((e) => (
            <li
              key={e.id}
              className="grid gap-1 px-4 py-3 sm:grid-cols-[10.5rem_minmax(0,1fr)] sm:gap-4"
              data-kind={e.kind}
            >
              <time dateTime={e.at} className="text-sm tabular-nums text-tide-600">
                {formatInstant(e.at)}
              </time>
              <div className="min-w-0">
                <p className="flex flex-wrap items-center gap-2">
                  <Badge tone={TONE[e.kind] ?? 'tide'}>
                    {ACCESS_EVENT_LABELS[e.kind] ?? e.kind}
                  </Badge>
                  <span className="font-medium text-tide-900">
                    {e.person?.name ?? e.login ?? 'Someone'}
                  </span>
                  {e.actor ? (
                    <span className="text-sm text-tide-600">by {e.actor.name}</span>
                  ) : null}
                </p>
                {describe(e) ? <p className="mt-0.5 text-sm text-tide-800">{describe(e)}</p> : null}
                <p
                  className="mt-0.5 truncate text-xs text-tide-600"
                  title={e.userAgent ?? undefined}
                >
                  from {e.ip ?? 'unknown address'} · {browserName(e.userAgent)}
                </p>
              </div>
            </li>
          ))}
        </ol>
      )}
      {events.hasNextPage ? (
        <button
          type="button"
          onClick={() => void events.fetchNextPage()}
          disabled={events.isFetchingNextPage}
          className="rounded-lg border border-tide-200 bg-white px-4 py-2 text-sm font-medium text-tide-800 hover:bg-tide-50"
        >
          {events.isFetchingNextPage ? 'Loading…' : 'Older entries'}
        </button>
      ) : null}
    </div>
  );
}
