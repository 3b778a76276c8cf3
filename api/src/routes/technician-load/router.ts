import { Router } from 'express';
import { VISIT_PLANNERS } from '../../../../shared/constants/planning';
import { technicianLoadQuerySchema } from '../../../../shared/schemas/technician-load';
import { requireRole } from '../../middleware/require-role';
import { listTechnicianLoad } from '../../services/technician-load';

/**
 * `GET /api/technician-load?weekOn=YYYY-MM-DD[&siteId=…][&timeZone=…]`: each technician's hours
 * planned against hours available in one week, with the visits. Planners and admins.
 */
export const technicianLoadRouter = Router();

technicianLoadRouter.get('/', requireRole(...VISIT_PLANNERS), async (req, res) => {
  res.json(await listTechnicianLoad(technicianLoadQuerySchema.parse(req.query)));
});
