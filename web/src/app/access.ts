import { hasAnyRole, type Role } from '../../../shared/constants/roles';
import { NAV_ITEMS, type NavItem } from './nav';

/** The screens a person with `roles` sees in the navigation. */
export function navFor(roles: readonly Role[], items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  return items.filter((item) => hasAnyRole(roles, item.roles));
}

/** The navigation screen a path belongs to (`/register/sites/…` → Register), if any. */
export function screenFor(
  pathname: string,
  items: readonly NavItem[] = NAV_ITEMS,
): NavItem | undefined {
  return items.find((item) => pathname === item.to || pathname.startsWith(`${item.to}/`));
}

/**
 * Whether a person may open a path. Paths outside the navigation (the profile, the start
 * redirect, unknown addresses) are open to every signed-in person with a role; the server
 * enforces the same roles on the data either way.
 */
export function mayOpen(
  pathname: string,
  roles: readonly Role[],
  items: readonly NavItem[] = NAV_ITEMS,
): boolean {
  const screen = screenFor(pathname, items);
  return !screen || hasAnyRole(roles, screen.roles);
}

/**
 * Each role's start screen, in order of precedence for people with several roles: the daily
 * work first (a technician's visits, a planner's calendar, a reliability engineer's fleet),
 * administration last.
 */
export const START_SCREENS: ReadonlyArray<readonly [Role, string]> = [
  ['technician', '/my-visits'],
  ['planner', '/planner'],
  ['reliability', '/fleet'],
  ['admin', '/people'],
];

/** Where a person lands after signing in (and at `/`). */
export function startScreenFor(roles: readonly Role[]): string {
  return START_SCREENS.find(([role]) => roles.includes(role))?.[1] ?? '/fleet';
}
