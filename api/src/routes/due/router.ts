import { Router } from 'express';
import { hasAnyRole } from '../../../../shared/constants/roles';
import { DUE_FLEET_READERS, DUE_READERS, dueListQuerySchema } from '../../../../shared/schemas/due';
import { requireRole } from '../../middleware/require-role';
import { listDueBanks } from '../../services/due';
import { actingUser } from '../params';

/**
 * `/api/due`: the Due list. Planners, admins and reliability engineers read the whole fleet;
 * a technician (holding none of those roles) reads the banks of their own sites only.
 */
export const dueRouter = Router();

dueRouter.get('/', requireRole(...DUE_READERS), async (req, res) => {
  const query = dueListQuerySchema.parse(req.query);
  const user = actingUser(req);
  const siteScopeUserId = hasAnyRole(user.roles, DUE_FLEET_READERS) ? null : user.id;
  // the list is judged at the request's instant: each bank's "today" is this instant at its site
  res.json(await listDueBanks(query, new Date(), { siteScopeUserId }));
});
