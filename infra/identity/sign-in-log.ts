import { User } from '../../api/src/models/user';
import { recordAccessEvent } from '../../api/src/services/access-events';
import type { SignInFailure } from './provider';

/**
 * Ebbline's side of a failed attempt at the local provider: an entry in the sign-in log,
 * linked to the person when the login is a known subject (the local provider's `sub` is
 * the login).
 */
export async function recordFailureInEbbline(failure: SignInFailure): Promise<void> {
  const user = failure.login
    ? await User.findOne({ where: { subject: failure.login.toLowerCase() } })
    : null;
  await recordAccessEvent({
    kind: 'sign-in-failed',
    userId: user?.id ?? null,
    login: failure.login,
    origin: { ip: failure.ip, userAgent: failure.userAgent },
    detail: { reason: failure.reason, at: 'identity-provider' },
  });
}
