import { Router } from 'express';
import {
  shutdownWindowInputSchema,
  shutdownWindowListQuerySchema,
  shutdownWindowUpdateSchema,
} from '../../../../shared/schemas/shutdown-window';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import {
  createShutdownWindow,
  getShutdownWindow,
  listShutdownWindows,
  retireShutdownWindow,
  updateShutdownWindow,
} from '../../services/shutdown-windows';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { shutdownWindowPolicy } from './policy';
import { presentShutdownWindow } from './presenter';

/** `/api/shutdown-windows`: when each area's drives are de-energised, with their occurrences. */
export const shutdownWindowsRouter = Router();

shutdownWindowsRouter.get('/', requireRole(...shutdownWindowPolicy.read), async (req, res) => {
  const query = shutdownWindowListQuerySchema.parse(req.query);
  const { rows, count } = await listShutdownWindows(query);
  res.json({
    items: rows.map((row) => presentShutdownWindow(row.window, row.occurrences)),
    total: count,
    page: query.page,
    pageSize: query.pageSize,
  });
});

shutdownWindowsRouter.post('/', requireRole(...shutdownWindowPolicy.edit), async (req, res) => {
  const input = shutdownWindowInputSchema.parse(req.body);
  const window = await withUnitOfWork(actingUser(req), (uow) => createShutdownWindow(uow, input));
  res.status(201).json(presentShutdownWindow(window));
});

shutdownWindowsRouter.get('/:windowId', requireRole(...shutdownWindowPolicy.read), async (req, res) => {
  res.json(presentShutdownWindow(await getShutdownWindow(idParam(req, 'windowId', 'Shutdown window'))));
});

shutdownWindowsRouter.patch('/:windowId', requireRole(...shutdownWindowPolicy.edit), async (req, res) => {
  const id = idParam(req, 'windowId', 'Shutdown window');
  const input = shutdownWindowUpdateSchema.parse(req.body);
  res.json(presentShutdownWindow(await withUnitOfWork(actingUser(req), (uow) => updateShutdownWindow(uow, id, input))));
});

shutdownWindowsRouter.delete('/:windowId', requireRole(...shutdownWindowPolicy.edit), async (req, res) => {
  const id = idParam(req, 'windowId', 'Shutdown window');
  const version = versionFromQuery(req);
  res.json(presentShutdownWindow(await withUnitOfWork(actingUser(req), (uow) => retireShutdownWindow(uow, id, version))));
});

shutdownWindowsRouter.get('/:windowId/audit', requireRole(...shutdownWindowPolicy.read), async (req, res) => {
  const id = idParam(req, 'windowId', 'Shutdown window');
  await getShutdownWindow(id);
  res.json({ items: (await listAuditEntries('shutdown-window', id)).map(presentAuditEntry) });
});
