import { Link } from 'react-router';
import { ROLE_LABELS } from '../../../../../shared/constants/roles';
import type { Me } from '../../../../../shared/schemas/me';
import { SignOutButton } from './sign-out-button';

function initials(name: string): string {
  const parts = name.trim().split(/\s+/);
  return (
    (parts[0]?.[0] ?? '') + (parts.length > 1 ? (parts.at(-1)?.[0] ?? '') : '')
  ).toUpperCase();
}

/** The signed-in person in the shell: name, roles, their profile and signing out. */
export function AccountMenu({ me, onNavigate }: { me: Me; onNavigate?: () => void }) {
  return (
    <section aria-label="Account" className="space-y-3" data-testid="account-menu">
      <div className="flex items-center gap-3">
        <span
          aria-hidden="true"
          className="grid h-9 w-9 shrink-0 place-items-center rounded-full bg-spark-400 text-sm font-bold text-tide-950"
        >
          {initials(me.name)}
        </span>
        <div className="min-w-0">
          <p className="truncate font-medium text-white" data-testid="account-name">
            {me.name}
          </p>
          <p className="truncate text-xs text-tide-200">
            {me.roles.map((r) => ROLE_LABELS[r]).join(' · ')}
          </p>
        </div>
      </div>
      <div className="flex gap-2">
        <Link
          to="/profile"
          onClick={onNavigate}
          className="flex-1 rounded-lg border border-tide-600 px-3 py-1.5 text-center text-sm text-tide-50 hover:bg-tide-800"
        >
          Profile
        </Link>
        <SignOutButton
          csrfToken={me.csrfToken}
          className="flex-1 rounded-lg bg-tide-800 px-3 py-1.5 text-sm font-medium text-white hover:bg-tide-600"
        />
      </div>
    </section>
  );
}
