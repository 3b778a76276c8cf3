import { useState, type ReactNode } from 'react';
import { Link } from 'react-router';
import { Button } from '../../../components/ui/button';
import { ErrorPanel } from '../../../components/ui/error-panel';
import { Spinner } from '../../../components/ui/spinner';
import { ApiError } from '../../../lib/api-client';

/** The head of a record's page: a way back, its name, what it is, and what one can do. */
export function RecordHeader({
  back,
  title,
  kind,
  badges,
  actions,
}: {
  back: { to: string; label: string };
  title: ReactNode;
  kind: string;
  badges?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <header className="mb-5">
      <Link to={back.to} className="text-sm font-medium text-tide-600 hover:text-tide-900">
        ← {back.label}
      </Link>
      <div className="mt-1 flex flex-wrap items-end justify-between gap-3">
        <div className="min-w-0">
          <p className="text-xs font-bold uppercase tracking-wide text-tide-600">{kind}</p>
          <h2 className="break-words text-2xl font-bold tracking-tight text-tide-900">{title}</h2>
          {badges ? <div className="mt-1.5 flex flex-wrap gap-1.5">{badges}</div> : null}
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
    </header>
  );
}

/** Loading and failure of a record's page in one place. */
export function RecordLoading({ query, what }: { query: { isPending: boolean; error: Error | null }; what: string }) {
  if (query.isPending) return <Spinner label={`Loading the ${what}…`} />;
  if (query.error instanceof ApiError && query.error.status === 404) {
    return <ErrorPanel title={`No such ${what}`}>It may have been mistyped, or the link is old.</ErrorPanel>;
  }
  return <ErrorPanel title={`The ${what} could not be loaded`}>{query.error?.message}</ErrorPanel>;
}

/**
 * Retiring (a soft delete) asks once more inline, says what stays, and shows why the server
 * refused (e.g. the record is still in use, or someone else changed it).
 */
export function RetireButton({
  what,
  consequence,
  onRetire,
  pending,
  error,
  label = 'Retire',
}: {
  what: string;
  consequence: string;
  onRetire: () => void;
  pending: boolean;
  error: unknown;
  label?: string;
}) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <Button variant="danger" onClick={() => setAsking(true)}>
        {label}
      </Button>
    );
  }
  return (
    <div role="alertdialog" aria-label={`${label} ${what}`} className="w-full rounded-xl border border-eol-600/30 bg-white p-4 text-sm shadow-sm sm:w-auto sm:max-w-md">
      <p className="font-bold text-tide-900">
        {label} {what}?
      </p>
      <p className="mt-1 text-tide-800">{consequence}</p>
      {error ? <p className="mt-2 font-medium text-eol-600">{error instanceof Error ? error.message : 'Not done.'}</p> : null}
      <div className="mt-3 flex gap-2">
        <Button variant="danger" size="sm" onClick={onRetire} disabled={pending}>
          {pending ? 'Working…' : `${label} ${what}`}
        </Button>
        <Button size="sm" onClick={() => setAsking(false)} disabled={pending}>
          Keep it
        </Button>
      </div>
    </div>
  );
}

/**
 * The row above a list: the search, the filters and the list's main action. On a phone the
 * filters fold away behind a button, so the list starts near the top of the screen.
 */
export function ListToolbar({ search, children, action }: { search: ReactNode; children?: ReactNode; action?: ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <div className="mb-3 space-y-2">
      <div className="flex flex-col gap-2 sm:flex-row sm:flex-wrap sm:items-center sm:justify-between">
        <div className="flex gap-2 sm:w-80">
          <div className="min-w-0 flex-1">{search}</div>
          {children ? (
            <button
              type="button"
              aria-expanded={open}
              onClick={() => setOpen((v) => !v)}
              className="min-h-10 shrink-0 rounded-lg border border-tide-200 bg-white px-3 text-sm font-medium text-tide-800 sm:hidden"
            >
              Filters
            </button>
          ) : null}
        </div>
        {action ? <div className="flex flex-wrap gap-2">{action}</div> : null}
      </div>
      {children ? (
        <div className={`${open ? 'flex' : 'hidden'} flex-col gap-2 rounded-xl border border-tide-100 bg-white p-3 sm:flex sm:flex-row sm:flex-wrap sm:items-center sm:gap-4 sm:border-0 sm:bg-transparent sm:p-0`}>
          {children}
        </div>
      ) : null}
    </div>
  );
}

/** "Show retired" for every list. */
export function RetiredToggle({ checked, onChange, label = 'Show retired' }: { checked: boolean; onChange: (v: boolean) => void; label?: string }) {
  return (
    <label className="flex min-h-10 items-center gap-2 text-sm text-tide-800">
      <input type="checkbox" className="h-4 w-4 accent-tide-600" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      {label}
    </label>
  );
}
