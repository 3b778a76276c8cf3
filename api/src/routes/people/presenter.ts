import { isRole } from '../../../../shared/constants/roles';
import type { AdminContact } from '../../../../shared/schemas/me';
import type { Person, PersonSiteRef } from '../../../../shared/schemas/person';
import type { User } from '../../models/user';

/** A person with the sites they work at (from `sitesOfPeople`). */
export function presentPerson(user: User, sites: readonly PersonSiteRef[]): Person {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    roles: user.roles.filter(isRole),
    active: user.active,
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
    siteIds: sites.map((site) => site.id),
    sites: [...sites],
    availableHoursPerWeek: user.availableHoursPerWeek,
    createdAt: user.createdAt.toISOString(),
  };
}

export function presentAdminContact(user: User): AdminContact {
  return { name: user.name, email: user.email };
}
