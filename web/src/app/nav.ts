import type { Role } from '../../../shared/constants/roles';

export interface NavItem {
  to: string;
  label: string;
  /** Who sees the item; the server enforces the same roles. */
  roles: readonly Role[];
  hint: string;
}

/** The screens of the glossary, in the order people reach for them. */
export const NAV_ITEMS: NavItem[] = [
  { to: '/fleet', label: 'Fleet', roles: ['admin', 'planner', 'technician', 'reliability'], hint: 'Health of every bank' },
  { to: '/register', label: 'Register', roles: ['admin', 'planner', 'technician', 'reliability'], hint: 'Sites, cabinets, banks' },
  { to: '/planner', label: 'Planner', roles: ['admin', 'planner', 'reliability'], hint: 'Visits and shutdown windows' },
  { to: '/my-visits', label: 'My visits', roles: ['technician'], hint: 'Your assigned visits' },
  { to: '/review', label: 'Review', roles: ['admin', 'reliability'], hint: 'Decay runs to accept or query' },
  { to: '/alerts', label: 'Alerts', roles: ['admin', 'planner', 'reliability'], hint: 'Action due' },
  { to: '/people', label: 'People', roles: ['admin'], hint: 'Users and roles' },
];
