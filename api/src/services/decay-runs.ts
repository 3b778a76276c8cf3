/**
 * Use cases of decay runs recorded at the cabinet: record one on a visit, correct one (a new
 * version with its reason), read one, list a visit's or a bank's runs.
 *
 * - **Idempotent by clientId.** The phone makes the run's `clientId` and sends the same body
 *   until it hears back, so a retry must never make a second run. Under a transaction-scoped
 *   advisory lock on the clientId (so 20 submissions at once queue up rather than race), the run
 *   is looked up first: the same body (canonical JSON's SHA-256) answers the stored run, another
 *   body is refused (`client-id-reused`), and only a new clientId stores a run. A retry answers
 *   its run even after the visit was logged meanwhile: it is the same submission.
 * - **The server judges.** The verdict is `judgeRecordedRun` on the samples exactly as sent and
 *   the bank as the register keeps it now (the same function the phone runs); the samples are
 *   stored unchanged. An unusable fit is stored too: readings are never refused for physics.
 * - **One unit of work.** A planned visit is started (through the visits service's transition,
 *   with its own audit entry), the run is stored, and its audit entry and outbox message
 *   (`decay-run.recorded`, or `decay-run.corrected`) are written in the same transaction.
 *
 * The demo seed: call {@link decayRunRowFor} for each history run (it judges the samples with
 * the same engine and returns the row's attributes, with a body hash), insert the rows in bulk,
 * and write their audit entries with `recordAuditBatch` using {@link decayRunAuditEntry}. Going
 * through {@link recordDecayRun} instead (with `withUnitOfWork(actor, …, { now })`) works for a
 * few runs but needs an under-way visit and an assigned technician as the actor for each.
 */
import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { hasAnyRole, type Role } from '../../../shared/constants/roles';
import { VISIT_TECHNICIAN_ROLE } from '../../../shared/constants/planning';
import { bankEngineInputs, type BankEngineInputs } from '../../../shared/domain/bank-engine-inputs';
import { judgeRecordedRun, type RecordedRunVerdict } from '../../../shared/domain/recorded-run';
import { formatFigure } from '../../../shared/domain/format';
import { VISIT_STATE_LABELS, type VisitState } from '../../../shared/domain/visit-states';
import type { DecayRunCorrection, DecayRunData } from '../../../shared/schemas/decay-run';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Bank } from '../models/bank';
import { BankDesign } from '../models/bank-design';
import { BankDesignVersion } from '../models/bank-design-version';
import { Cabinet } from '../models/cabinet';
import { DecayRun } from '../models/decay-run';
import { Site } from '../models/site';
import { User } from '../models/user';
import { Visit } from '../models/visit';
import { VisitBank } from '../models/visit-bank';
import { VisitTechnician } from '../models/visit-technician';
import { recordAudit, type AuditRecordInput } from './audit';
import { bankRecordForEngine } from './banks';
import { enqueueOutboxMessage } from './outbox';
import type { Actor, UnitOfWork } from './unit-of-work';
import { mayReadVisit, transitionVisit, type VisitViewer } from './visits';

/** Roles that correct any run (besides the person who recorded it). */
export const DECAY_RUN_CORRECTORS: readonly Role[] = ['reliability', 'admin'];

/** The answer of a write: the run, and whether this call stored it (201) or found it (200). */
export interface DecayRunWrite {
  run: DecayRun;
  created: boolean;
}

/** Includes of a run for its answer: bank → cabinet → area → site, the people, the correction. */
const RUN_INCLUDE = [
  {
    model: Bank,
    as: 'bank',
    attributes: ['id', 'position', 'cabinetId', 'baselineDecayRunId'],
    include: [
      {
        model: Cabinet,
        as: 'cabinet',
        attributes: ['id', 'tag', 'areaId'],
        include: [
          {
            model: Area,
            as: 'area',
            attributes: ['id', 'siteId'],
            include: [{ model: Site, as: 'site', attributes: ['id', 'name'] }],
          },
        ],
      },
    ],
  },
  { model: User, as: 'recordedBy', attributes: ['id', 'name'] },
  { model: User, as: 'reviewedBy', attributes: ['id', 'name'] },
  { model: DecayRun, as: 'supersededBy', attributes: ['id'] },
];

