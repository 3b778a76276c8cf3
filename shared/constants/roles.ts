/** The roles Ebbline knows; a user may hold several. */
export const ROLES = ['admin', 'planner', 'technician', 'reliability'] as const;
export type Role = (typeof ROLES)[number];

/** How each role is named on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  planner: 'Maintenance planner',
  technician: 'Technician',
  reliability: 'Reliability engineer',
};

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

/** True when the user holds at least one of the allowed roles. */
export function hasAnyRole(userRoles: readonly string[], allowed: readonly Role[]): boolean {
  return allowed.some((role) => userRoles.includes(role));
}
