/**
 * The technicians' week: hours planned against hours available, the visits behind them, the
 * week on the site's clock, and a reassignment from it through the visit's PATCH.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import type { TechnicianLoadList } from '../../../shared/schemas/technician-load';
import { createActor, makeArea, makeCabinet, makeDesign, makeSite } from '../../support/register';
import { insertVisit, insertWindow, makeBankWithTau, makePerson } from './plan-window-fixtures';

/*
 * Site "Elbe Works" (Europe/Berlin). The week of Saturday 9 January 2027 runs from Monday
 * 4 January 00:00 CET (3 Jan 23:00Z) to Monday 11 January 00:00 CET (10 Jan 23:00Z).
 * Ana Brandt (30 h a week available):
 *   DR-1 Sat 06:00–07:10 (70 min) + DR-2 Sat 07:10–07:55 (45 min)        = 1.9166… h
 *   DR-3 Sun 23:00 – Mon 01:00 local: one hour inside the week            = 1 h
 *   DR-4 cancelled (2 h) and DR-5 missed (1 h): no time taken             = 0
 *   DR-6 the Monday before (outside the week)                             = 0
 *   → 2.9166… h, shown as 2.9 h.
 * Ben Okafor (37.5 h, the default): nothing planned → 0 h.
 * Carla Diaz works at another site only: not listed for Elbe Works.
 */
const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let ana: Awaited<ReturnType<typeof makePerson>>;
let ben: Awaited<ReturnType<typeof makePerson>>;
let siteId: string;
const visitIds: Record<string, string> = {};

const load = (query: string, auth = planner.auth) =>
  request(app).get(`/api/technician-load?${query}`).set('Authorization', auth);

beforeAll(async () => {
  planner = await createActor(['planner']);
  const site = await makeSite(planner.actor, { name: 'Elbe Works', code: 'ELB' });
  siteId = site.id;
  await sequelize.query(`UPDATE sites SET time_zone = 'Europe/Berlin' WHERE id = :id`, {
    replacements: { id: site.id },
  });
  const other = await makeSite(planner.actor, { name: 'Rhine Works', code: 'RHN' });
  const area = await makeArea(planner.actor, site.id, 'Press hall');
  const design = await makeDesign(planner.actor);
  ana = await makePerson(['technician'], 'Ana Brandt', [site.id], 30);
  ben = await makePerson(['technician'], 'Ben Okafor', [site.id]);
  await makePerson(['technician'], 'Carla Diaz', [other.id]);
  // a window over the whole week, so a replan inside it raises no outside-window warning
  await insertWindow({
    areaId: area.id,
    title: 'Week stop',
    startsAt: '2027-01-03T23:00:00Z',
    endsAt: '2027-01-10T23:00:00Z',
  });

  const visits: Array<[string, string, string, string]> = [
    ['DR-1', '2027-01-09T05:00:00Z', '2027-01-09T06:10:00Z', 'planned'],
    ['DR-2', '2027-01-09T06:10:00Z', '2027-01-09T06:55:00Z', 'planned'],
    ['DR-3', '2027-01-10T22:00:00Z', '2027-01-11T00:00:00Z', 'planned'],
    ['DR-4', '2027-01-06T08:00:00Z', '2027-01-06T10:00:00Z', 'cancelled'],
    ['DR-5', '2027-01-05T08:00:00Z', '2027-01-05T09:00:00Z', 'missed'],
    ['DR-6', '2026-12-28T08:00:00Z', '2026-12-28T09:00:00Z', 'planned'],
  ];
  for (const [tag, startsAt, endsAt, state] of visits) {
    const cabinet = await makeCabinet(planner.actor, area.id, { tag });
    const bankId = await makeBankWithTau(planner.actor, cabinet.id, design.id, 'DC1', 120);
    visitIds[tag] = await insertVisit({
      cabinetId: cabinet.id,
      bankIds: [bankId],
      technicianIds: [ana.id],
      startsAt,
      endsAt,
      state,
    });
  }
}, 120_000);

