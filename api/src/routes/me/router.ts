import { Router } from 'express';
import type { Me } from '../../../../shared/schemas/me';
import { requireSignedIn } from '../../middleware/require-role';

/** `GET /api/me`: who is signed in, with the session's CSRF token (null for API tokens). */
export const meRouter = Router();

meRouter.get('/', requireSignedIn, (req, res) => {
  const user = req.user!;
  const body: Me = {
    id: user.id,
    name: user.name,
    email: user.email,
    roles: user.roles,
    csrfToken: req.authMethod === 'session' ? (req.session.csrfToken ?? null) : null,
  };
  res.json(body);
});
