/**
 * A small plant for the visit tests: one site (Europe/London) with an area, a cabinet of two
 * banks long due (installed 2020), a shutdown window on Saturday 2030-01-12 06:00–14:00 local
 * (06:00–14:00 UTC in winter), two technicians of the site, one technician elsewhere, and a
 * planner, a reliability engineer and an admin.
 */
import request from 'supertest';
import type { Express } from 'express';
import type { Role } from '../../../shared/constants/roles';
import { sequelize } from '../../../api/src/db/sequelize';
import { createBank } from '../../../api/src/services/banks';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { createActor, makeArea, makeBank, makeCabinet, makeDesign, makeSite } from '../../support/register';

export type Actor = Awaited<ReturnType<typeof createActor>>;

/** Saturday 2030-01-12, 06:00–14:00 Europe/London (GMT in winter, so the same in UTC). */
export const WINDOW = { startsAt: '2030-01-12T06:00:00.000Z', endsAt: '2030-01-12T14:00:00.000Z' };

/** A time on the window's day, `HH:MM` UTC. */
export const at = (hhmm: string, day = '2030-01-12') => `${day}T${hhmm}:00.000Z`;

export async function makePlant() {
  const planner = await createActor(['planner']);
  const admin = await createActor(['admin']);
  const reliability = await createActor(['reliability']);
  const ana = await createActor(['technician']);
  const ben = await createActor(['technician']);
  const outsider = await createActor(['technician']);
  const site = await makeSite(planner.actor, { name: 'Harbour Works' });
  const otherSite = await makeSite(planner.actor, { name: 'Upland Mill' });
  const area = await makeArea(planner.actor, site.id, 'Press hall');
  const otherArea = await makeArea(planner.actor, otherSite.id, 'Dryer line');
  const cabinet = await makeCabinet(planner.actor, area.id, { tag: 'HW-PRESS-VFD-001', markedWaitMinutes: 5 });
  const otherCabinet = await makeCabinet(planner.actor, otherArea.id, { tag: 'UM-DRY-VFD-007' });
  const design = await makeDesign(reliability.actor);
  const bankA = await makeBank(planner.actor, cabinet.id, design.id, 'DC1');
  const bankB = await makeBank(planner.actor, cabinet.id, design.id, 'DC2');
  const otherBank = await makeBank(planner.actor, otherCabinet.id, design.id, 'DC1');
  await addWindow(area.id, WINDOW.startsAt, WINDOW.endsAt);
  await addWindow(otherArea.id, WINDOW.startsAt, WINDOW.endsAt);
  await sequelize.query('INSERT INTO person_sites (user_id, site_id) VALUES ($1, $3), ($2, $3), ($4, $5)', {
    bind: [ana.user.id, ben.user.id, site.id, outsider.user.id, otherSite.id],
  });
  return { planner, admin, reliability, ana, ben, outsider, site, otherSite, area, otherArea, cabinet, otherCabinet, design, bankA, bankB, otherBank };
}
export type Plant = Awaited<ReturnType<typeof makePlant>>;

/** A shutdown window of the area, straight into its table. */
export async function addWindow(areaId: string, startsAt: string, endsAt: string, recurrence: string | null = null) {
  await sequelize.query(
    `INSERT INTO shutdown_windows (area_id, title, starts_at, ends_at, recurrence) VALUES ($1, 'Weekend shutdown', $2, $3, $4)`,
    { bind: [areaId, startsAt, endsAt, recurrence] },
  );
}

/** A bank installed on `installedOn`, so its due date is about a year later. */
export async function makeRecentBank(plant: Plant, installedOn: string, position: string) {
  const input = { cabinetId: plant.cabinet.id, bankDesignId: plant.design.id, position, serialNumber: '', installedOn, notes: '', confirmed: true };
  return withUnitOfWork(plant.planner.actor, (uow) => createBank(uow, input));
}

/** A visit body at the plant's cabinet inside the window, by default both banks and Ana. */
export function visitBody(plant: Plant, overrides: Record<string, unknown> = {}) {
  return {
    cabinetId: plant.cabinet.id,
    bankIds: [plant.bankA.id, plant.bankB.id],
    plannedStartAt: at('07:00'),
    plannedEndAt: at('09:00'),
    technicianIds: [plant.ana.user.id],
    notes: 'Bring the 1000 V meter.',
    ...overrides,
  };
}

/** Plans a visit over HTTP as the planner; fails the test when it is not created. */
export async function planVisit(app: Express, plant: Plant, overrides: Record<string, unknown> = {}) {
  const res = await request(app).post('/api/visits').set('Authorization', plant.planner.auth).send(visitBody(plant, overrides));
  if (res.status !== 201) throw new Error(`visit not planned: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as { id: string; version: number; state: string } & Record<string, unknown>;
}

/** Rows of a visit's state, version and audit entries, to show a refusal stored nothing. */
export async function visitFootprint(visitId: string) {
  const [rows] = await sequelize.query(
    `SELECT v.state, v.version, v.planned_start_at, v.planned_end_at, v.notes, v.overrides, v.state_reason,
            (SELECT count(*)::int FROM audit_entries e WHERE e.entity_id = v.id) AS audits,
            (SELECT array_agg(user_id ORDER BY user_id) FROM visit_technicians t WHERE t.visit_id = v.id) AS technicians,
            (SELECT array_agg(bank_id ORDER BY bank_id) FROM visit_banks b WHERE b.visit_id = v.id) AS banks
       FROM visits v WHERE v.id = $1`,
    { bind: [visitId] },
  );
  return rows[0] as Record<string, unknown> & { state: string; version: number; audits: number };
}

/** Counts of every visit table and the visits' audit entries. */
export async function visitTables() {
  const [rows] = await sequelize.query(
    `SELECT (SELECT count(*)::int FROM visits) AS visits, (SELECT count(*)::int FROM visit_banks) AS banks,
            (SELECT count(*)::int FROM visit_technicians) AS technicians,
            (SELECT count(*)::int FROM audit_entries WHERE entity_type = 'visit') AS audits`,
  );
  return rows[0] as { visits: number; banks: number; technicians: number; audits: number };
}

export type { Role };
