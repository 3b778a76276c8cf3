import { Router } from 'express';
import { decayRunCorrectionSchema, decayRunInputSchema } from '../../../../shared/schemas/decay-run';
import { requireRole } from '../../middleware/require-role';
import {
  correctDecayRun,
  getDecayRun,
  listBankDecayRuns,
  listVisitDecayRuns,
  recordDecayRun,
} from '../../services/decay-runs';
import { withUnitOfWork } from '../../services/unit-of-work';
import { actingUser, idParam } from '../params';
import { decayRunPolicy } from './policy';
import { presentDecayRun } from './presenter';

/** `/api/decay-runs`: one run, and its corrections (each a new version with its reason). */
export const decayRunsRouter = Router();

decayRunsRouter.get('/:runId', requireRole(...decayRunPolicy.read), async (req, res) => {
  const id = idParam(req, 'runId', 'Decay run');
  res.json(presentDecayRun(await getDecayRun(id)));
});

decayRunsRouter.post('/:runId/corrections', requireRole(...decayRunPolicy.correct), async (req, res) => {
  const id = idParam(req, 'runId', 'Decay run');
  const input = decayRunCorrectionSchema.parse(req.body);
  const { run, created } = await withUnitOfWork(actingUser(req), (uow) => correctDecayRun(uow, id, input));
  res.status(created ? 201 : 200).json(presentDecayRun(run));
});

/** `/api/visits/:visitId/decay-runs`: record a run on a visit (idempotent by clientId), list its runs. */
export const visitDecayRunsRouter = Router({ mergeParams: true });

visitDecayRunsRouter.get('/', requireRole(...decayRunPolicy.read), async (req, res) => {
  const visitId = idParam(req, 'visitId', 'Visit');
  res.json({ items: (await listVisitDecayRuns(visitId, actingUser(req))).map(presentDecayRun) });
});

visitDecayRunsRouter.post('/', requireRole(...decayRunPolicy.record), async (req, res) => {
  const visitId = idParam(req, 'visitId', 'Visit');
  const input = decayRunInputSchema.parse(req.body);
  const { run, created } = await withUnitOfWork(actingUser(req), (uow) => recordDecayRun(uow, visitId, input));
  res.status(created ? 201 : 200).json(presentDecayRun(run));
});

/** `/api/banks/:bankId/decay-runs`: a bank's runs over all its visits, every version, newest first. */
export const bankDecayRunsRouter = Router({ mergeParams: true });

bankDecayRunsRouter.get('/', requireRole(...decayRunPolicy.read), async (req, res) => {
  const bankId = idParam(req, 'bankId', 'Bank');
  res.json({ items: (await listBankDecayRuns(bankId)).map(presentDecayRun) });
});
