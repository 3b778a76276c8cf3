import type { Role } from '../../shared/constants/roles';

/**
 * The invented staff of the demo scenario: Brackenmoor Processing, a plant group of three
 * sites. The local identity provider (infra/identity) signs them in, with `sub` = login and
 * a `roles` claim from `roles` (the company directory). The seed registers most of them in
 * Ebbline ahead of time, as an admin would have; the others join at their first sign-in.
 */
export interface DemoPerson {
  login: string;
  name: string;
  email: string;
  roles: Role[];
  /** Demo password of the local identity provider (listed in the README). */
  password: string;
  /**
   * Not in Ebbline until their first sign-in, which then takes the directory's roles
   * (noor: none, so she sees "waiting for access").
   */
  joinsAtFirstSignIn?: boolean;
  /**
   * Registered ahead by e-mail only, as an admin does for a new colleague (kofi: a technician
   * with his sites); the first sign-in links the account.
   */
  registeredByEmail?: boolean;
}

export const PLANT_GROUP = 'Brackenmoor Processing';

export const DEMO_PEOPLE: DemoPerson[] = [
  { login: 'maren', name: 'Maren Oyelaran', email: 'maren@brackenmoor.example', roles: ['admin'], password: 'tidewater-admin' },
  { login: 'tomas', name: 'Tomas Keelan', email: 'tomas@brackenmoor.example', roles: ['planner'], password: 'tidewater-plan' },
  { login: 'priya', name: 'Priya Halden', email: 'priya@brackenmoor.example', roles: ['planner'], password: 'tidewater-plan' },
  { login: 'dario', name: 'Dario Venn', email: 'dario@brackenmoor.example', roles: ['technician'], password: 'tidewater-tech' },
  { login: 'lucia', name: 'Lucia Marsh', email: 'lucia@brackenmoor.example', roles: ['technician'], password: 'tidewater-tech' },
  { login: 'kofi', name: 'Kofi Brannock', email: 'kofi@brackenmoor.example', roles: ['technician'], password: 'tidewater-tech', registeredByEmail: true },
  { login: 'ines', name: 'Ines Carvell', email: 'ines@brackenmoor.example', roles: ['reliability'], password: 'tidewater-rel' },
  { login: 'rurik', name: 'Rurik Salo', email: 'rurik@brackenmoor.example', roles: ['reliability'], password: 'tidewater-rel' },
  { login: 'noor', name: 'Noor Ashdown', email: 'noor@brackenmoor.example', roles: [], password: 'tidewater-new', joinsAtFirstSignIn: true },
];
