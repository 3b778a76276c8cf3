import { leavingToSignOut } from '../../../lib/sign-in';

/**
 * Signs out: a plain form POST to /auth/logout with the session's CSRF token, which ends
 * Ebbline's session and then the provider's (the browser follows the redirects).
 */
export function SignOutButton({
  csrfToken,
  className = '',
}: {
  csrfToken: string | null;
  className?: string;
}) {
  return (
    <form method="post" action="/auth/logout" className="contents" onSubmit={leavingToSignOut}>
      <input type="hidden" name="_csrf" value={csrfToken ?? ''} />
      <button type="submit" className={className}>
        Sign out
      </button>
    </form>
  );
}
