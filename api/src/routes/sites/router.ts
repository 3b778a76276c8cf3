import { Router } from 'express';
import { areaInputSchema, areaListQuerySchema } from '../../../../shared/schemas/area';
import { siteInputSchema, siteListQuerySchema, siteUpdateSchema } from '../../../../shared/schemas/site';
import { requireRole } from '../../middleware/require-role';
import { createArea, listAreas } from '../../services/areas';
import { listAuditEntries } from '../../services/audit';
import { createSite, getSite, listSites, retireSite, updateSite } from '../../services/sites';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentArea } from '../areas/presenter';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { sitePolicy } from './policy';
import { areaPolicy } from '../areas/policy';
import { presentSite } from './presenter';

/** `/api/sites`: the plant group's sites, their areas and audit trail. */
export const sitesRouter = Router();

sitesRouter.get('/', requireRole(...sitePolicy.read), async (req, res) => {
  const query = siteListQuerySchema.parse(req.query);
  const { rows, count } = await listSites(query);
  res.json({ items: rows.map(presentSite), total: count, page: query.page, pageSize: query.pageSize });
});

sitesRouter.post('/', requireRole(...sitePolicy.edit), async (req, res) => {
  const input = siteInputSchema.parse(req.body);
  const site = await withUnitOfWork(actingUser(req), (uow) => createSite(uow, input));
  res.status(201).json(presentSite(site));
});

sitesRouter.get('/:siteId', requireRole(...sitePolicy.read), async (req, res) => {
  res.json(presentSite(await getSite(idParam(req, 'siteId', 'Site'))));
});

sitesRouter.patch('/:siteId', requireRole(...sitePolicy.edit), async (req, res) => {
  const id = idParam(req, 'siteId', 'Site');
  const input = siteUpdateSchema.parse(req.body);
  const site = await withUnitOfWork(actingUser(req), (uow) => updateSite(uow, id, input));
  res.json(presentSite(site));
});

sitesRouter.delete('/:siteId', requireRole(...sitePolicy.edit), async (req, res) => {
  const id = idParam(req, 'siteId', 'Site');
  const version = versionFromQuery(req);
  const site = await withUnitOfWork(actingUser(req), (uow) => retireSite(uow, id, version));
  res.json(presentSite(site));
});

sitesRouter.get('/:siteId/areas', requireRole(...areaPolicy.read), async (req, res) => {
  const siteId = idParam(req, 'siteId', 'Site');
  await getSite(siteId);
  const query = areaListQuerySchema.parse({ ...req.query, siteId });
  const { rows, count } = await listAreas(query);
  res.json({ items: rows.map(presentArea), total: count, page: query.page, pageSize: query.pageSize });
});

sitesRouter.post('/:siteId/areas', requireRole(...areaPolicy.edit), async (req, res) => {
  const siteId = idParam(req, 'siteId', 'Site');
  const input = areaInputSchema.parse({ ...req.body, siteId });
  const area = await withUnitOfWork(actingUser(req), (uow) => createArea(uow, input));
  res.status(201).json(presentArea(area));
});

sitesRouter.get('/:siteId/audit', requireRole(...sitePolicy.read), async (req, res) => {
  const id = idParam(req, 'siteId', 'Site');
  await getSite(id);
  res.json({ items: (await listAuditEntries('site', id)).map(presentAuditEntry) });
});
