import { Router } from 'express';
import { areaInputSchema, areaListQuerySchema, areaUpdateSchema } from '../../../../shared/schemas/area';
import { cabinetListQuerySchema } from '../../../../shared/schemas/cabinet';
import { requireRole } from '../../middleware/require-role';
import { createArea, getArea, listAreas, retireArea, updateArea } from '../../services/areas';
import { listAuditEntries } from '../../services/audit';
import { listCabinets } from '../../services/cabinets';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentAuditEntry } from '../audit/presenter';
import { cabinetPolicy } from '../cabinets/policy';
import { presentCabinet } from '../cabinets/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { areaPolicy } from './policy';
import { presentArea } from './presenter';

/** `/api/areas`: lines and halls of the sites, with their cabinets and audit trail. */
export const areasRouter = Router();

areasRouter.get('/', requireRole(...areaPolicy.read), async (req, res) => {
  const query = areaListQuerySchema.parse(req.query);
  const { rows, count } = await listAreas(query);
  res.json({ items: rows.map(presentArea), total: count, page: query.page, pageSize: query.pageSize });
});

areasRouter.post('/', requireRole(...areaPolicy.edit), async (req, res) => {
  const input = areaInputSchema.parse(req.body);
  const area = await withUnitOfWork(actingUser(req), (uow) => createArea(uow, input));
  res.status(201).json(presentArea(area));
});

areasRouter.get('/:areaId', requireRole(...areaPolicy.read), async (req, res) => {
  res.json(presentArea(await getArea(idParam(req, 'areaId', 'Area'))));
});

areasRouter.patch('/:areaId', requireRole(...areaPolicy.edit), async (req, res) => {
  const id = idParam(req, 'areaId', 'Area');
  const input = areaUpdateSchema.parse(req.body);
  res.json(presentArea(await withUnitOfWork(actingUser(req), (uow) => updateArea(uow, id, input))));
});

areasRouter.delete('/:areaId', requireRole(...areaPolicy.edit), async (req, res) => {
  const id = idParam(req, 'areaId', 'Area');
  const version = versionFromQuery(req);
  res.json(presentArea(await withUnitOfWork(actingUser(req), (uow) => retireArea(uow, id, version))));
});

areasRouter.get('/:areaId/cabinets', requireRole(...cabinetPolicy.read), async (req, res) => {
  const areaId = idParam(req, 'areaId', 'Area');
  await getArea(areaId);
  const query = cabinetListQuerySchema.parse({ ...req.query, areaId });
  const { rows, count } = await listCabinets(query);
  res.json({ items: rows.map(presentCabinet), total: count, page: query.page, pageSize: query.pageSize });
});

areasRouter.get('/:areaId/audit', requireRole(...areaPolicy.read), async (req, res) => {
  const id = idParam(req, 'areaId', 'Area');
  await getArea(id);
  res.json({ items: (await listAuditEntries('area', id)).map(presentAuditEntry) });
});
