import type { Role } from '../../../shared/constants/roles';

/** Who is acting on a request, once `authenticate` has run. */
export interface AuthUser {
  id: string;
  name: string;
  email: string;
  roles: Role[];
}

declare global {
  namespace Express {
    interface Request {
      user?: AuthUser;
      /** How the user was recognised: a session cookie, or an API token. */
      authMethod?: 'session' | 'bearer';
    }
  }
}
