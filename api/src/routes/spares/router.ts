import { Router } from 'express';
import { spareInputSchema, spareListQuerySchema, spareUpdateSchema } from '../../../../shared/schemas/spare';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { createSpare, getSpare, listSpares, retireSpare, updateSpare } from '../../services/spares';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { sparePolicy } from './policy';
import { presentSpare } from './presenter';

/** `/api/spares`: spare drives and banks in store, with their reforming due dates. */
export const sparesRouter = Router();

sparesRouter.get('/', requireRole(...sparePolicy.read), async (req, res) => {
  const query = spareListQuerySchema.parse(req.query);
  const { rows, count } = await listSpares(query);
  res.json({ items: rows.map((s) => presentSpare(s)), total: count, page: query.page, pageSize: query.pageSize });
});

sparesRouter.post('/', requireRole(...sparePolicy.edit), async (req, res) => {
  const spare = await createSpare(spareInputSchema.parse(req.body), actingUser(req));
  res.status(201).json(presentSpare(spare));
});

sparesRouter.get('/:spareId', requireRole(...sparePolicy.read), async (req, res) => {
  res.json(presentSpare(await getSpare(idParam(req, 'spareId', 'Spare'))));
});

sparesRouter.patch('/:spareId', requireRole(...sparePolicy.edit), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  res.json(presentSpare(await updateSpare(id, spareUpdateSchema.parse(req.body), actingUser(req))));
});

sparesRouter.delete('/:spareId', requireRole(...sparePolicy.edit), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  res.json(presentSpare(await retireSpare(id, versionFromQuery(req), actingUser(req))));
});

sparesRouter.get('/:spareId/audit', requireRole(...sparePolicy.read), async (req, res) => {
  const id = idParam(req, 'spareId', 'Spare');
  await getSpare(id);
  res.json({ items: (await listAuditEntries('spare', id)).map(presentAuditEntry) });
});
