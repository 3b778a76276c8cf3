import { Link } from 'react-router';
import { ROLE_LABELS, type Role } from '../../../../../shared/constants/roles';

/** Shown in place of a screen the person's roles do not open (a direct link, a bookmark). */
export function NotAllowed({
  screen,
  allowedRoles,
  myRoles,
  home,
}: {
  screen: string;
  allowedRoles: readonly Role[];
  myRoles: readonly Role[];
  home: string;
}) {
  return (
    <div className="mx-auto max-w-xl py-8" data-testid="not-allowed">
      <div className="rounded-xl border border-watch-600/30 bg-white p-6 shadow-sm">
        <p className="text-sm font-bold uppercase tracking-wide text-watch-600">Not allowed</p>
        <h1 className="mt-1 text-2xl font-bold tracking-tight text-tide-900">
          {screen} is not open to your role
        </h1>
        <p className="mt-3 text-tide-800">
          {screen} is for: {allowedRoles.map((r) => ROLE_LABELS[r]).join(', ')}. You are signed in
          as {myRoles.map((r) => ROLE_LABELS[r]).join(', ')}.
        </p>
        <p className="mt-2 text-tide-800">
          If your work needs it, ask an admin to add the role on the People screen.
        </p>
        <Link
          to={home}
          className="mt-5 inline-block rounded-lg bg-tide-800 px-4 py-2 font-medium text-white hover:bg-tide-600"
        >
          Go to your start screen
        </Link>
      </div>
    </div>
  );
}
