import { isRole } from '../../../../shared/constants/roles';
import type { AdminContact } from '../../../../shared/schemas/me';
import type { Person } from '../../../../shared/schemas/person';
import type { User } from '../../models/user';

export function presentPerson(user: User): Person {
  return {
    id: user.id,
    name: user.name,
    email: user.email,
    roles: user.roles.filter(isRole),
    active: user.active,
    lastSignInAt: user.lastSignInAt?.toISOString() ?? null,
    createdAt: user.createdAt.toISOString(),
  };
}

export function presentAdminContact(user: User): AdminContact {
  return { name: user.name, email: user.email };
}
