/**
 * Visits stored directly (as the demo seed and the scheduled jobs find them), for tests of what
 * acts on visits later: the missed-visit check, the calendar feed. A site of its own per call,
 * with the time zone asked for.
 */
import type { AuthUser } from '../../api/src/types/express';
import { sequelize } from '../../api/src/db/sequelize';
import { createSite } from '../../api/src/services/sites';
import { withUnitOfWork } from '../../api/src/services/unit-of-work';
import { makeArea, makeBank, makeCabinet, makeDesign } from './register';

let serial = 0;

/** A site in `timeZone` with one area, one cabinet and two banks. */
export async function makePlace(actor: AuthUser, timeZone = 'Europe/Berlin') {
  serial += 1;
  const code = `PV${serial}`;
  const site = await withUnitOfWork(actor, (uow) =>
    createSite(uow, { name: `Planner Works ${code}`, code, address: '', timeZone }),
  );
  const area = await makeArea(actor, site.id, `Press hall ${serial}`);
  const cabinet = await makeCabinet(actor, area.id);
  const design = await makeDesign(actor);
  const banks = [
    await makeBank(actor, cabinet.id, design.id, 'DC1'),
    await makeBank(actor, cabinet.id, design.id, 'DC2'),
  ];
  return { site, area, cabinet, design, banks };
}

export interface StoredVisitInput {
  cabinetId: string;
  bankIds: string[];
  technicianIds: string[];
  plannedStartAt: Date;
  plannedEndAt: Date;
  state?: string;
  notes?: string;
}

/** Stores a visit with its banks and technicians, as a planner's earlier save left it. */
export async function storeVisit(
  input: StoredVisitInput,
): Promise<{ id: string; version: number }> {
  const [rows] = (await sequelize.query(
    `INSERT INTO visits (cabinet_id, planned_start_at, planned_end_at, state, notes, created_at, updated_at)
     VALUES (:cabinetId, :start, :end, :state, :notes, now(), now()) RETURNING id, version`,
    {
      replacements: {
        cabinetId: input.cabinetId,
        start: input.plannedStartAt.toISOString(),
        end: input.plannedEndAt.toISOString(),
        state: input.state ?? 'planned',
        notes: input.notes ?? '',
      },
    },
  )) as [Array<{ id: string; version: number }>, unknown];
  const visit = rows[0]!;
  for (const bankId of input.bankIds) {
    await sequelize.query(
      'INSERT INTO visit_banks (visit_id, bank_id) VALUES (:visitId, :bankId)',
      {
        replacements: { visitId: visit.id, bankId },
      },
    );
  }
  for (const userId of input.technicianIds) {
    await sequelize.query(
      'INSERT INTO visit_technicians (visit_id, user_id) VALUES (:visitId, :userId)',
      {
        replacements: { visitId: visit.id, userId },
      },
    );
  }
  return visit;
}

/**
 * A visit under way to every bank of a place, for one technician: planned for four hours from
 * an hour ago.
 */
export async function storeVisitUnderWay(
  place: { cabinet: { id: string }; banks: Array<{ id: string }> },
  technicianId: string,
): Promise<{ id: string; version: number }> {
  const start = new Date(Date.now() - 3_600_000);
  return storeVisit({
    cabinetId: place.cabinet.id,
    bankIds: place.banks.map((b) => b.id),
    technicianIds: [technicianId],
    plannedStartAt: start,
    plannedEndAt: new Date(start.getTime() + 4 * 3_600_000),
    state: 'under-way',
  });
}

/** A visit's state, missed_at and version as stored. */
export async function storedVisit(id: string) {
  const [rows] = (await sequelize.query(
    'SELECT state, missed_at, version FROM visits WHERE id = :id',
    { replacements: { id } },
  )) as [Array<{ state: string; missed_at: Date | null; version: number }>, unknown];
  return rows[0]!;
}

/** The audit entries of one visit, oldest first. */
export async function visitAuditEntries(id: string) {
  const [rows] = (await sequelize.query(
    `SELECT action, actor_id, actor_name, summary, before, after, at FROM audit_entries
      WHERE entity_type = 'visit' AND entity_id = :id ORDER BY at, id`,
    { replacements: { id } },
  )) as [
    Array<{
      action: string;
      actor_id: string | null;
      actor_name: string | null;
      summary: string;
      before: Record<string, unknown> | null;
      after: Record<string, unknown> | null;
      at: Date;
    }>,
    unknown,
  ];
  return rows;
}
