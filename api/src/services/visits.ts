/**
 * Use cases of visits: list and read them (a technician sees the visits assigned to them and
 * every visit of their sites), plan them (one, or several all or none), replan them, and move
 * them through their states by the rules of shared/domain/visit-states.ts. Every change writes
 * an audit entry in the same unit of work.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import { VISIT_PLANNERS, VISIT_TECHNICIAN_ROLE } from '../../../shared/constants/planning';
import { hasAnyRole, type Role } from '../../../shared/constants/roles';
import {
  mayTakeVisitAction,
  nextVisitState,
  VISIT_STATE_LABELS,
  visitStateRefusal,
  type VisitAction,
  type VisitState,
} from '../../../shared/domain/visit-states';
import type {
  PlanningOverride,
  PlanningWarning,
  VisitCheckInput,
  VisitData,
  VisitListQuery,
  VisitTransition,
  VisitUpdate,
} from '../../../shared/schemas/visit';
import { sequelize } from '../db/sequelize';
import { AppError, type FieldIssue } from '../errors';
import { Area } from '../models/area';
import { Bank } from '../models/bank';
import { BankDesign } from '../models/bank-design';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { User } from '../models/user';
import { Visit } from '../models/visit';
import { VisitBank } from '../models/visit-bank';
import { VisitTechnician } from '../models/visit-technician';
import type { AuthUser } from '../types/express';
import { recordAudit, recordAuditBatch, type AuditRecordInput } from './audit';
import { staleVersion } from './register-records';
import type { Actor, UnitOfWork } from './unit-of-work';
import { visitBankRunFigures } from './visit-run-figures';
import { overrideIssues, overrideNeeded, planningWarningsOf, type PlannedVisit } from './visit-planning';

/** Who is reading visits: their id and roles. */
export type VisitViewer = Pick<AuthUser, 'id' | 'roles'>;

/** Roles that read every visit; a technician alone reads their own and their sites'. */
const READS_ALL: readonly Role[] = ['admin', 'planner', 'reliability'];

/** True when the person reads every visit (not only their own and their sites'). */
export function readsAllVisits(viewer: VisitViewer): boolean {
  return hasAnyRole(viewer.roles, READS_ALL);
}

const VISIT_INCLUDE = [
  {
    model: Cabinet,
    as: 'cabinet',
    required: true,
    include: [{ model: Area, as: 'area', required: true, include: [{ model: Site, as: 'site', required: true }] }],
  },
  {
    model: Bank,
    as: 'banks',
    through: { attributes: [] },
    include: [{ model: BankDesign, as: 'bankDesign', attributes: ['id', 'code'] }],
  },
  { model: User, as: 'technicians', through: { attributes: [] }, attributes: ['id', 'name'] },
];

// a technician alone sees a visit assigned to them or at one of their sites
const VISIBLE_TO_TECHNICIAN = `(
  EXISTS (SELECT 1 FROM visit_technicians mine WHERE mine.visit_id = v.id AND mine.user_id = :viewerId)
  OR EXISTS (SELECT 1 FROM person_sites ps WHERE ps.user_id = :viewerId AND ps.site_id = a.site_id)
)`;

/** Loads visits with cabinet, area, site, banks and technicians, in the order of `ids`. */
async function loadVisits(ids: readonly string[], transaction?: Transaction): Promise<Visit[]> {
  if (ids.length === 0) return [];
  const rows = await Visit.findAll({ where: { id: [...ids] }, include: VISIT_INCLUDE, transaction });
  // the banks' decay-run figures of every visit of the list in one query
  const figures = await visitBankRunFigures(ids, transaction);
  for (const row of rows) row.decayRunFigures = figures.get(row.id) ?? new Map();
  const byId = new Map(rows.map((row) => [row.id, row]));
  return ids.map((id) => byId.get(id)).filter((row): row is Visit => row !== undefined);
}

/**
 * One page of the visits the viewer may read that match the query, in planned start order.
 * `from`/`to` keep visits whose planned times overlap [from, to).
 */
