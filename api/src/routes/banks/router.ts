import { Router } from 'express';
import {
  bankBaselineInputSchema,
  bankInputSchema,
  bankListQuerySchema,
  bankReplacementInputSchema,
  bankUpdateSchema,
} from '../../../../shared/schemas/bank';
import { requireRole } from '../../middleware/require-role';
import { listAuditEntries } from '../../services/audit';
import { withUnitOfWork } from '../../services/unit-of-work';
import {
  createBank,
  getBank,
  getBankLineage,
  listBanks,
  replaceBank,
  retireBank,
  setBankBaseline,
  updateBank,
} from '../../services/banks';
import { presentAuditEntry } from '../audit/presenter';
import { actingUser, idParam, versionFromQuery } from '../params';
import { bankPolicy } from './policy';
import { presentBank, presentBankDetail } from './presenter';

/** `/api/banks`: DC-link banks, their baselines, replacements and audit trail. */
export const banksRouter = Router();

banksRouter.get('/', requireRole(...bankPolicy.read), async (req, res) => {
  const query = bankListQuerySchema.parse(req.query);
  const { rows, count } = await listBanks(query);
  res.json({ items: rows.map(presentBank), total: count, page: query.page, pageSize: query.pageSize });
});

banksRouter.post('/', requireRole(...bankPolicy.edit), async (req, res) => {
  const input = bankInputSchema.parse(req.body);
  const bank = await withUnitOfWork(actingUser(req), (uow) => createBank(uow, input));
  res.status(201).json(presentBankDetail(bank, [bank]));
});

banksRouter.get('/:bankId', requireRole(...bankPolicy.read), async (req, res) => {
  const bank = await getBank(idParam(req, 'bankId', 'Bank'));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.patch('/:bankId', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const input = bankUpdateSchema.parse(req.body);
  const bank = await withUnitOfWork(actingUser(req), (uow) => updateBank(uow, id, input));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.delete('/:bankId', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const version = versionFromQuery(req);
  const bank = await withUnitOfWork(actingUser(req), (uow) => retireBank(uow, id, version));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.put('/:bankId/baseline', requireRole(...bankPolicy.baseline), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const input = bankBaselineInputSchema.parse(req.body);
  const bank = await withUnitOfWork(actingUser(req), (uow) => setBankBaseline(uow, id, input));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.post('/:bankId/replacement', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const input = bankReplacementInputSchema.parse(req.body);
  const bank = await withUnitOfWork(actingUser(req), (uow) => replaceBank(uow, id, input));
  res.status(201).json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.get('/:bankId/audit', requireRole(...bankPolicy.read), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  await getBank(id);
  res.json({ items: (await listAuditEntries('bank', id)).map(presentAuditEntry) });
});
