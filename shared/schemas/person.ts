/** People: the users of Ebbline and their roles, as an admin manages them. */
import { z } from 'zod';
import { ROLES, type Role } from '../constants/roles';
import { storableString } from './common';

const roleList = z
  .array(z.enum(ROLES, { error: `A role is one of: ${ROLES.join(', ')}.` }), {
    error: 'Send roles as a list.',
  })
  .max(ROLES.length)
  .transform((roles) => ROLES.filter((r) => roles.includes(r)));

/** An admin's change to a person: their roles, and whether they may sign in at all. */
export const personUpdateSchema = z
  .object({
    roles: roleList.optional(),
    active: z.boolean({ error: 'active is true or false.' }).optional(),
  })
  .strict()
  .refine((v) => v.roles !== undefined || v.active !== undefined, {
    message: 'Send roles, active, or both.',
  });
export type PersonUpdate = z.output<typeof personUpdateSchema>;

/** GET /api/people?q=…&includeDeactivated=… */
export const peopleQuerySchema = z.object({
  q: storableString('search').trim().max(100, 'Keep the search under 100 characters.').optional(),
  includeDeactivated: z
    .enum(['true', 'false'], { error: 'includeDeactivated is true or false' })
    .transform((v) => v === 'true')
    .default(true),
});
export type PeopleQuery = z.output<typeof peopleQuerySchema>;

/** A person as the People screen shows them. */
export interface Person {
  id: string;
  name: string;
  email: string;
  roles: Role[];
  active: boolean;
  /** UTC ISO; null when they have never signed in. */
  lastSignInAt: string | null;
  createdAt: string;
}
