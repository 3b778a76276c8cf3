import type { Me } from '../../../../../shared/schemas/me';
import { CenteredPage } from '../../../components/layout/centered-page';
import { Spinner } from '../../../components/ui/spinner';
import { useAdmins } from '../api/get-admins';
import { SignOutButton } from './sign-out-button';

/** A signed-in person with no role yet: whom to ask, and nothing else. */
export function WaitingForAccess({ me }: { me: Me }) {
  const admins = useAdmins();
  return (
    <CenteredPage>
      <div data-testid="waiting-for-access">
        <h1 className="text-2xl font-bold tracking-tight text-tide-900">Waiting for access</h1>
        <p className="mt-2 text-tide-800">
          You are signed in as <strong>{me.name}</strong> ({me.email}), but Ebbline has not given
          you a role yet. An admin grants roles on the People screen.
        </p>
        <h2 className="mt-6 text-sm font-bold uppercase tracking-wide text-tide-600">
          Ask one of these admins
        </h2>
        {admins.isPending ? (
          <div className="mt-2">
            <Spinner label="Finding the admins…" />
          </div>
        ) : admins.isError ? (
          <p className="mt-2 text-sm text-eol-600">
            The list of admins could not be loaded: {admins.error.message}
          </p>
        ) : admins.data.length === 0 ? (
          <p className="mt-2 text-sm text-tide-800">
            No active admin is set up yet. Ask your site’s IT contact.
          </p>
        ) : (
          <ul className="mt-2 divide-y divide-tide-100" data-testid="admin-list">
            {admins.data.map((a) => (
              <li key={a.email} className="py-2">
                <span className="font-medium text-tide-900">{a.name}</span>{' '}
                <a className="text-tide-600 underline" href={`mailto:${a.email}`}>
                  {a.email}
                </a>
              </li>
            ))}
          </ul>
        )}
        <div className="mt-6">
          <SignOutButton
            csrfToken={me.csrfToken}
            className="w-full rounded-lg border border-tide-200 px-4 py-2.5 font-medium text-tide-800 hover:bg-tide-50"
          />
        </div>
      </div>
    </CenteredPage>
  );
}
