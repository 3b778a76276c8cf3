/**
 * Unplanned visits: a technician standing at a cabinet (its QR label opened the cabinet's page)
 * starts a visit there and then. The visit is made already under way, marked `unplanned`, with
 * the caller as its technician, planned from now for its estimated duration
 * (shared/domain/visit-duration.ts), so the Planner's calendar and lists show it where it
 * happened. No planning warning applies: the technician is at the cabinet and has isolated it,
 * or is about to, under the plant's own permit.
 */
import { QueryTypes } from 'sequelize';
import { hasAnyRole } from '../../../shared/constants/roles';
import { VISIT_TECHNICIAN_ROLE } from '../../../shared/constants/planning';
import { estimateVisitMinutes } from '../../../shared/domain/visit-duration';
import type { UnplannedVisitInput } from '../../../shared/schemas/unplanned-visit';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Bank } from '../models/bank';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { Visit } from '../models/visit';
import { VisitBank } from '../models/visit-bank';
import { VisitTechnician } from '../models/visit-technician';
import { recordAuditBatch } from './audit';
import { enqueueOutboxMessage } from './outbox';
import type { UnitOfWork } from './unit-of-work';
import { getVisit, visitSnapshot } from './visits';

/** Outbox topic of an unplanned visit started. */
export const UNPLANNED_VISIT_TOPIC = 'visit.unplanned';

const MINUTE_MS = 60_000;

/**
 * True when the person may work at the site: an admin anywhere; a technician at the sites an
 * admin attached them to (`person_sites`), or anywhere when they are attached to none (as the
 * Planner offers every technician when nobody is attached).
 */
async function worksAtSite(uow: UnitOfWork, siteId: string): Promise<boolean> {
  if (hasAnyRole(uow.actor.roles, ['admin'])) return true;
  const rows = await sequelize.query<{ site_id: string }>('SELECT site_id FROM person_sites WHERE user_id = :userId', {
    replacements: { userId: uow.actor.id },
    type: QueryTypes.SELECT,
    transaction: uow.transaction,
  });
  return rows.length === 0 || rows.some((r) => r.site_id === siteId);
}

/**
 * The caller's visit under way at the cabinet, if any (the page offers "Open your visit" then).
 *
 * @returns the visit's id, or null
 */
export async function underWayVisitOfCaller(uow: Pick<UnitOfWork, 'actor' | 'transaction'>, cabinetId: string): Promise<string | null> {
  const rows = await sequelize.query<{ id: string }>(
    `SELECT v.id FROM visits v JOIN visit_technicians t ON t.visit_id = v.id AND t.user_id = :userId
      WHERE v.cabinet_id = :cabinetId AND v.state = 'under-way' ORDER BY v.started_at DESC NULLS LAST, v.id LIMIT 1`,
    { replacements: { userId: uow.actor.id, cabinetId }, type: QueryTypes.SELECT, transaction: uow.transaction },
  );
  return rows[0]?.id ?? null;
}

/**
 * Starts an unplanned visit at a cabinet: state under way, `unplanned`, the caller its
 * technician, the banks named (every bank in service of the cabinet when none are), planned
 * from `uow.now` for the visit's estimated minutes; with its audit entries and the outbox
 * message `visit.unplanned` ({ visitId, cabinetId }), in the caller's unit of work.
 *
 * @param uow - the caller (a technician, or an admin) and the instant
 * @param cabinetId - the cabinet the caller stands at
 * @param input - `bankIds`, optional
 * @throws AppError `not-found` (no such cabinet), `retired` (cabinet, its area or site retired),
 *   `forbidden` (not a technician or admin, or a technician not working at the cabinet's site),
 *   `conflict` (the caller already has a visit under way there), `validation-failed` naming
 *   `bankIds` (a bank not in service of this cabinet, or none in service)
 */
export async function startUnplannedVisit(uow: UnitOfWork, cabinetId: string, input: UnplannedVisitInput): Promise<Visit> {
  const { transaction, actor, now } = uow;
  if (!hasAnyRole(actor.roles, [VISIT_TECHNICIAN_ROLE, 'admin'])) {
    throw AppError.forbidden('Only technicians (and admins) start a visit at a cabinet.');
  }
  const cabinet = await Cabinet.findByPk(cabinetId, {
    include: [{ model: Area, as: 'area', include: [{ model: Site, as: 'site' }] }],
    transaction,
  });
  if (!cabinet) throw AppError.notFound('Cabinet');
  const site = cabinet.area?.site;
  if (cabinet.retiredAt || cabinet.status === 'retired' || cabinet.area?.retiredAt || !site || site.retiredAt) {
    throw new AppError('retired', `Cabinet ${cabinet.tag} is retired: no visit can be started there.`);
  }
  if (!(await worksAtSite(uow, site.id))) {
    throw AppError.forbidden(`You do not work at ${site.name}; ask an admin to add the site to your sites.`);
  }
  // one tap too many (or two tabs) must not start a second visit: hold others off, then look
  await sequelize.query(`SELECT pg_advisory_xact_lock(hashtextextended('unplanned-visit:' || :key, 0))`, {
    replacements: { key: `${actor.id}|${cabinet.id}` },
    transaction,
  });
  const open = await underWayVisitOfCaller(uow, cabinet.id);
  if (open) throw AppError.conflict(`You already have a visit under way at ${cabinet.tag}: open it from My visits.`);

  const inService = await Bank.findAll({
    where: { cabinetId: cabinet.id, status: 'in-service', retiredAt: null },
    attributes: ['id', 'position', 'baselineTauSeconds'],
    transaction,
  });
  const byId = new Map(inService.map((b) => [b.id, b]));
  const banks = input.bankIds ? input.bankIds.map((id) => byId.get(id)) : inService;
  if (banks.length === 0 || banks.some((b) => b === undefined)) {
    const message = inService.length === 0 ? `Cabinet ${cabinet.tag} has no bank in service to inspect.` : `Choose banks in service of cabinet ${cabinet.tag}.`;
    throw AppError.badRequest(`bankIds: ${message}`, [{ path: 'bankIds', message }]);
  }
  const chosen = banks as Bank[];
  const minutes = Math.max(1, estimateVisitMinutes(chosen, { markedWaitMinutes: cabinet.markedWaitMinutes }));

  const visit = await Visit.create(
    {
      cabinetId: cabinet.id,
      plannedStartAt: now,
      plannedEndAt: new Date(now.getTime() + minutes * MINUTE_MS),
      state: 'under-way',
      unplanned: true,
      startedAt: now,
      notes: '',
      overrides: [],
      createdById: actor.id,
      createdAt: now,
      updatedAt: now,
    },
    { transaction, silent: true },
  );
  const bankIds = chosen.map((b) => b.id);
  await VisitBank.bulkCreate(bankIds.map((bankId) => ({ visitId: visit.id, bankId })), { transaction });
  await VisitTechnician.bulkCreate([{ visitId: visit.id, userId: actor.id }], { transaction });
  await recordAuditBatch(uow, [
    {
      entityType: 'visit',
      entityId: visit.id,
      action: 'create',
      summary: `Started an unplanned visit to ${cabinet.tag} at the cabinet`,
      before: null,
      after: visitSnapshot(visit, [actor.id], bankIds),
    },
  ]);
  await enqueueOutboxMessage(uow, UNPLANNED_VISIT_TOPIC, { visitId: visit.id, cabinetId: cabinet.id });
  return getVisit(visit.id, null, transaction);
}