/**
 * JSON with object keys in sorted order at every depth, so the same body hashes the same
 * whatever order its keys were sent in.
 *
 * @example canonicalJson({ b: 1, a: [{ d: 2, c: 3 }] }) // '{"a":[{"c":3,"d":2}],"b":1}'
 */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

/** SHA-256 (hex) of a submission: what it is (a run on a visit, a correction of a run) and its parsed body. */
export function submissionSha256(kind: 'run' | 'correction', targetId: string, body: unknown): string {
  return createHash('sha256').update(canonicalJson({ kind, targetId, body })).digest('hex');
}

/** Holds other submissions of the same clientId until this transaction ends. */
async function lockClientId(clientId: string, transaction: Transaction): Promise<void> {
  await sequelize.query(`SELECT pg_advisory_xact_lock(hashtextextended('decay-run-client:' || :clientId, 0))`, {
    replacements: { clientId },
    transaction,
  });
}

/**
 * The run stored under `clientId` when this is a retry of the same submission; null for a new
 * clientId.
 *
 * @throws AppError `client-id-reused` when the clientId was stored with another body
 */
async function earlierSubmission(clientId: string, sha256: string, transaction: Transaction): Promise<DecayRun | null> {
  const earlier = await DecayRun.findOne({ where: { clientId }, attributes: ['id', 'bodySha256'], transaction });
  if (!earlier) return null;
  if (earlier.bodySha256 !== sha256) {
    throw new AppError(
      'client-id-reused',
      'This clientId was already used for another run or body. A retry must send the same body; a new run needs a new clientId.',
      [{ path: 'clientId', message: 'already used with a different body' }],
    );
  }
  return loadDecayRun(earlier.id, transaction);
}

/** The bank with its design's current revision and its cabinet, as the engine judges a run on it. */
async function bankForEngine(bankId: string, transaction: Transaction): Promise<{ bank: Bank; engine: BankEngineInputs }> {
  const bank = await Bank.findByPk(bankId, {
    include: [
      { model: BankDesign, as: 'bankDesign', include: [{ model: BankDesignVersion, as: 'currentVersion' }] },
      { model: Cabinet, as: 'cabinet' },
    ],
    transaction,
  });
  if (!bank) throw AppError.notFound('Bank');
  const engine = bankEngineInputs(bankRecordForEngine(bank));
  if (!engine) throw AppError.conflict(`Bank ${bank.position}'s design has no revision to judge a run with; ask a reliability engineer to complete the design.`);
  return { bank, engine };
}

/** The run's body as it is stored beside the verdict. */
interface RunBody {
  clientId: string;
  source: DecayRunData['source'];
  loggerFileName?: string | undefined;
  isolatedAt: string;
  samples: DecayRunData['samples'];
  safety: DecayRunData['safety'];
  observations: DecayRunData['observations'];
}

/** The attributes of a decay run row (what {@link decayRunRowFor} returns and the services insert). */
export type DecayRunRow = Pick<
  DecayRun,
  | 'clientId'
  | 'visitId'
  | 'bankId'
  | 'version'
  | 'supersedesId'
  | 'correctionReason'
  | 'source'
  | 'loggerFileName'
  | 'isolatedAt'
  | 'samples'
  | 'safety'
  | 'observations'
  | 'verdict'
  | 'health'
  | 'tauSeconds'
  | 'capacitanceRatio'
  | 'safetyFinding'
  | 'bodySha256'
  | 'recordedById'
  | 'recordedAt'
>;

/** The summary columns of a verdict: health, τ, ratio to baseline, safety finding. */
export function verdictFigures(verdict: RecordedRunVerdict): Pick<DecayRunRow, 'health' | 'tauSeconds' | 'capacitanceRatio' | 'safetyFinding'> {
  if (verdict.status !== 'ok') {
    return { health: verdict.health, tauSeconds: null, capacitanceRatio: null, safetyFinding: verdict.safetyFinding };
  }
  return {
    health: verdict.health,
    tauSeconds: verdict.tauSeconds,
    capacitanceRatio: verdict.baseline?.ratio ?? null,
    safetyFinding: verdict.safetyFinding,
  };
}

