import { useState } from 'react';
import { ROLE_LABELS } from '../../../../../shared/constants/roles';
import type { ApiTokenView } from '../../../../../shared/schemas/api-token';
import { Badge } from '../../../components/ui/badge';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { formatInstant, fromNow } from '../../../lib/dates';
import { useApiTokens } from '../api/get-api-tokens';
import { useRevokeApiToken } from '../api/revoke-api-token';

const STATUS = {
  active: { label: 'Active', tone: 'ok' },
  expired: { label: 'Expired', tone: 'muted' },
  revoked: { label: 'Revoked', tone: 'danger' },
} as const;

/** The person's tokens with their state, last use and a revoke button. */
export function ApiTokenList() {
  const tokens = useApiTokens();
  if (tokens.isPending) return <Spinner label="Loading your tokens…" />;
  if (tokens.isError)
    return <ErrorPanel title="Your tokens could not be loaded">{tokens.error.message}</ErrorPanel>;
  if (tokens.data.length === 0) {
    return <p className="text-sm text-tide-800">You have no API tokens yet.</p>;
  }
  return (
    <ul className="divide-y divide-tide-100" data-testid="token-list">
      {tokens.data.map((t) => (
        <TokenRow key={t.id} token={t} />
      ))}
    </ul>
  );
}

function TokenRow({ token }: { token: ApiTokenView }) {
  const [confirming, setConfirming] = useState(false);
  const revoke = useRevokeApiToken();
  const status = STATUS[token.status];
  return (
    <li className="flex flex-wrap items-start justify-between gap-3 py-3" data-testid="token-row">
      <div className="min-w-0">
        <p className="flex flex-wrap items-center gap-2 font-medium text-tide-900">
          {token.name} <Badge tone={status.tone}>{status.label}</Badge>
        </p>
        <p className="mt-0.5 text-sm text-tide-800">
          {token.roles
            ? `Only ${token.roles.map((r) => ROLE_LABELS[r]).join(', ')}`
            : 'All your roles'}{' '}
          ·{' '}
          {token.status === 'revoked' && token.revokedAt ? (
            `revoked ${fromNow(token.revokedAt)}`
          ) : (
            <>
              {token.status === 'expired' ? 'expired' : 'expires'} {fromNow(token.expiresAt)}{' '}
              <span className="text-tide-600">({formatInstant(token.expiresAt)})</span>
            </>
          )}
        </p>
        <p className="text-xs text-tide-600">
          {token.lastUsedAt ? `Last used ${fromNow(token.lastUsedAt)}` : 'Never used'} · made{' '}
          {formatInstant(token.createdAt)}
        </p>
        {revoke.isError ? (
          <p role="alert" className="mt-1 text-sm text-eol-600">
            {revoke.error.message}
          </p>
        ) : null}
      </div>
      {token.status === 'active' ? (
        confirming ? (
          <div className="flex gap-2">
            <button
              type="button"
              onClick={() => revoke.mutate(token.id)}
              disabled={revoke.isPending}
              className="rounded-lg bg-eol-600 px-3 py-1.5 text-sm font-medium text-white hover:opacity-90"
            >
              {revoke.isPending ? 'Revoking…' : 'Yes, revoke'}
            </button>
            <button
              type="button"
              onClick={() => setConfirming(false)}
              className="rounded-lg border border-tide-200 px-3 py-1.5 text-sm font-medium text-tide-800 hover:bg-tide-50"
            >
              Keep
            </button>
          </div>
        ) : (
          <button
            type="button"
            onClick={() => setConfirming(true)}
            aria-label={`Revoke ${token.name}`}
            className="rounded-lg border border-eol-600/40 px-3 py-1.5 text-sm font-medium text-eol-600 hover:bg-eol-600/5"
          >
            Revoke
          </button>
        )
      ) : null}
    </li>
  );
}
