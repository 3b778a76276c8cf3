/**
 * Plan a shutdown window: the proposal against a hand-computed case seeded in the register,
 * which technicians it uses, what it leaves out and why, that it stores nothing, and its
 * confirmation through the visit batch in one step.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import type { WindowProposal } from '../../../shared/schemas/plan-window';
import { assertCorpusHolds } from '../../support/hostile-bodies';
import { createActor, makeArea, makeCabinet, makeDesign, makeSite } from '../../support/register';
import {
  insertVisit,
  insertWindow,
  makeBankWithTau,
  makePerson,
  visitRowCounts,
} from './plan-window-fixtures';

/*
 * The hand-computed case, seeded.
 *
 * Site "Elbe Works" (Europe/Berlin), area "Press hall". Shutdown window "Saturday stop": every
 * Saturday 06:00–08:00 local from 2 January 2027, 4 times. The occurrence planned: Saturday 9
 * January 2027, 06:00–08:00 CET = 05:00Z–07:00Z (120 min). Banks due on or before 9 Jan 2027
 * are planned; the banks installed in 2020 with no visit since are long overdue.
 *
 * Per bank: 15 min setup + 5 τ (baseline, set by hand) + the cabinet's marked wait (15 when unknown):
 *
 *   cabinet  banks      τ       5 τ      marked wait   per bank               visit
 *   DR-101   DC1, DC2   120 s   10 min   5 min         15 + 10 + 5  = 30 min   60 min
 *   DR-102   DC1        240 s   20 min   10 min        15 + 20 + 10 = 45 min   45 min
 *   DR-103   DC1         60 s    5 min   none → 15     15 +  5 + 15 = 35 min   35 min
 *   DR-104   DC1, DC2   180 s   15 min   5 min         15 + 15 + 5  = 35 min   70 min
 *   DR-105   DC1        300 s   25 min   10 min        15 + 25 + 10 = 50 min   50 min
 * Not planned:
 *   DR-106   DC1 installed 20 Nov 2026: due 20 Nov 2027 (yearly), after the window: not listed.
 *   DR-107   DC1 overdue, but already in a planned visit on Sat 6 Feb 2027 06:00: left out, saying so.
 *   DR-900   in another area (Paint shop): not this window's.
 *
 * Technicians (technician role): Ana Brandt, Ben Okafor and Dmitri Falk work at Elbe Works;
 * Dmitri already has a visit 06:00–07:30 local that day (planned around: he is free 07:30–08:00);
 * Carla Diaz works at another site only. Pool = Ana, Ben, Dmitri (by name; ties go in that order).
 *
 * Longest first onto the technician who can start it soonest, ending by 08:00:
 *   DR-104 (70) → Ana 06:00–07:10 (Ben could too, Ana comes first; Dmitri from 07:30 would end 08:40)
 *   DR-101 (60) → Ben 06:00–07:00 (Ana from 07:10 and Dmitri from 07:30 would pass 08:00)
 *   DR-105 (50) → Ben 07:00–07:50 (Ana could start 07:10, later; Dmitri would end 08:20)
 *   DR-102 (45) → Ana 07:10–07:55 (Ben from 07:50 and Dmitri from 07:30 would pass 08:00)
 *   DR-103 (35) → nobody: Dmitri is free soonest (07:30) and would end at 08:05: left out.
 * In UTC: DR-104 05:00–06:10, DR-101 05:00–06:00, DR-105 06:00–06:50, DR-102 06:10–06:55.
 */
const app = createApp();
const OCCURRENCE = '2027-01-09T05:00:00.000Z';

let planner: Awaited<ReturnType<typeof createActor>>;
let ana: Awaited<ReturnType<typeof makePerson>>;
let ben: Awaited<ReturnType<typeof makePerson>>;
let carla: Awaited<ReturnType<typeof makePerson>>;
let dmitri: Awaited<ReturnType<typeof makePerson>>;
let windowId: string;
let areaId: string;
const cabinetIds: Record<string, string> = {};
const bankIds: Record<string, string> = {};

const propose = (id: string, body: object, auth = planner.auth) =>
  request(app).post(`/api/shutdown-windows/${id}/proposal`).set('Authorization', auth).send(body);

