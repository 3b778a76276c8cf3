/** Where the browser goes to sign in, coming back to `returnTo` (a path inside Ebbline). */
export function signInUrl(returnTo = window.location.pathname + window.location.search): string {
  const path = returnTo.startsWith('/') && !returnTo.startsWith('//') ? returnTo : '/';
  return `/auth/login?returnTo=${encodeURIComponent(path)}`;
}

let leaving = false;

/** Sends the browser to sign in (once, however many requests found the session gone). */
export function goToSignIn(returnTo?: string): void {
  if (leaving) return;
  leaving = true;
  window.location.assign(signInUrl(returnTo));
}

/**
 * The person is signing out (the form is on its way): answers that now find the session gone
 * must not send the browser to sign in again, which would cut the sign-out short.
 */
export function leavingToSignOut(): void {
  leaving = true;
}