/**
 * The row of a decay run, judged: the body as sent, the verdict of `judgeRecordedRun` with the
 * bank's engine inputs, its summary columns and the body hash a retry is recognised by. Pure
 * apart from the hash; the services insert it, and the demo seed may insert many at once.
 *
 * @param input.engine - the bank's engine inputs (`bankEngineInputs(bankRecordForEngine(bank))`)
 * @param input.body - a parsed `decayRunInputSchema` body (its bankId is `input.bankId`)
 * @param input.recordedAt - the instant of recording (the unit of work's `now`)
 * @example
 * const row = decayRunRowFor({ visitId, bankId, engine, body: decayRunInputSchema.parse(json), recordedById, recordedAt });
 * await DecayRun.bulkCreate([row], { transaction });
 */
export function decayRunRowFor(input: {
  visitId: string;
  bankId: string;
  engine: BankEngineInputs;
  body: RunBody;
  recordedById: string;
  recordedAt: Date;
  /** For a correction: the version it supersedes, and the reason. */
  correction?: { supersedes: Pick<DecayRun, 'id' | 'version'>; reason: string };
  /** The hash of the submission; by default that of a new run's body on the visit. */
  bodySha256?: string;
}): DecayRunRow {
  const { body } = input;
  const verdict = judgeRecordedRun({ samples: body.samples, engine: input.engine, observations: body.observations });
  return {
    clientId: body.clientId,
    visitId: input.visitId,
    bankId: input.bankId,
    version: input.correction ? input.correction.supersedes.version + 1 : 1,
    supersedesId: input.correction?.supersedes.id ?? null,
    correctionReason: input.correction?.reason ?? null,
    source: body.source,
    loggerFileName: body.loggerFileName ?? null,
    isolatedAt: new Date(body.isolatedAt),
    samples: body.samples,
    safety: body.safety,
    observations: body.observations,
    verdict,
    ...verdictFigures(verdict),
    bodySha256: input.bodySha256 ?? submissionSha256('run', input.visitId, { ...body, bankId: input.bankId }),
    recordedById: input.recordedById,
    recordedAt: input.recordedAt,
  };
}

/**
 * The audit entry of a stored run: what was recorded (or corrected), with the verdict's figures.
 * The samples are in the run itself and not copied into the trail.
 */
export function decayRunAuditEntry(
  run: Pick<DecayRun, 'id' | 'clientId' | 'visitId' | 'bankId' | 'version' | 'supersedesId' | 'correctionReason' | 'source' | 'samples' | 'health' | 'tauSeconds' | 'capacitanceRatio' | 'safetyFinding' | 'observations'> & { isolatedAt: Date },
  place: { cabinetTag: string; bankPosition: string },
  actor?: AuditRecordInput['actor'],
): AuditRecordInput {
  const tau = run.tauSeconds !== null ? `τ ${formatFigure(run.tauSeconds)} s` : 'no usable fit';
  const health = run.health ? `, ${run.health.replace(/-/g, ' ')}` : '';
  const safety = run.safetyFinding ? ', safety finding' : '';
  const what = run.version === 1 ? 'Recorded a decay run' : `Corrected a decay run (version ${run.version})`;
  return {
    entityType: 'decay-run',
    entityId: run.id,
    action: run.version === 1 ? 'record' : 'correct',
    ...(actor !== undefined ? { actor } : {}),
    summary: `${what} on ${place.cabinetTag} ${place.bankPosition}: ${tau}${health}${safety}${run.correctionReason ? ` (${run.correctionReason})` : ''}`,
    before: null,
    after: {
      clientId: run.clientId,
      visitId: run.visitId,
      bankId: run.bankId,
      version: run.version,
      supersedesId: run.supersedesId,
      correctionReason: run.correctionReason,
      source: run.source,
      isolatedAt: run.isolatedAt.toISOString(),
      sampleCount: run.samples.length,
      visualFindings: run.observations.visualFindings,
      health: run.health,
      tauSeconds: run.tauSeconds,
      capacitanceRatio: run.capacitanceRatio,
      safetyFinding: run.safetyFinding,
    },
  };
}

