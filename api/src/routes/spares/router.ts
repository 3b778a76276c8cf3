import { Router } from 'express';
import { spareInputSchema, spareListQuerySchema, spareUpdateSchema } from '../../../../shared/schemas/spare';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { createSpare, getSpare, listSpares, retireSpare, todayUtc, updateSpare } from '../../services/spares';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { sparePolicy } from './policy';
import { presentSpare } from './presenter';

/** `/api/spares`: spare drives and banks in store, with their reforming due dates. */
export const sparesRouter = Router();

sparesRouter.get('/', requireRole(...sparePolicy.read), async (req, res) => {
  const query = spareListQuerySchema.parse(req.query);
  const asOf = todayUtc(new Date());
  const { rows, count } = await listSpares(query, asOf);
  res.json({ items: rows.map((s) => presentSpare(s, asOf)), total: count, page: query.page, pageSize: query.pageSize });
});

sparesRouter.post('/', requireRole(...sparePolicy.edit), async (req, res) => {
  const input = spareInputSchema.parse(req.body);
  const spare = await withUnitOfWork(actingUser(req), (uow) => createSpare(uow, input));
  res.status(201).json(presentSpare(spare));
});

sparesRouter.get('/:spareId', requireRole(...sparePolicy.read), async (req, res) => {
  res.json(presentSpare(await getSpare(idParam(req, 'spareId', 'Spare'))));
});

sparesRouter.patch('/:spareId', requireRole(...sparePolicy.edit), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  const input = spareUpdateSchema.parse(req.body);
  res.json(presentSpare(await withUnitOfWork(actingUser(req), (uow) => updateSpare(uow, id, input))));
});

sparesRouter.delete('/:spareId', requireRole(...sparePolicy.edit), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  const version = versionFromQuery(req);
  res.json(presentSpare(await withUnitOfWork(actingUser(req), (uow) => retireSpare(uow, id, version))));
});

sparesRouter.get('/:spareId/audit', requireRole(...sparePolicy.read), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  await getSpare(id);
  res.json({ items: (await listAuditEntries('spare', id)).map(presentAuditEntry) });
});
