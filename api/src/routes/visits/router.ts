import { Router } from 'express';
import {
  visitBatchSchema,
  visitCheckSchema,
  visitInputSchema,
  visitListQuerySchema,
  visitTransitionSchema,
  visitUpdateSchema,
  type PlanningCheck,
} from '../../../../shared/schemas/visit';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { withUnitOfWork } from '../../services/unit-of-work';
import {
  checkVisitPlan,
  createVisit,
  createVisits,
  getVisit,
  listVisits,
  takeVisitAction,
  updateVisit,
} from '../../services/visits';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam } from '../params';
import { visitPolicy } from './policy';
import { presentVisit } from './presenter';

/** `/api/visits`: planned visits, their planning check, state changes and audit trail. */
export const visitsRouter = Router();

visitsRouter.get('/', requireRole(...visitPolicy.read), async (req, res) => {
  const query = visitListQuerySchema.parse(req.query);
  const { rows, count } = await listVisits(query, actingUser(req));
  res.json({ items: rows.map(presentVisit), total: count, page: query.page, pageSize: query.pageSize });
});

visitsRouter.post('/', requireRole(...visitPolicy.plan), async (req, res) => {
  const input = visitInputSchema.parse(req.body);
  const visit = await withUnitOfWork(actingUser(req), (uow) => createVisit(uow, input));
  res.status(201).json(presentVisit(visit));
});

// fixed paths before /:visitId, which would take "check" or "batch" for an id
visitsRouter.post('/check', requireRole(...visitPolicy.plan), async (req, res) => {
  const input = visitCheckSchema.parse(req.body);
  const answer: PlanningCheck = { warnings: await checkVisitPlan(input, new Date()) };
  res.json(answer);
});

visitsRouter.post('/batch', requireRole(...visitPolicy.plan), async (req, res) => {
  const input = visitBatchSchema.parse(req.body);
  const visits = await withUnitOfWork(actingUser(req), (uow) => createVisits(uow, input.visits));
  res.status(201).json({ items: visits.map(presentVisit), total: visits.length });
});

visitsRouter.get('/:visitId', requireRole(...visitPolicy.read), async (req, res) => {
  const id = idParam(req, 'visitId', 'Visit');
  res.json(presentVisit(await getVisit(id, actingUser(req))));
});

visitsRouter.patch('/:visitId', requireRole(...visitPolicy.plan), async (req, res) => {
  const id = idParam(req, 'visitId', 'Visit');
  const input = visitUpdateSchema.parse(req.body);
  res.json(presentVisit(await withUnitOfWork(actingUser(req), (uow) => updateVisit(uow, id, input))));
});

visitsRouter.post('/:visitId/transitions', requireRole(...visitPolicy.transition), async (req, res) => {
  const id = idParam(req, 'visitId', 'Visit');
  const input = visitTransitionSchema.parse(req.body);
  res.json(presentVisit(await withUnitOfWork(actingUser(req), (uow) => takeVisitAction(uow, id, input))));
});

visitsRouter.get('/:visitId/audit', requireRole(...visitPolicy.read), async (req, res) => {
  const id = idParam(req, 'visitId', 'Visit');
  await getVisit(id, actingUser(req));
  res.json({ items: (await listAuditEntries('visit', id)).map(presentAuditEntry) });
});