describe('GET /api/technician-load', () => {
  it('when the week of 9 Jan 2027 at Elbe Works is asked, then each technician’s hours planned and available are those worked out above', async () => {
    const res = await load(`weekOn=2027-01-09&siteId=${siteId}`);
    expect(res.status).toBe(200);
    const body = res.body as TechnicianLoadList;
    expect(body).toMatchObject({
      total: 2,
      weekStartOn: '2027-01-04',
      weekStartsAt: '2027-01-03T23:00:00.000Z',
      weekEndsAt: '2027-01-10T23:00:00.000Z',
      timeZone: 'Europe/Berlin',
    });
    expect(body.items.map((t) => [t.name, t.availableHours, t.plannedHours])).toEqual([
      ['Ana Brandt', 30, 2.9],
      ['Ben Okafor', 37.5, 0],
    ]);
    expect(body.items[0]!.visits.map((v) => [v.cabinetTag, v.state, v.hoursInWeek])).toEqual([
      ['DR-1', 'planned', 1.17],
      ['DR-2', 'planned', 0.75],
      ['DR-3', 'planned', 1],
    ]);
    expect(body.items[0]!.visits[0]).toMatchObject({
      id: visitIds['DR-1'],
      siteName: 'Elbe Works',
      areaName: 'Press hall',
      timeZone: 'Europe/Berlin',
      plannedStartAt: '2027-01-09T05:00:00.000Z',
      plannedEndAt: '2027-01-09T06:10:00.000Z',
      version: 1,
      technicianIds: [ana.id],
    });
  });

  it('when no site is named, then every technician is listed and the week is counted in UTC (or the zone asked)', async () => {
    const utc = (await load('weekOn=2027-01-09')).body as TechnicianLoadList;
    expect(utc.items.map((t) => t.name)).toEqual(
      expect.arrayContaining(['Ana Brandt', 'Ben Okafor', 'Carla Diaz']),
    );
    expect(utc.weekStartsAt).toBe('2027-01-04T00:00:00.000Z');
    // DR-3 ends at 00:00Z Monday: wholly inside the UTC week, so Ana has 1.9166 + 2 = 3.9 h
    expect(utc.items.find((t) => t.name === 'Ana Brandt')!.plannedHours).toBe(3.9);
    const chicago = (await load('weekOn=2027-01-09&timeZone=America/Chicago'))
      .body as TechnicianLoadList;
    expect(chicago.weekStartsAt).toBe('2027-01-04T06:00:00.000Z');
  });

  it('when the week, site or zone is not valid, then 400 naming the field', async () => {
    for (const [query, field] of [
      ['weekOn=2027-02-30', 'weekOn'],
      ['', 'weekOn'],
      ['weekOn=2027-01-09&siteId=nope', 'siteId'],
      ['weekOn=2027-01-09&siteId=00000000-0000-4000-8000-000000000000', 'siteId'],
      ['weekOn=2027-01-09&timeZone=Mars/Olympus', 'timeZone'],
    ] as const) {
      const res = await load(query);
      expect(res.status, query).toBe(400);
      expect(
        res.body.error.issues.map((i: { path: string }) => i.path),
        query,
      ).toContain(field);
    }
  });

  it('when a technician asks, then 403', async () => {
    expect((await load('weekOn=2027-01-09', ana.auth)).status).toBe(403);
  });

  it('when a visit is reassigned from the week view (PATCH with a reason), then it moves to the other technician’s hours', async () => {
    const before = (await load(`weekOn=2027-01-09&siteId=${siteId}`)).body as TechnicianLoadList;
    const dr2 = before.items[0]!.visits.find((v) => v.cabinetTag === 'DR-2')!;
    const res = await request(app)
      .patch(`/api/visits/${dr2.id}`)
      .set('Authorization', planner.auth)
      .send({ version: dr2.version, reason: 'Ana is on the DR-1 run', technicianIds: [ben.id] });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const after = (await load(`weekOn=2027-01-09&siteId=${siteId}`)).body as TechnicianLoadList;
    expect(
      after.items.map((t) => [t.name, t.plannedHours, t.visits.map((v) => v.cabinetTag)]),
    ).toEqual([
      ['Ana Brandt', 2.2, ['DR-1', 'DR-3']],
      ['Ben Okafor', 0.8, ['DR-2']],
    ]);
  });
});