beforeAll(async () => {
  planner = await createActor(['planner']);
  const site = await makeSite(planner.actor, { name: 'Elbe Works', code: 'ELB' });
  await makeSite(planner.actor, { name: 'Rhine Works', code: 'RHN' }).then(async (other) => {
    carla = await makePerson(['technician'], 'Carla Diaz', [other.id]);
  });
  await import('../../../api/src/db/sequelize').then(({ sequelize }) =>
    sequelize.query(`UPDATE sites SET time_zone = 'Europe/Berlin' WHERE id = :id`, {
      replacements: { id: site.id },
    }),
  );
  const area = await makeArea(planner.actor, site.id, 'Press hall');
  areaId = area.id;
  const paint = await makeArea(planner.actor, site.id, 'Paint shop');
  const design = await makeDesign(planner.actor);

  const cabinets: Array<[string, number | null, number, string[], string?]> = [
    ['DR-101', 5, 120, ['DC1', 'DC2']],
    ['DR-102', 10, 240, ['DC1']],
    ['DR-103', null, 60, ['DC1']],
    ['DR-104', 5, 180, ['DC1', 'DC2']],
    ['DR-105', 10, 300, ['DC1']],
    ['DR-106', 5, 120, ['DC1'], '2026-11-20'],
    ['DR-107', 5, 120, ['DC1']],
  ];
  for (const [tag, markedWaitMinutes, tau, positions, installedOn] of cabinets) {
    const cabinet = await makeCabinet(planner.actor, area.id, { tag, markedWaitMinutes });
    cabinetIds[tag] = cabinet.id;
    for (const position of positions) {
      bankIds[`${tag} ${position}`] = await makeBankWithTau(
        planner.actor,
        cabinet.id,
        design.id,
        position,
        tau,
        installedOn,
      );
    }
  }
  const elsewhere = await makeCabinet(planner.actor, paint.id, { tag: 'DR-900' });
  cabinetIds['DR-900'] = elsewhere.id;
  bankIds['DR-900 DC1'] = await makeBankWithTau(planner.actor, elsewhere.id, design.id, 'DC1', 120);

  ana = await makePerson(['technician'], 'Ana Brandt', [site.id]);
  ben = await makePerson(['technician'], 'Ben Okafor', [site.id]);
  dmitri = await makePerson(['technician'], 'Dmitri Falk', [site.id]);
  await makePerson(['planner'], 'Erik Planner', [site.id]);

  windowId = await insertWindow({
    areaId: area.id,
    title: 'Saturday stop',
    startsAt: '2027-01-02T05:00:00Z',
    endsAt: '2027-01-02T07:00:00Z',
    recurrence: 'FREQ=WEEKLY;COUNT=4',
  });
  // Dmitri's visit in the paint shop during the occurrence; DR-107 DC1 planned for February
  await insertVisit({
    cabinetId: elsewhere.id,
    bankIds: [bankIds['DR-900 DC1']!],
    technicianIds: [dmitri.id],
    startsAt: '2027-01-09T05:00:00Z',
    endsAt: '2027-01-09T06:30:00Z',
  });
  await insertVisit({
    cabinetId: cabinetIds['DR-107']!,
    bankIds: [bankIds['DR-107 DC1']!],
    technicianIds: [carla.id],
    startsAt: '2027-02-06T05:00:00Z',
    endsAt: '2027-02-06T06:00:00Z',
  });
}, 120_000);