export async function listVisits(query: VisitListQuery, viewer: VisitViewer): Promise<{ rows: Visit[]; count: number }> {
  const conditions: string[] = [];
  const replacements: Record<string, unknown> = { viewerId: viewer.id };
  if (!readsAllVisits(viewer)) conditions.push(VISIBLE_TO_TECHNICIAN);
  /** Keeps only the visits matching `condition` when the query names `value` (kept as `:name` where the condition reads it). */
  const filterBy = (value: unknown, condition: string, name?: string) => {
    if (!value) return;
    conditions.push(condition);
    if (name) replacements[name] = value;
  };
  filterBy(query.from, 'v.planned_end_at > :from', 'from');
  filterBy(query.to, 'v.planned_start_at < :to', 'to');
  filterBy(query.state, 'v.state IN (:states)', 'states');
  filterBy(
    query.technicianId,
    'EXISTS (SELECT 1 FROM visit_technicians t WHERE t.visit_id = v.id AND t.user_id = :technicianId)',
    'technicianId',
  );
  filterBy(query.mine, 'EXISTS (SELECT 1 FROM visit_technicians me WHERE me.visit_id = v.id AND me.user_id = :viewerId)');
  filterBy(query.siteId, 'a.site_id = :siteId', 'siteId');
  filterBy(query.areaId, 'c.area_id = :areaId', 'areaId');
  filterBy(query.cabinetId, 'v.cabinet_id = :cabinetId', 'cabinetId');
  const where = conditions.length > 0 ? `WHERE ${conditions.join(' AND ')}` : '';
  const from = 'FROM visits v JOIN cabinets c ON c.id = v.cabinet_id JOIN areas a ON a.id = c.area_id';
  const direction = query.sort === '-plannedStartAt' ? 'DESC' : 'ASC';
  const [idRows, countRows] = await Promise.all([
    sequelize.query<{ id: string }>(
      `SELECT v.id ${from} ${where} ORDER BY v.planned_start_at ${direction}, v.id ASC LIMIT :limit OFFSET :offset`,
      {
        replacements: { ...replacements, limit: query.pageSize, offset: (query.page - 1) * query.pageSize },
        type: QueryTypes.SELECT,
      },
    ),
    sequelize.query<{ count: number }>(`SELECT count(*)::int AS count ${from} ${where}`, {
      replacements,
      type: QueryTypes.SELECT,
    }),
  ]);
  return { rows: await loadVisits(idRows.map((r) => r.id)), count: countRows[0]?.count ?? 0 };
}

/** True when the viewer may read the visit (it exists). */
export async function mayReadVisit(viewer: VisitViewer, id: string, transaction?: Transaction): Promise<boolean> {
  const visibility = readsAllVisits(viewer) ? 'TRUE' : VISIBLE_TO_TECHNICIAN;
  const rows = await sequelize.query(
    `SELECT 1 FROM visits v JOIN cabinets c ON c.id = v.cabinet_id JOIN areas a ON a.id = c.area_id
      WHERE v.id = :id AND ${visibility}`,
    { replacements: { id, viewerId: viewer.id }, type: QueryTypes.SELECT, transaction },
  );
  return rows.length > 0;
}

/**
 * A visit with its cabinet, site, banks and technicians, when the viewer may read it.
 * A technician who may not read a visit is told it was not found (its existence is not theirs to know).
 *
 * @param viewer - who reads; null reads every visit (Ebbline itself)
 * @throws AppError `not-found`
 */
export async function getVisit(id: string, viewer: VisitViewer | null, transaction?: Transaction): Promise<Visit> {
  if (viewer && !(await mayReadVisit(viewer, id, transaction))) throw AppError.notFound('Visit');
  const [visit] = await loadVisits([id], transaction);
  if (!visit) throw AppError.notFound('Visit');
  return visit;
}

/** What the audit trail keeps of a visit. */
export function visitSnapshot(visit: Visit, technicianIds: readonly string[], bankIds: readonly string[]): Record<string, unknown> {
  const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
  return {
    cabinetId: visit.cabinetId,
    plannedStartAt: iso(visit.plannedStartAt),
    plannedEndAt: iso(visit.plannedEndAt),
    state: visit.state,
    technicianIds: [...technicianIds].sort(),
    bankIds: [...bankIds].sort(),
    notes: visit.notes,
    overrides: visit.overrides,
    stateReason: visit.stateReason,
    startedAt: iso(visit.startedAt),
    loggedAt: iso(visit.loggedAt),
    reviewedAt: iso(visit.reviewedAt),
    missedAt: iso(visit.missedAt),
    cancelledAt: iso(visit.cancelledAt),
    version: visit.version,
  };
}

