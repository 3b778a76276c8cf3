import { Router } from 'express';
import { VISIT_REVIEWERS } from '../../../../shared/constants/planning';
import { decayRunReviewSchema } from '../../../../shared/schemas/decay-run';
import { requireRole } from '../../middleware/require-role';
import { reviewDecayRun } from '../../services/decay-run-review';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser, idParam } from '../params';
import { presentDecayRun } from './presenter';

/**
 * `/api/decay-runs/:runId/review`: reliability engineers (and admins) accept a run or query it
 * with a comment for the technician, optionally making it the bank's baseline. Mounted beside
 * the decay runs' own router.
 */
export const decayRunReviewRouter = Router();

decayRunReviewRouter.post('/:runId/review', requireRole(...VISIT_REVIEWERS), async (req, res) => {
  const id = idParam(req, 'runId', 'Decay run');
  const input = decayRunReviewSchema.parse(req.body);
  const { run } = await withUnitOfWork(actingUser(req), (uow) => reviewDecayRun(uow, id, input));
  res.json(presentDecayRun(run));
});
