/** Reading what every register route takes from a request: record ids, the version, the actor. */
import type { Request } from 'express';
import { z } from 'zod';
import { AppError } from '../errors';
import type { AuthUser } from '../types/express';

/** A record id from the path; anything that is not a UUID cannot name a record: 404. */
export function idParam(req: Request, name: string, what: string): string {
  const parsed = z.uuid().safeParse(req.params[name]);
  if (!parsed.success) throw AppError.notFound(what);
  return parsed.data;
}

const versionQuery = z.object({
  version: z.coerce
    .number({ error: 'Send ?version= with the version of the record you are retiring.' })
    .int()
    .min(0),
});

/** The version a DELETE names, from `?version=`. */
export function versionFromQuery(req: Request): number {
  return versionQuery.parse(req.query).version;
}

/** The signed-in user; routes behind requireRole always have one. */
export function actingUser(req: Request): AuthUser {
  if (!req.user) throw AppError.unauthenticated();
  return req.user;
}