async function assignmentsOf(visitId: string, transaction: Transaction) {
  // one after another: both share the transaction's one connection
  const technicians = await VisitTechnician.findAll({ where: { visitId }, transaction });
  const banks = await VisitBank.findAll({ where: { visitId }, transaction });
  return { technicianIds: technicians.map((t) => t.userId), bankIds: banks.map((b) => b.bankId) };
}

/** What the checks found of a visit's cabinet: its area and the site's zone. */
interface CabinetPlace {
  cabinetId: string;
  cabinetTag: string;
  areaId: string;
  timeZone: string;
}

/**
 * Checks that the cabinet is in use, the banks are its banks in service and the technicians are
 * active people holding the technician role; each problem is an issue naming its field.
 */
async function referenceIssues(
  input: { cabinetId: string; bankIds: readonly string[]; technicianIds: readonly string[] },
  pathPrefix: string,
  transaction?: Transaction,
): Promise<{ issues: FieldIssue[]; place: CabinetPlace | null }> {
  const issues: FieldIssue[] = [];
  const issue = (path: string, message: string) => issues.push({ path: `${pathPrefix}${path}`, message });
  const cabinet = await Cabinet.findByPk(input.cabinetId, {
    include: [{ model: Area, as: 'area', include: [{ model: Site, as: 'site' }] }],
    transaction,
  });
  let place: CabinetPlace | null = null;
  if (!cabinet || cabinet.retiredAt || !cabinet.area?.site) {
    issue('cabinetId', 'This cabinet does not exist or is retired.');
  } else {
    place = { cabinetId: cabinet.id, cabinetTag: cabinet.tag, areaId: cabinet.areaId, timeZone: cabinet.area.site.timeZone };
    const banks = await Bank.findAll({ where: { id: [...input.bankIds] }, attributes: ['id', 'cabinetId', 'status', 'retiredAt'], transaction });
    const good = new Set(banks.filter((b) => b.cabinetId === cabinet.id && b.status === 'in-service' && !b.retiredAt).map((b) => b.id));
    if (input.bankIds.some((id) => !good.has(id))) {
      issue('bankIds', `Choose banks in service of cabinet ${cabinet.tag}.`);
    }
  }
  const people = await User.findAll({ where: { id: [...input.technicianIds] }, attributes: ['id', 'roles', 'active'], transaction });
  const technicians = new Set(people.filter((p) => p.active && p.roles.includes(VISIT_TECHNICIAN_ROLE)).map((p) => p.id));
  if (input.technicianIds.some((id) => !technicians.has(id))) {
    issue('technicianIds', 'Choose active people who hold the technician role.');
  }
  return { issues, place };
}

/**
 * Holds off, until the transaction ends, any other write planning the same technicians, so two
 * planners cannot double-book a person past each other's check. Locks in id order (no deadlock).
 */
async function lockTechnicians(technicianIds: readonly string[], transaction: Transaction): Promise<void> {
  for (const id of [...new Set(technicianIds)].sort()) {
    await sequelize.query(`SELECT pg_advisory_xact_lock(hashtextextended('visit-technician:' || :id, 0))`, {
      replacements: { id },
      transaction,
    });
  }
}

/**
 * The planning warnings of a visit as it would be saved (before saving it). With `visitId`, the
 * visit being replanned is left out of the double-booking check.
 *
 * @param asOf - the instant the banks' due dates are judged at
 * @throws AppError `validation-failed` naming the field when the cabinet, banks or technicians do not resolve
 */
export async function checkVisitPlan(input: VisitCheckInput, asOf: Date): Promise<PlanningWarning[]> {
  const { issues, place } = await referenceIssues(input, '');
  if (issues.length > 0 || !place) throw fieldIssues(issues);
  return planningWarningsOf(plannedVisit(place, input), input.visitId ?? null, asOf);
}

function plannedVisit(
  place: CabinetPlace,
  times: { plannedStartAt: string; plannedEndAt: string; technicianIds: readonly string[]; bankIds: readonly string[] },
): PlannedVisit {
  return {
    cabinetId: place.cabinetId,
    areaId: place.areaId,
    timeZone: place.timeZone,
    plannedStartAt: times.plannedStartAt,
    plannedEndAt: times.plannedEndAt,
    technicianIds: times.technicianIds,
    bankIds: times.bankIds,
  };
}

