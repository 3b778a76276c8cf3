/** The sign-in log: sign-ins, sign-outs, failed attempts and changes of access. */
import { z } from 'zod';

export const ACCESS_EVENT_KINDS = [
  'sign-in',
  'sign-out',
  'sign-in-failed',
  'roles-changed',
  'deactivated',
  'reactivated',
  'token-created',
  'token-revoked',
  'calendar-feed-created',
  'calendar-feed-revoked',
] as const;
export type AccessEventKind = (typeof ACCESS_EVENT_KINDS)[number];

/** How each kind is named on screen. */
export const ACCESS_EVENT_LABELS: Record<AccessEventKind, string> = {
  'sign-in': 'Signed in',
  'sign-out': 'Signed out',
  'sign-in-failed': 'Sign-in failed',
  'roles-changed': 'Roles changed',
  deactivated: 'Deactivated',
  reactivated: 'Reactivated',
  'token-created': 'API token created',
  'token-revoked': 'API token revoked',
  'calendar-feed-created': 'Calendar feed address made',
  'calendar-feed-revoked': 'Calendar feed address turned off',
};

/** GET /api/access-events?kind=&userId=&before=&limit= (newest first). */
export const accessEventsQuerySchema = z.object({
  kind: z
    .enum(ACCESS_EVENT_KINDS, { error: `kind is one of: ${ACCESS_EVENT_KINDS.join(', ')}` })
    .optional(),
  userId: z.uuid({ error: 'userId must be a person id' }).optional(),
  /** Only events before this instant (UTC ISO): the next page starts at the last one seen. */
  before: z.iso.datetime({ error: 'before must be a UTC ISO instant' }).optional(),
  limit: z.coerce.number().int().min(1).max(200, 'limit is at most 200').default(50),
});
export type AccessEventsQuery = z.output<typeof accessEventsQuerySchema>;

/** A person named by an entry. */
export interface AccessEventPerson {
  id: string;
  name: string;
}

export interface AccessEventView {
  id: string;
  kind: AccessEventKind;
  at: string;
  /** Whom the event is about; null for a failed sign-in with an unknown login. */
  person: AccessEventPerson | null;
  /** Who did it, when someone else did (an admin changing roles). */
  actor: AccessEventPerson | null;
  /** The login typed at a failed sign-in. */
  login: string | null;
  ip: string | null;
  userAgent: string | null;
  detail: Record<string, unknown>;
}
