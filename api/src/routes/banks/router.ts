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
  const bank = await createBank(bankInputSchema.parse(req.body), actingUser(req));
  res.status(201).json(presentBankDetail(bank, [bank]));
});

banksRouter.get('/:bankId', requireRole(...bankPolicy.read), async (req, res) => {
  const bank = await getBank(idParam(req, 'bankId', 'Bank'));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.patch('/:bankId', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const bank = await updateBank(id, bankUpdateSchema.parse(req.body), actingUser(req));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.delete('/:bankId', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const bank = await retireBank(id, versionFromQuery(req), actingUser(req));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.put('/:bankId/baseline', requireRole(...bankPolicy.baseline), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const bank = await setBankBaseline(id, bankBaselineInputSchema.parse(req.body), actingUser(req));
  res.json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.post('/:bankId/replacement', requireRole(...bankPolicy.edit), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  const bank = await replaceBank(id, bankReplacementInputSchema.parse(req.body), actingUser(req));
  res.status(201).json(presentBankDetail(bank, await getBankLineage(bank)));
});

banksRouter.get('/:bankId/audit', requireRole(...bankPolicy.read), async (req, res) => {
  const id = idParam(req, 'bankId', 'Bank');
  await getBank(id);
  res.json({ items: (await listAuditEntries('bank', id)).map(presentAuditEntry) });
});
