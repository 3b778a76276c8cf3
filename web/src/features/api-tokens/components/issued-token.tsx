import { useState } from 'react';
import type { IssuedApiToken } from '../../../../../shared/schemas/api-token';

/** The new token's secret, shown this once, with a copy button. */
export function IssuedToken({ token, onDone }: { token: IssuedApiToken; onDone: () => void }) {
  const [copied, setCopied] = useState(false);
  return (
    <div
      role="status"
      className="rounded-xl border-2 border-spark-400 bg-spark-300/20 p-4"
      data-testid="issued-token"
    >
      <p className="font-bold text-tide-900">
        Copy the token “{token.name}” now: it is shown only this once.
      </p>
      <p className="mt-1 text-sm text-tide-800">
        Send it as <code className="font-medium">Authorization: Bearer …</code>. Ebbline keeps only
        a fingerprint of it; if it is lost, revoke it and make a new one.
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <code
          className="min-w-0 flex-1 break-all rounded-lg bg-white px-3 py-2 font-mono text-sm text-tide-950 ring-1 ring-tide-200"
          data-testid="token-secret"
        >
          {token.secret}
        </code>
        <button
          type="button"
          onClick={() => {
            void navigator.clipboard?.writeText(token.secret).then(() => setCopied(true));
          }}
          className="rounded-lg bg-tide-800 px-3 py-2 text-sm font-medium text-white hover:bg-tide-600"
        >
          {copied ? 'Copied' : 'Copy'}
        </button>
        <button
          type="button"
          onClick={onDone}
          className="rounded-lg border border-tide-200 bg-white px-3 py-2 text-sm font-medium text-tide-800 hover:bg-tide-50"
        >
          Done
        </button>
      </div>
    </div>
  );
}