describe('POST /api/shutdown-windows/:windowId/proposal', () => {
  it('when the hand-computed case is proposed, then each visit goes to the technician and times worked out above', async () => {
    const res = await propose(windowId, { occurrenceStartsAt: OCCURRENCE });
    expect(res.status).toBe(200);
    const proposal = res.body as WindowProposal;
    expect(proposal.window).toMatchObject({
      id: windowId,
      title: 'Saturday stop',
      areaName: 'Press hall',
      siteName: 'Elbe Works',
      timeZone: 'Europe/Berlin',
      startsAt: '2027-01-09T05:00:00.000Z',
      endsAt: '2027-01-09T07:00:00.000Z',
    });
    expect(proposal.dueBy).toBe('2027-01-09');
    expect(
      proposal.visits.map((v) => [
        v.cabinetTag,
        v.technicians.map((t) => t.name),
        v.plannedStartAt,
        v.plannedEndAt,
        v.estimatedMinutes,
      ]),
    ).toEqual([
      ['DR-104', ['Ana Brandt'], '2027-01-09T05:00:00.000Z', '2027-01-09T06:10:00.000Z', 70],
      ['DR-101', ['Ben Okafor'], '2027-01-09T05:00:00.000Z', '2027-01-09T06:00:00.000Z', 60],
      ['DR-105', ['Ben Okafor'], '2027-01-09T06:00:00.000Z', '2027-01-09T06:50:00.000Z', 50],
      ['DR-102', ['Ana Brandt'], '2027-01-09T06:10:00.000Z', '2027-01-09T06:55:00.000Z', 45],
    ]);
    const dr104 = proposal.visits[0]!;
    expect(dr104).toMatchObject({
      cabinetId: cabinetIds['DR-104'],
      bankIds: [bankIds['DR-104 DC1'], bankIds['DR-104 DC2']],
      technicianIds: [ana.id],
      markedWaitMinutes: 5,
      notes: 'Shutdown window: Saturday stop',
    });
    expect(
      dr104.banks.map((b) => [b.position, b.baselineTauSeconds, b.estimatedMinutes, b.dueOn]),
    ).toEqual([
      ['DC1', 180, 35, '2021-01-14'],
      ['DC2', 180, 35, '2021-01-14'],
    ]);
  });

  it('when the hand-computed case is proposed, then DR-103 is left out for the window’s end and DR-107 for its planned visit, each saying why', async () => {
    const proposal = (await propose(windowId, { occurrenceStartsAt: OCCURRENCE }))
      .body as WindowProposal;
    expect(proposal.leftOut).toEqual([
      {
        bankId: bankIds['DR-103 DC1'],
        cabinetId: cabinetIds['DR-103'],
        cabinetTag: 'DR-103',
        position: 'DC1',
        dueOn: '2021-01-14',
        kind: 'past-window-end',
        reason:
          'Needs about 35 min; Dmitri Falk, free soonest (from 07:30), would finish at 08:05, after the window ends at 08:00 (Europe/Berlin).',
      },
      {
        bankId: bankIds['DR-107 DC1'],
        cabinetId: cabinetIds['DR-107'],
        cabinetTag: 'DR-107',
        position: 'DC1',
        dueOn: '2021-01-14',
        kind: 'already-planned',
        reason: 'Already in a planned visit on Sat 6 Feb 2027, 06:00 (Europe/Berlin).',
      },
    ]);
    const mentioned = [
      ...proposal.visits.flatMap((v) => v.bankIds),
      ...proposal.leftOut.map((b) => b.bankId),
    ];
    expect(mentioned).not.toContain(bankIds['DR-106 DC1']);
    expect(mentioned).not.toContain(bankIds['DR-900 DC1']);
  });

  it('when a technician of the site already has a visit during the occurrence, then it is planned around and said; one of another site is not offered', async () => {
    const proposal = (await propose(windowId, { occurrenceStartsAt: OCCURRENCE }))
      .body as WindowProposal;
    expect(proposal.technicianPool).toBe('site');
    expect(proposal.technicians).toEqual([
      { id: ana.id, name: 'Ana Brandt', busy: [] },
      { id: ben.id, name: 'Ben Okafor', busy: [] },
      {
        id: dmitri.id,
        name: 'Dmitri Falk',
        busy: [
          {
            startsAt: '2027-01-09T05:00:00.000Z',
            endsAt: '2027-01-09T06:30:00.000Z',
            cabinetTag: 'DR-900',
          },
        ],
      },
    ]);
    expect(proposal.busyTechnicians).toEqual([
      {
        id: dmitri.id,
        name: 'Dmitri Falk',
        reason:
          'Already has DR-900 06:00–07:30 (Europe/Berlin) during this window: planned around.',
      },
    ]);
  });

  it('when the planner chooses the technicians, then the visits are split across them alone', async () => {
    const res = await propose(windowId, {
      occurrenceStartsAt: OCCURRENCE,
      technicianIds: [carla.id],
    });
    expect(res.status).toBe(200);
    const proposal = res.body as WindowProposal;
    expect(proposal.technicianPool).toBe('chosen');
    expect(new Set(proposal.visits.flatMap((v) => v.technicianIds))).toEqual(new Set([carla.id]));
    // one person, 120 min: DR-104 (70) 06:00–07:10, DR-101 (60) would pass 08:00: DC1 (30) fits to 07:40, DC2 is left out
    expect(
      proposal.visits.map((v) => [v.cabinetTag, v.banks.map((b) => b.position), v.plannedEndAt]),
    ).toEqual([
      ['DR-104', ['DC1', 'DC2'], '2027-01-09T06:10:00.000Z'],
      ['DR-101', ['DC1'], '2027-01-09T06:40:00.000Z'],
    ]);
  });

  it('when a chosen person is not an active technician, then it answers 400 naming that entry', async () => {
    const res = await propose(windowId, {
      occurrenceStartsAt: OCCURRENCE,
      technicianIds: [ana.id, planner.user.id],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.issues).toEqual([
      {
        path: 'technicianIds.1',
        message: 'Choose an active person who holds the technician role.',
      },
    ]);
  });

  it('when nobody is attached to the window’s site, then every technician free during the occurrence is offered', async () => {
    const lonely = await makeSite(planner.actor, { name: 'Oder Works', code: 'ODR' });
    const hall = await makeArea(planner.actor, lonely.id, 'Hall 1');
    const id = await insertWindow({
      areaId: hall.id,
      title: 'One-off stop',
      startsAt: OCCURRENCE,
      endsAt: '2027-01-09T07:00:00Z',
    });
    const proposal = (await propose(id, { occurrenceStartsAt: OCCURRENCE })).body as WindowProposal;
    expect(proposal.technicianPool).toBe('all');
    const offered = proposal.technicians.map((t) => t.name);
    expect(offered).toEqual(
      expect.arrayContaining(['Ana Brandt', 'Ben Okafor', 'Carla Diaz', 'Dmitri Falk']),
    );
    expect(offered).not.toContain('Erik Planner');
    expect(proposal.visits).toEqual([]);
  });

  it('when no occurrence of the window starts at the time asked, then it answers 400 naming occurrenceStartsAt', async () => {
    const res = await propose(windowId, { occurrenceStartsAt: '2027-01-09T06:00:00Z' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0]).toMatchObject({ path: 'occurrenceStartsAt' });
    expect(res.body.error.message).toContain(
      'Saturday stop has no occurrence starting at Sat 9 Jan 2027, 07:00 (Europe/Berlin)',
    );
    // after its 4 occurrences the window does not repeat
    expect((await propose(windowId, { occurrenceStartsAt: '2027-01-30T05:00:00Z' })).status).toBe(
      400,
    );
  });

  it('when the body has no occurrence, then it answers 400 naming the field', async () => {
    const res = await propose(windowId, {});
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain(
      'occurrenceStartsAt',
    );
  });

  it('when the window does not exist or is retired, then 404 and 409', async () => {
    expect(
      (await propose('00000000-0000-4000-8000-000000000000', { occurrenceStartsAt: OCCURRENCE }))
        .status,
    ).toBe(404);
    expect((await propose('not-an-id', { occurrenceStartsAt: OCCURRENCE })).status).toBe(404);
    const retired = await insertWindow({
      areaId,
      title: 'Old stop',
      startsAt: OCCURRENCE,
      endsAt: '2027-01-09T07:00:00Z',
      retired: true,
    });
    const res = await propose(retired, { occurrenceStartsAt: OCCURRENCE });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('retired');
  });

  it('when a technician or a reliability engineer asks, then 403', async () => {
    expect((await propose(windowId, { occurrenceStartsAt: OCCURRENCE }, ana.auth)).status).toBe(
      403,
    );
    const reliability = await createActor(['reliability']);
    expect(
      (await propose(windowId, { occurrenceStartsAt: OCCURRENCE }, reliability.auth)).status,
    ).toBe(403);
  });

  it('when a proposal is made, then nothing is stored', async () => {
    const before = await visitRowCounts();
    expect((await propose(windowId, { occurrenceStartsAt: OCCURRENCE })).status).toBe(200);
    expect(await visitRowCounts()).toEqual(before);
  });

  it('when hostile bodies are sent, then it never answers 5xx and stores nothing', async () => {
    const tally = await assertCorpusHolds(
      app,
      {
        method: 'post',
        path: `/api/shutdown-windows/${windowId}/proposal`,
        headers: { Authorization: planner.auth },
      },
      { occurrenceStartsAt: OCCURRENCE, technicianIds: [ana.id, ben.id] },
      300,
    );
    expect(tally[200]).toBeGreaterThan(0);
    expect(tally[400]).toBeGreaterThan(0);
  }, 240_000);
});

describe('confirming a proposal through POST /api/visits/batch', () => {
  it('when the proposal’s visits are confirmed, then all are planned in one step and a new proposal finds their banks planned', async () => {
    const proposal = (await propose(windowId, { occurrenceStartsAt: OCCURRENCE }))
      .body as WindowProposal;
    const visits = proposal.visits.map(
      ({ cabinetId, bankIds: ids, plannedStartAt, plannedEndAt, technicianIds, notes }) => ({
        cabinetId,
        bankIds: ids,
        plannedStartAt,
        plannedEndAt,
        technicianIds,
        notes,
      }),
    );
    const before = await visitRowCounts();
    const res = await request(app)
      .post('/api/visits/batch')
      .set('Authorization', planner.auth)
      .send({ visits });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.items).toHaveLength(4);
    expect(await visitRowCounts()).toEqual({
      visits: before.visits + 4,
      banks: before.banks + 6,
      technicians: before.technicians + 4,
    });

    const again = (await propose(windowId, { occurrenceStartsAt: OCCURRENCE }))
      .body as WindowProposal;
    // Ana and Ben now have their visits in this occurrence; nobody has 35 min left for DR-103
    expect(again.busyTechnicians.map((t) => t.name)).toEqual([
      'Ana Brandt',
      'Ben Okafor',
      'Dmitri Falk',
    ]);
    expect(again.visits).toEqual([]);
    expect(
      again.leftOut
        .filter((b) => b.kind === 'already-planned')
        .map((b) => `${b.cabinetTag} ${b.position}`),
    ).toEqual([
      'DR-101 DC1',
      'DR-101 DC2',
      'DR-102 DC1',
      'DR-104 DC1',
      'DR-104 DC2',
      'DR-105 DC1',
      'DR-107 DC1',
    ]);
  });
});
