/** The signed-in person, as GET /api/me answers. */
import type { Role } from '../constants/roles';

export interface Me {
  id: string;
  name: string;
  email: string;
  /** Ebbline's roles of this person; empty while an admin has not granted any. */
  roles: Role[];
  /** Send back in the X-CSRF-Token header on every POST, PUT, PATCH and DELETE; null for API tokens. */
  csrfToken: string | null;
}

/** Whom a person without a role can ask for access. */
export interface AdminContact {
  name: string;
  email: string;
}
