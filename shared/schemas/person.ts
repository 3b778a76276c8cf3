/** People: the users of Ebbline and their roles, as an admin manages them. */
import { z } from 'zod';
import { ROLES, type Role } from '../constants/roles';
import { recordId, storableString } from './common';

/** Most hours a week a person can be available for visits (the column's check). */
export const MAX_AVAILABLE_HOURS_PER_WEEK = 80;

/** Hours a week a new person is available for visits: a full working week. */
export const DEFAULT_AVAILABLE_HOURS_PER_WEEK = 37.5;

/** Most sites one person may work at. */
export const MAX_PERSON_SITES = 200;

/** The sites a person works at: each once, in the order sent. */
const siteIdList = z
  .array(recordId('site'), { error: 'Send siteIds as a list of site ids.' })
  .max(MAX_PERSON_SITES, `A person works at ${MAX_PERSON_SITES} sites at most.`)
  .transform((ids) => [...new Set(ids)]);

/** Hours a week available for visits, 0–80 to one decimal place (stored as numeric(5,1)). */
const availableHours = z
  .number({ error: 'Enter the hours a week as a number.' })
  .min(0, 'The hours a week must be at least 0.')
  .max(
    MAX_AVAILABLE_HOURS_PER_WEEK,
    `The hours a week must be at most ${MAX_AVAILABLE_HOURS_PER_WEEK}.`,
  )
  .refine((hours) => Math.abs(hours * 10 - Math.round(hours * 10)) < 1e-9, {
    message: 'Give the hours a week to one decimal place at most (e.g. 37.5).',
  });

const roleList = z
  .array(z.enum(ROLES, { error: `A role is one of: ${ROLES.join(', ')}.` }), {
    error: 'Send roles as a list.',
  })
  .max(ROLES.length)
  .transform((roles) => ROLES.filter((r) => roles.includes(r)));

/**
 * An admin's change to a person: their roles, whether they may sign in at all, the sites they
 * work at and the hours a week they are available for visits. A change names only what it
 * changes; `siteIds` replaces the whole list (an empty list: no sites).
 */
export const personUpdateSchema = z
  .object({
    roles: roleList.optional(),
    active: z.boolean({ error: 'active is true or false.' }).optional(),
    siteIds: siteIdList.optional(),
    availableHoursPerWeek: availableHours.optional(),
  })
  .strict()
  .refine(
    (v) =>
      v.roles !== undefined ||
      v.active !== undefined ||
      v.siteIds !== undefined ||
      v.availableHoursPerWeek !== undefined,
    { message: 'Send roles, active, siteIds or availableHoursPerWeek.' },
  );
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
  /** The sites they work at, by name (a technician reads every visit of these sites). */
  siteIds: string[];
  sites: PersonSiteRef[];
  /** Hours a week available for visits. */
  availableHoursPerWeek: number;
  createdAt: string;
}

/** A site a person works at, as the People screen names it. */
export interface PersonSiteRef {
  id: string;
  name: string;
  code: string;
  timeZone: string;
}
