import { ROLES, type Role } from '../../../../../shared/constants/roles';
import {
  personUpdateSchema,
  type Person,
  type PersonUpdate,
} from '../../../../../shared/schemas/person';

/** What the People editor holds while an admin edits a person. */
export interface PersonDraft {
  roles: readonly Role[];
  active: boolean;
  siteIds: readonly string[];
  /** The hours field as typed. */
  hoursText: string;
}

/** The editor's starting point: the person as they are. */
export function draftOf(person: Person): PersonDraft {
  return {
    roles: person.roles,
    active: person.active,
    siteIds: person.siteIds,
    hoursText: String(person.availableHoursPerWeek),
  };
}

/** Whether two id lists hold the same ids, in any order. */
function sameSet(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && a.every((id) => b.includes(id));
}

export type DraftCheck =
  | { ok: true; change: PersonUpdate | null }
  | { ok: false; field: 'availableHoursPerWeek'; message: string };

/**
 * The change to send for a draft: only the fields that moved (a change names only what it
 * changes), or null when nothing moved; or the hours field's problem, in the API's words.
 *
 * @example
 *   changeOfDraft(person, { ...draftOf(person), hoursText: '30' })
 *   // → { ok: true, change: { availableHoursPerWeek: 30 } }
 */
export function changeOfDraft(person: Person, draft: PersonDraft): DraftCheck {
  const change: Record<string, unknown> = {};
  const roles = ROLES.filter((r) => draft.roles.includes(r));
  if (roles.join() !== person.roles.join()) change.roles = roles;
  if (draft.active !== person.active) change.active = draft.active;
  if (!sameSet(draft.siteIds, person.siteIds)) change.siteIds = [...draft.siteIds];
  const text = draft.hoursText.trim().replace(',', '.');
  const hours = text === '' ? Number.NaN : Number(text);
  if (hours !== person.availableHoursPerWeek) change.availableHoursPerWeek = Number.isNaN(hours) ? text : hours;
  if (Object.keys(change).length === 0) return { ok: true, change: null };

  const parsed = personUpdateSchema.safeParse(change);
  if (!parsed.success) {
    const issue = parsed.error.issues.find((i) => i.path[0] === 'availableHoursPerWeek');
    if (issue) return { ok: false, field: 'availableHoursPerWeek', message: issue.message };
    throw parsed.error;
  }
  return { ok: true, change: parsed.data };
}

/** "37.5 h a week", "0 h a week". */
export function hoursPerWeekText(hours: number): string {
  return `${hours.toLocaleString('en-GB', { maximumFractionDigits: 1 })} h a week`;
}