function fieldIssues(issues: FieldIssue[]): AppError {
  const first = issues[0];
  return AppError.badRequest(first ? `${first.path}: ${first.message}` : 'Invalid visit.', issues);
}

/**
 * Plans one visit.
 *
 * @throws AppError `validation-failed` naming the field (cabinet, banks, technicians);
 *   `override-needed` when a planning warning is not overridden with a reason
 */
export async function createVisit(uow: UnitOfWork, input: VisitData): Promise<Visit> {
  const [visit] = await createVisits(uow, [input]);
  return visit!;
}

/**
 * Plans several visits, all or none (a window's plan confirmed in one step). Visits of the same
 * batch count against each other for double-booking. Problems of every visit are gathered and
 * named by their place in the list (`visits.3.technicianIds`).
 *
 * @param options.pathPrefix - put before each issue's path; `visits.` by default when
 *   several are planned, none for one
 * @throws AppError `validation-failed`, `override-needed` (issues name `visits.N.…`)
 */
export async function createVisits(
  uow: UnitOfWork<Actor>,
  inputs: readonly VisitData[],
  options: { pathPrefix?: (index: number) => string } = {},
): Promise<Visit[]> {
  const { transaction } = uow;
  const prefix = options.pathPrefix ?? ((index: number) => (inputs.length === 1 ? '' : `visits.${index}.`));
  await lockTechnicians(inputs.flatMap((i) => i.technicianIds), transaction);

  const problems: FieldIssue[] = [];
  const warningsNeeded: FieldIssue[] = [];
  const created: Visit[] = [];
  const audits: AuditRecordInput[] = [];
  for (const [index, input] of inputs.entries()) {
    const { issues, place } = await referenceIssues(input, prefix(index), transaction);
    if (issues.length > 0 || !place) {
      problems.push(...issues);
      continue;
    }
    const warnings = await planningWarningsOf(plannedVisit(place, input), null, uow.now, transaction);
    const open = overrideIssues(warnings, input.overrides, prefix(index));
    if (open.length > 0) {
      warningsNeeded.push(...open);
      continue;
    }
    const present = new Set(warnings.map((w) => w.kind));
    const visit = await Visit.create(
      {
        cabinetId: input.cabinetId,
        plannedStartAt: new Date(input.plannedStartAt),
        plannedEndAt: new Date(input.plannedEndAt),
        notes: input.notes,
        overrides: input.overrides.filter((o) => present.has(o.kind)),
        createdById: uow.actor?.id ?? null,
        createdAt: uow.now,
        updatedAt: uow.now,
      },
      { transaction, silent: true },
    );
    await VisitBank.bulkCreate(input.bankIds.map((bankId) => ({ visitId: visit.id, bankId })), { transaction });
    await VisitTechnician.bulkCreate(input.technicianIds.map((userId) => ({ visitId: visit.id, userId })), { transaction });
    created.push(visit);
    audits.push({
      entityType: 'visit',
      entityId: visit.id,
      action: 'create',
      summary: `Planned a visit to ${place.cabinetTag}`,
      before: null,
      after: visitSnapshot(visit, input.technicianIds, input.bankIds),
    });
  }
  // bad references first: a warning about a visit that cannot be saved anyway helps nobody
  if (problems.length > 0) throw fieldIssues(problems);
  if (warningsNeeded.length > 0) throw overrideNeeded(warningsNeeded);
  await recordAuditBatch(uow, audits);
  return loadVisits(created.map((v) => v.id), transaction);
}

/** Locks a visit for change and checks the version the editor read. */
async function lockVisit(id: string, sentVersion: number, transaction: Transaction): Promise<Visit> {
  const visit = await Visit.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!visit) throw AppError.notFound('Visit');
  if (visit.version !== sentVersion) throw staleVersion('visit', sentVersion, visit.version);
  return visit;
}

function refuseState(state: VisitState, action: VisitAction): AppError {
  return new AppError('visit-state', visitStateRefusal(state, action));
}

/**
 * Changes a visit; only the fields the change names. New times, technicians or banks replan
 * it (planned or missed → planned; the reason is kept as `stateReason`) and are checked again:
 * warnings must be overridden, by the overrides the change sends or else those the visit
 * already carries. Notes alone change in any state.
 *
 * @throws AppError `not-found`, `stale-version`, `visit-state`, `validation-failed`, `override-needed`
 */
