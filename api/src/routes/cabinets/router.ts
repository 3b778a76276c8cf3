import { Router } from 'express';
import { bankListQuerySchema, cabinetBankInputSchema } from '../../../../shared/schemas/bank';
import { cabinetInputSchema, cabinetListQuerySchema, cabinetUpdateSchema, type CabinetLabel } from '../../../../shared/schemas/cabinet';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { createBank, getBankLineage, listBanks } from '../../services/banks';
import { cabinetImportTemplate, importCabinets, previewCabinetImport } from '../../services/cabinet-import';
import { createCabinet, getCabinet, getCabinetLabel, listCabinets, retireCabinet, updateCabinet } from '../../services/cabinets';
import { startUnplannedVisit } from '../../services/unplanned-visits';
import { unplannedVisitInputSchema } from '../../../../shared/schemas/unplanned-visit';
import { presentVisit } from '../visits/presenter';
import { dateOn } from '../../services/register-checks';
import { withUnitOfWork } from '../../services/unit-of-work';
import { presentAuditEntry } from '../audit/presenter';
import { bankPolicy } from '../banks/policy';
import { presentBank, presentBankDetail } from '../banks/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { cabinetPolicy } from './policy';
import { presentCabinet } from './presenter';
import { csvUpload } from './upload';

/** `/api/cabinets`: drive cabinets, their banks, labels, import and audit trail. */
export const cabinetsRouter = Router();

cabinetsRouter.get('/', requireRole(...cabinetPolicy.read), async (req, res) => {
  const query = cabinetListQuerySchema.parse(req.query);
  const { rows, count } = await listCabinets(query);
  res.json({ items: rows.map(presentCabinet), total: count, page: query.page, pageSize: query.pageSize });
});

cabinetsRouter.post('/', requireRole(...cabinetPolicy.edit), async (req, res) => {
  const input = cabinetInputSchema.parse(req.body);
  const cabinet = await withUnitOfWork(actingUser(req), (uow) => createCabinet(uow, input));
  res.status(201).json(presentCabinet(cabinet));
});

// the import's paths come before /:cabinetId, which would take "import" for an id
cabinetsRouter.get('/import/template', requireRole(...cabinetPolicy.import), (_req, res) => {
  res.attachment('ebbline-cabinet-register-template.csv');
  res.type('text/csv; charset=utf-8').send(cabinetImportTemplate());
});

cabinetsRouter.post('/import/preview', requireRole(...cabinetPolicy.import), csvUpload, async (req, res) => {
  const file = req.file!;
  res.json(await previewCabinetImport({ name: file.originalname, bytes: file.buffer }, dateOn(new Date())));
});

cabinetsRouter.post('/import', requireRole(...cabinetPolicy.import), csvUpload, async (req, res) => {
  const file = req.file!;
  // the multipart form's `confirmed=true` keeps the file's unlikely values, as `confirmed: true` does in a form's body
  const confirmed = (req.body as Record<string, unknown> | undefined)?.confirmed === 'true';
  res.status(201).json(await withUnitOfWork(actingUser(req), (uow) => importCabinets(uow, { name: file.originalname, bytes: file.buffer }, confirmed)));
});

cabinetsRouter.get('/:cabinetId', requireRole(...cabinetPolicy.read), async (req, res) => {
  res.json(presentCabinet(await getCabinet(idParam(req, 'cabinetId', 'Cabinet'))));
});

cabinetsRouter.patch('/:cabinetId', requireRole(...cabinetPolicy.edit), async (req, res) => {
  const id = idParam(req, 'cabinetId', 'Cabinet');
  const input = cabinetUpdateSchema.parse(req.body);
  res.json(presentCabinet(await withUnitOfWork(actingUser(req), (uow) => updateCabinet(uow, id, input))));
});

cabinetsRouter.delete('/:cabinetId', requireRole(...cabinetPolicy.edit), async (req, res) => {
  const id = idParam(req, 'cabinetId', 'Cabinet');
  const version = versionFromQuery(req);
  res.json(presentCabinet(await withUnitOfWork(actingUser(req), (uow) => retireCabinet(uow, id, version))));
});

cabinetsRouter.get('/:cabinetId/banks', requireRole(...bankPolicy.read), async (req, res) => {
  const cabinetId = idParam(req, 'cabinetId', 'Cabinet');
  await getCabinet(cabinetId);
  const query = bankListQuerySchema.parse({ sort: 'position', pageSize: '100', ...req.query, cabinetId });
  const { rows, count } = await listBanks(query);
  res.json({ items: rows.map(presentBank), total: count, page: query.page, pageSize: query.pageSize });
});

cabinetsRouter.post('/:cabinetId/banks', requireRole(...bankPolicy.edit), async (req, res) => {
  const cabinetId = idParam(req, 'cabinetId', 'Cabinet');
  await getCabinet(cabinetId);
  const input = { ...cabinetBankInputSchema.parse(req.body), cabinetId };
  const bank = await withUnitOfWork(actingUser(req), (uow) => createBank(uow, input));
  res.status(201).json(presentBankDetail(bank, await getBankLineage(bank)));
});

cabinetsRouter.get('/:cabinetId/label', requireRole(...cabinetPolicy.read), async (req, res) => {
  const { cabinet, url, qrSvg } = await getCabinetLabel(idParam(req, 'cabinetId', 'Cabinet'));
  const label: CabinetLabel = { cabinetId: cabinet.id, tag: cabinet.tag, url, qrSvg };
  res.json(label);
});

// a technician at the cabinet (its label opened this page) starts a visit there and then
cabinetsRouter.post('/:cabinetId/unplanned-visits', requireRole('technician', 'admin'), async (req, res) => {
  const id = idParam(req, 'cabinetId', 'Cabinet');
  const input = unplannedVisitInputSchema.parse(req.body ?? {});
  const visit = await withUnitOfWork(actingUser(req), (uow) => startUnplannedVisit(uow, id, input));
  res.status(201).json(presentVisit(visit));
});

cabinetsRouter.get('/:cabinetId/audit', requireRole(...cabinetPolicy.read), async (req, res) => {
  const id = idParam(req, 'cabinetId', 'Cabinet');
  await getCabinet(id);
  res.json({ items: (await listAuditEntries('cabinet', id)).map(presentAuditEntry) });
});
