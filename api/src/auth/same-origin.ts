import type { Request, RequestHandler } from 'express';
import { getConfig, type Config } from '../config/env';
import { AppError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The origin a request says it was sent from: Origin, else Referer's origin, else null. */
function claimedOrigin(req: Request): string | null {
  const origin = req.get('origin');
  if (origin !== undefined) return origin;
  const referer = req.get('referer');
  if (!referer) return null;
  try {
    return new URL(referer).origin;
  } catch {
    return 'invalid';
  }
}

/**
 * A second defence beside the CSRF token (csrf.ts): a POST, PUT, PATCH or DELETE whose Origin
 * (or, without one, Referer) names another origin than APP_URL's is refused with 403
 * `origin-refused`, whoever sends it; "null" (a sandboxed or privacy-redirected page) is another
 * origin too. Browsers attach Origin to every cross-origin request that changes state (Fetch
 * standard), so a request with neither header does not come from another site's page: scripts
 * with an API token send none, and session requests still need their CSRF token.
 */
export function requireSameOrigin(config: Config = getConfig()): RequestHandler {
  const expected = new URL(config.APP_URL).origin;
  return (req, _res, next) => {
    const claimed = SAFE_METHODS.has(req.method) ? null : claimedOrigin(req);
    if (claimed !== null && claimed !== expected) {
      throw new AppError(
        'origin-refused',
        `This request was sent from ${claimed.slice(0, 100)}, not from Ebbline (${expected}), so it was refused. Open Ebbline at ${expected} and try again.`,
      );
    }
    next();
  };
}