/** True when the actor may record runs on the visit: an assigned technician, or an admin. */
function mayRecordOn(actor: Actor, technicianIds: readonly string[]): boolean {
  if (!actor) return false;
  if (actor.roles.includes('admin')) return true;
  return actor.roles.includes(VISIT_TECHNICIAN_ROLE) && technicianIds.includes(actor.id);
}

/**
 * Records a decay run on a visit (`POST /api/visits/:visitId/decay-runs`). A retry with the
 * same clientId and body answers the stored run (`created: false`).
 *
 * @param visitId - the visit the run belongs to; a planned one is started in the same unit of work
 * @param input - a parsed `decayRunInputSchema` body
 * @returns the run (with its bank, cabinet, site and people) and whether this call stored it
 * @throws AppError `client-id-reused` (same clientId, other body), `not-found` (visit, also
 *   one a technician may not read),
 *   `forbidden` (not an assigned technician or an admin), `visit-not-open` (logged, reviewed,
 *   missed or cancelled), `bank-not-on-visit` (issues name bankId)
 */
export async function recordDecayRun(uow: UnitOfWork, visitId: string, input: DecayRunData): Promise<DecayRunWrite> {
  const { transaction } = uow;
  const { bankId, ...body } = input;
  const sha256 = submissionSha256('run', visitId, input);
  await lockClientId(input.clientId, transaction);
  const earlier = await earlierSubmission(input.clientId, sha256, transaction);
  if (earlier) return { run: earlier, created: false };

  // the visit row is locked: two first runs on a planned visit start it once
  const visit = await Visit.findByPk(visitId, { transaction, lock: transaction.LOCK.UPDATE });
  // a technician who may not read the visit is told it was not found, as the visits routes do
  if (!visit || !(await mayReadVisit(uow.actor, visitId, transaction))) throw AppError.notFound('Visit');
  const technicianIds = (await VisitTechnician.findAll({ where: { visitId }, attributes: ['userId'], transaction })).map((t) => t.userId);
  if (!mayRecordOn(uow.actor, technicianIds)) {
    throw AppError.forbidden('Only a technician assigned to this visit (or an admin) may record decay runs on it.');
  }
  if (visit.state !== 'planned' && visit.state !== 'under-way') {
    throw new AppError(
      'visit-not-open',
      `This visit is ${VISIT_STATE_LABELS[visit.state as VisitState]}: decay runs are recorded on a visit that is planned or under way. Start an unplanned visit to record a new run.`,
    );
  }
  const onVisit = await VisitBank.findOne({ where: { visitId, bankId }, transaction });
  if (!onVisit) {
    throw new AppError('bank-not-on-visit', 'bankId: this bank is not one of the visit\'s banks.', [
      { path: 'bankId', message: "Choose one of the visit's banks." },
    ]);
  }
  if (visit.state === 'planned') {
    // only an assigned technician starts a visit (visit-states.ts): an admin records on one under way
    if (!(uow.actor.roles.includes(VISIT_TECHNICIAN_ROLE) && technicianIds.includes(uow.actor.id))) {
      throw AppError.forbidden('This visit has not been started: only a technician assigned to it may start it by recording the first run.');
    }
    // the start button may have been pressed offline: the first run starts the visit
    await transitionVisit(uow, visitId, { action: 'start', version: visit.version });
  }

  const { bank, engine } = await bankForEngine(bankId, transaction);
  const row = decayRunRowFor({ visitId, bankId, engine, body, recordedById: uow.actor.id, recordedAt: uow.now, bodySha256: sha256 });
  const run = await DecayRun.create(row, { transaction });
  await recordAudit(uow, decayRunAuditEntry(run, { cabinetTag: bank.cabinet?.tag ?? 'a cabinet', bankPosition: bank.position }));
  await enqueueOutboxMessage(uow, 'decay-run.recorded', {
    runId: run.id,
    bankId,
    visitId,
    health: run.health,
    safetyFinding: run.safetyFinding,
  });
  return { run: await loadDecayRun(run.id, transaction), created: true };
}

/**
 * Corrects a run (`POST /api/decay-runs/:runId/corrections`): a new version (version + 1) that
 * supersedes it, on the same visit and bank, with the reason; the earlier version stays as it
 * was. A version is corrected once: correct the newest. Idempotent by clientId like a new run.
 *
 * @param runId - the version being corrected
 * @param input - a parsed `decayRunCorrectionSchema` body
 * @throws AppError `client-id-reused`, `not-found` (run), `forbidden` (not its recorder, a
 *   reliability engineer or an admin), `already-corrected` (this version has a correction)
 */
