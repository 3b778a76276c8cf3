import { Router } from 'express';
import {
  bankDesignInputSchema,
  bankDesignListQuerySchema,
  bankDesignUpdateSchema,
} from '../../../../shared/schemas/bank-design';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { withUnitOfWork } from '../../services/unit-of-work';
import {
  createBankDesign,
  getBankDesign,
  listBankDesignRevisions,
  listBankDesigns,
  retireBankDesign,
  updateBankDesign,
} from '../../services/bank-designs';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { bankDesignPolicy } from './policy';
import { presentBankDesign, presentBankDesignRevision } from './presenter';

/** `/api/bank-designs`: nameplates, limits and intervals, each change kept as a revision. */
export const bankDesignsRouter = Router();

bankDesignsRouter.get('/', requireRole(...bankDesignPolicy.read), async (req, res) => {
  const query = bankDesignListQuerySchema.parse(req.query);
  const { rows, count } = await listBankDesigns(query);
  res.json({ items: rows.map(presentBankDesign), total: count, page: query.page, pageSize: query.pageSize });
});

bankDesignsRouter.post('/', requireRole(...bankDesignPolicy.edit), async (req, res) => {
  const input = bankDesignInputSchema.parse(req.body);
  const design = await withUnitOfWork(actingUser(req), (uow) => createBankDesign(uow, input));
  res.status(201).json(presentBankDesign(design));
});

bankDesignsRouter.get('/:designId', requireRole(...bankDesignPolicy.read), async (req, res) => {
  res.json(presentBankDesign(await getBankDesign(idParam(req, 'designId', 'Bank design'))));
});

bankDesignsRouter.patch('/:designId', requireRole(...bankDesignPolicy.edit), async (req, res) => {
  const id = idParam(req, 'designId', 'Bank design');
  const input = bankDesignUpdateSchema.parse(req.body);
  res.json(presentBankDesign(await withUnitOfWork(actingUser(req), (uow) => updateBankDesign(uow, id, input))));
});

bankDesignsRouter.delete('/:designId', requireRole(...bankDesignPolicy.edit), async (req, res) => {
  const id = idParam(req, 'designId', 'Bank design');
  const version = versionFromQuery(req);
  res.json(presentBankDesign(await withUnitOfWork(actingUser(req), (uow) => retireBankDesign(uow, id, version))));
});

bankDesignsRouter.get('/:designId/versions', requireRole(...bankDesignPolicy.read), async (req, res) => {
  const id = idParam(req, 'designId', 'Bank design');
  res.json({ items: (await listBankDesignRevisions(id)).map(presentBankDesignRevision) });
});

bankDesignsRouter.get('/:designId/audit', requireRole(...bankDesignPolicy.read), async (req, res) => {
  const id = idParam(req, 'designId', 'Bank design');
  await getBankDesign(id);
  res.json({ items: (await listAuditEntries('bank-design', id)).map(presentAuditEntry) });
});
