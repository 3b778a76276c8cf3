import { Router } from 'express';
import { VISIT_REVIEWERS } from '../../../../shared/constants/planning';
import { decayRunReviewSchema, reviewQueueQuerySchema } from '../../../../shared/schemas/decay-run';
import { requireRole } from '../../middleware/require-role';
import { listReviewQueue, reviewDecayRun } from '../../services/decay-run-review';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser, idParam } from '../params';
import { presentVisit } from '../visits/presenter';
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

/**
 * `/api/review-queue`: the visits waiting for review (logged ones, and reviewed ones holding a
 * corrected run still waiting), the one waiting longest first; for reliability engineers and admins.
 */
export const reviewQueueRouter = Router();

reviewQueueRouter.get('/', requireRole(...VISIT_REVIEWERS), async (req, res) => {
  const query = reviewQueueQuerySchema.parse(req.query);
  const { rows, count } = await listReviewQueue(query);
  res.json({ items: rows.map(presentVisit), total: count, page: query.page, pageSize: query.pageSize });
});
