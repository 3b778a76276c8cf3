import { Router } from 'express';
import { VISIT_PLANNERS } from '../../../../shared/constants/planning';
import { windowProposalRequestSchema } from '../../../../shared/schemas/plan-window';
import { requireRole } from '../../middleware/require-role';
import { proposeWindowVisits } from '../../services/plan-window';
import { idParam } from '../params';

/**
 * `POST /api/shutdown-windows/:windowId/proposal`: plan a window in one step. Answers the
 * proposed visits for one occurrence (stores nothing); the planner confirms them with
 * `POST /api/visits/batch`. Planners and admins.
 */
export const windowProposalRouter = Router();

windowProposalRouter.post(
  '/:windowId/proposal',
  requireRole(...VISIT_PLANNERS),
  async (req, res) => {
    const windowId = idParam(req, 'windowId', 'Shutdown window');
    const request = windowProposalRequestSchema.parse(req.body);
    // due dates are judged at the request's instant, each bank on its site's clock
    res.json(await proposeWindowVisits(windowId, request, new Date()));
  },
);