export async function correctDecayRun(uow: UnitOfWork, runId: string, input: DecayRunCorrection): Promise<DecayRunWrite> {
  const { transaction } = uow;
  const { reason, ...body } = input;
  const sha256 = submissionSha256('correction', runId, input);
  await lockClientId(input.clientId, transaction);
  const earlier = await earlierSubmission(input.clientId, sha256, transaction);
  if (earlier) return { run: earlier, created: false };

  // the version is locked: two corrections of it at once, the second finds the first
  const original = await DecayRun.findByPk(runId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!original) throw AppError.notFound('Decay run');
  if (original.recordedById !== uow.actor.id && !hasAnyRole(uow.actor.roles, DECAY_RUN_CORRECTORS)) {
    throw AppError.forbidden('Only the person who recorded this run, a reliability engineer or an admin may correct it.');
  }
  const correction = await DecayRun.findOne({ where: { supersedesId: runId }, attributes: ['id', 'version'], transaction });
  if (correction) {
    throw new AppError(
      'already-corrected',
      `Version ${original.version} of this run was corrected already (version ${correction.version}); correct the newest version.`,
    );
  }

  const { bank, engine } = await bankForEngine(original.bankId, transaction);
  const row = decayRunRowFor({
    visitId: original.visitId,
    bankId: original.bankId,
    engine,
    body,
    recordedById: uow.actor.id,
    recordedAt: uow.now,
    correction: { supersedes: original, reason },
    bodySha256: sha256,
  });
  const run = await DecayRun.create(row, { transaction });
  await recordAudit(uow, decayRunAuditEntry(run, { cabinetTag: bank.cabinet?.tag ?? 'a cabinet', bankPosition: bank.position }));
  await enqueueOutboxMessage(uow, 'decay-run.corrected', {
    runId: run.id,
    supersedesId: original.id,
    bankId: run.bankId,
    visitId: run.visitId,
    health: run.health,
    safetyFinding: run.safetyFinding,
  });
  return { run: await loadDecayRun(run.id, transaction), created: true };
}

/** A run with its bank, cabinet, site, people and correction, for its answer. */
export async function loadDecayRun(id: string, transaction?: Transaction): Promise<DecayRun> {
  const run = await DecayRun.findByPk(id, { include: RUN_INCLUDE, transaction });
  if (!run) throw AppError.notFound('Decay run');
  return run;
}

/**
 * One run (`GET /api/decay-runs/:runId`), readable by every signed-in role.
 *
 * @throws AppError `not-found`
 */
export async function getDecayRun(id: string, transaction?: Transaction): Promise<DecayRun> {
  return loadDecayRun(id, transaction);
}

const NEWEST_FIRST: [string, string][] = [
  ['recordedAt', 'DESC'],
  ['version', 'DESC'],
  ['id', 'ASC'],
];

/**
 * A visit's runs, every version, newest first.
 *
 * @param viewer - who reads: a technician reads the runs of the visits they may read
 * @throws AppError `not-found` (visit, also one the viewer may not read)
 */
export async function listVisitDecayRuns(visitId: string, viewer: VisitViewer, transaction?: Transaction): Promise<DecayRun[]> {
  const visit = await Visit.findByPk(visitId, { attributes: ['id'], transaction });
  if (!visit || !(await mayReadVisit(viewer, visitId, transaction))) throw AppError.notFound('Visit');
  return DecayRun.findAll({ where: { visitId }, include: RUN_INCLUDE, order: NEWEST_FIRST, transaction });
}

/**
 * A bank's runs over all its visits, every version, newest first.
 *
 * @throws AppError `not-found` (bank)
 */
export async function listBankDecayRuns(bankId: string, transaction?: Transaction): Promise<DecayRun[]> {
  const bank = await Bank.findByPk(bankId, { attributes: ['id'], transaction });
  if (!bank) throw AppError.notFound('Bank');
  return DecayRun.findAll({ where: { bankId }, include: RUN_INCLUDE, order: NEWEST_FIRST, transaction });
}
