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
import {
  importShutdownWindows,
  previewShutdownWindowImport,
  shutdownWindowImportTemplate,
} from '../../services/shutdown-window-import';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentAuditEntry } from '../audit/presenter';
import { csvUpload } from '../cabinets/upload';
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

// the import's paths come before /:windowId, which would take "import" for an id
shutdownWindowsRouter.get('/import/template', requireRole(...shutdownWindowPolicy.import), (_req, res) => {
  res.attachment('ebbline-shutdown-windows-template.csv');
  res.type('text/csv; charset=utf-8').send(shutdownWindowImportTemplate());
});

shutdownWindowsRouter.post('/import/preview', requireRole(...shutdownWindowPolicy.import), csvUpload, async (req, res) => {
  const file = req.file!;
  res.json(await previewShutdownWindowImport({ name: file.originalname, bytes: file.buffer }, new Date()));
});

shutdownWindowsRouter.post('/import', requireRole(...shutdownWindowPolicy.import), csvUpload, async (req, res) => {
  const file = req.file!;
  // the multipart form's `confirmed=true` keeps the file's unlikely values
  const confirmed = (req.body as Record<string, unknown> | undefined)?.confirmed === 'true';
  const result = await withUnitOfWork(actingUser(req), (uow) => importShutdownWindows(uow, { name: file.originalname, bytes: file.buffer }, confirmed));
  res.status(201).json(result);
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