export async function updateVisit(uow: UnitOfWork, id: string, input: VisitUpdate): Promise<Visit> {
  const { transaction } = uow;
  const exists = await Visit.findByPk(id, { attributes: ['id'], transaction });
  if (!exists) throw AppError.notFound('Visit');
  const current = await assignmentsOf(id, transaction);
  await lockTechnicians([...current.technicianIds, ...(input.technicianIds ?? [])], transaction);
  const visit = await lockVisit(id, input.version, transaction);
  const before = visitSnapshot(visit, current.technicianIds, current.bankIds);

  const replanning =
    input.plannedStartAt !== undefined ||
    input.plannedEndAt !== undefined ||
    input.technicianIds !== undefined ||
    input.bankIds !== undefined;
  const next = {
    plannedStartAt: input.plannedStartAt ?? visit.plannedStartAt.toISOString(),
    plannedEndAt: input.plannedEndAt ?? visit.plannedEndAt.toISOString(),
    technicianIds: input.technicianIds ?? current.technicianIds,
    bankIds: input.bankIds ?? current.bankIds,
  };
  const changes: Partial<Pick<Visit, 'plannedStartAt' | 'plannedEndAt' | 'notes' | 'overrides' | 'state' | 'stateReason' | 'missedAt'>> = {};
  if (input.notes !== undefined && input.notes !== visit.notes) changes.notes = input.notes;

  if (replanning) {
    if (!mayTakeVisitAction({ action: 'replan', roles: uow.actor.roles, isAssigned: false })) {
      throw AppError.forbidden('Only planners and admins replan visits.');
    }
    if (nextVisitState(visit.state, 'replan') === null) throw refuseState(visit.state, 'replan');
    if (new Date(next.plannedEndAt) <= new Date(next.plannedStartAt)) {
      const path = input.plannedEndAt !== undefined ? 'plannedEndAt' : 'plannedStartAt';
      throw fieldIssues([{ path, message: 'The planned end must come after the planned start.' }]);
    }
    const { issues, place } = await referenceIssues({ cabinetId: visit.cabinetId, ...next }, '', transaction);
    if (issues.length > 0 || !place) throw fieldIssues(issues);
    const warnings = await planningWarningsOf(plannedVisit(place, next), id, uow.now, transaction);
    const offered: PlanningOverride[] = input.overrides ?? visit.overrides;
    const open = overrideIssues(warnings, offered);
    if (open.length > 0) throw overrideNeeded(open);
    const present = new Set(warnings.map((w) => w.kind));
    changes.overrides = offered.filter((o) => present.has(o.kind));
    changes.plannedStartAt = new Date(next.plannedStartAt);
    changes.plannedEndAt = new Date(next.plannedEndAt);
    changes.state = 'planned';
    changes.stateReason = input.reason ?? '';
    changes.missedAt = null;
  } else if (input.overrides !== undefined) {
    changes.overrides = input.overrides;
  }

  const technicianChange = input.technicianIds !== undefined && !sameSet(input.technicianIds, current.technicianIds);
  const bankChange = input.bankIds !== undefined && !sameSet(input.bankIds, current.bankIds);
  const fieldChange = Object.entries(changes).some(([key, value]) => JSON.stringify(visit.get(key)) !== JSON.stringify(value));
  if (!fieldChange && !technicianChange && !bankChange) return getVisit(id, null, transaction);

  if (technicianChange) {
    await VisitTechnician.destroy({ where: { visitId: id }, transaction });
    await VisitTechnician.bulkCreate(next.technicianIds.map((userId) => ({ visitId: id, userId })), { transaction });
  }
  if (bankChange) {
    await VisitBank.destroy({ where: { visitId: id }, transaction });
    await VisitBank.bulkCreate(next.bankIds.map((bankId) => ({ visitId: id, bankId })), { transaction });
  }
  visit.set({ ...changes, version: visit.version + 1, updatedAt: uow.now });
  await visit.save({ transaction, silent: true });
  const cabinet = await Cabinet.findByPk(visit.cabinetId, { attributes: ['tag'], transaction });
  await recordAudit(uow, {
    entityType: 'visit',
    entityId: id,
    action: replanning ? 'replan' : 'update',
    summary: replanning
      ? `Replanned the visit to ${cabinet?.tag ?? 'a cabinet'}: ${input.reason ?? ''}`
      : `Changed the visit to ${cabinet?.tag ?? 'a cabinet'}`,
    before,
    after: visitSnapshot(visit, next.technicianIds, next.bankIds),
  });
  return getVisit(id, null, transaction);
}

