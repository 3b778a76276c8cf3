import type { Request } from 'express';
import type { RequestOrigin } from '../services/access-events';

/** Where a request came from (behind a proxy the client's address needs TRUST_PROXY). */
export function requestOrigin(req: Request): RequestOrigin {
  return { ip: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}