function sameSet(a: readonly string[], b: readonly string[]): boolean {
  return a.length === b.length && new Set([...a, ...b]).size === a.length;
}

const PAST_TENSE: Record<VisitAction, string> = {
  start: 'Started',
  log: 'Logged',
  review: 'Reviewed',
  cancel: 'Cancelled',
  replan: 'Replanned',
  miss: 'Marked missed',
};

/**
 * Takes an action on a visit: a technician starts and logs a visit assigned to them; a
 * reliability engineer (or admin) reviews a logged one; a planner (or admin) cancels, with a
 * reason; Ebbline itself (actor null) marks a planned one missed.
 *
 * @throws AppError `not-found` (also for a visit the person may not read), `forbidden` (wrong
 *   role or not their visit), `stale-version`, `visit-state` (the state does not allow it)
 */
export async function transitionVisit(
  uow: UnitOfWork<Actor>,
  id: string,
  input: { action: VisitAction; version: number; reason?: string },
): Promise<Visit> {
  const { transaction, actor } = uow;
  if (actor && !(await mayReadVisit(actor, id, transaction))) throw AppError.notFound('Visit');
  const visit = await lockVisit(id, input.version, transaction);
  const { technicianIds, bankIds } = await assignmentsOf(id, transaction);
  const isAssigned = actor !== null && technicianIds.includes(actor.id);
  if (!mayTakeVisitAction({ action: input.action, roles: actor ? actor.roles : null, isAssigned })) {
    throw AppError.forbidden(refusalForRole(input.action));
  }
  const to = nextVisitState(visit.state, input.action);
  if (to === null) throw refuseState(visit.state, input.action);
  if (input.action === 'cancel' && !input.reason) {
    throw fieldIssues([{ path: 'reason', message: 'Give a reason for cancelling.' }]);
  }

  const before = visitSnapshot(visit, technicianIds, bankIds);
  const stamp: Partial<Pick<Visit, 'startedAt' | 'loggedAt' | 'reviewedAt' | 'missedAt' | 'cancelledAt' | 'stateReason'>> = {};
  if (input.action === 'start') stamp.startedAt = uow.now;
  if (input.action === 'log') stamp.loggedAt = uow.now;
  if (input.action === 'review') stamp.reviewedAt = uow.now;
  if (input.action === 'miss') stamp.missedAt = uow.now;
  if (input.action === 'cancel') {
    stamp.cancelledAt = uow.now;
    stamp.stateReason = input.reason ?? '';
  }
  visit.set({ ...stamp, state: to, version: visit.version + 1, updatedAt: uow.now });
  await visit.save({ transaction, silent: true });
  const cabinet = await Cabinet.findByPk(visit.cabinetId, { attributes: ['tag'], transaction });
  await recordAudit(uow, {
    entityType: 'visit',
    entityId: id,
    action: input.action,
    summary: `${PAST_TENSE[input.action]} the visit to ${cabinet?.tag ?? 'a cabinet'} (now ${VISIT_STATE_LABELS[to]})${input.reason ? `: ${input.reason}` : ''}`,
    before,
    after: visitSnapshot(visit, technicianIds, bankIds),
  });
  return getVisit(id, null, transaction);
}

function refusalForRole(action: VisitAction): string {
  switch (action) {
    case 'start':
    case 'log':
      return `Only a technician assigned to this visit may ${action} it.`;
    case 'review':
      return 'Only reliability engineers and admins review visits.';
    case 'cancel':
    case 'replan':
      return `Only ${VISIT_PLANNERS.join(' and ')}s ${action} visits.`.replace('admin and planners', 'planners and admins');
    case 'miss':
      return 'Only Ebbline marks a visit missed, when it is still planned well after its end.';
  }
}

/** A person's state change of a visit (`POST /api/visits/:visitId/transitions`). */
export async function takeVisitAction(uow: UnitOfWork, id: string, input: VisitTransition): Promise<Visit> {
  return transitionVisit(uow, id, input);
}
