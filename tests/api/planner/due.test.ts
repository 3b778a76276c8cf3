/**
 * The Due list (GET /api/due and the due service): roles, a technician's sites, filters,
 * sorting, paging, bucket counts, planned and missed visits, and the SQL's due dates checked
 * against the domain rule (shared/domain/due.ts) on varied banks.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { createBank } from '../../../api/src/services/banks';
import { dueDatesOfBanks, listDueBanks } from '../../../api/src/services/due';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { calendarDateInZone, dueStatusOf } from '../../../shared/domain/due';
import {
  dueListQuerySchema,
  type DueBank,
  type DueListQueryInput,
} from '../../../shared/schemas/due';
import { createActor, makeArea, makeCabinet, makeDesign, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
});

let serial = 0;

/** A bank in service made at `baselineAt` (its baseline's set instant). */
async function makeBankAt(
  cabinetId: string,
  bankDesignId: string,
  installedOn: string | null,
  baselineAt: Date,
) {
  serial += 1;
  const input = {
    cabinetId,
    bankDesignId,
    position: `DC${serial}`,
    serialNumber: '',
    installedOn,
    notes: '',
  };
  return withUnitOfWork(planner.actor, (uow) => createBank(uow, input), { now: baselineAt });
}

type VisitState = 'planned' | 'under-way' | 'logged' | 'reviewed' | 'missed' | 'cancelled';

/** A visit row written straight to the tables (the visit services have their own tests). */
async function insertVisit(
  cabinetId: string,
  bankIds: string[],
  state: VisitState,
  plannedStartAt: string,
  extra: { loggedAt?: string; missedAt?: string } = {},
): Promise<string> {
  const start = new Date(plannedStartAt);
  const end = new Date(start.getTime() + 2 * 3_600_000);
  const [rows] = await sequelize.query(
    `INSERT INTO visits (cabinet_id, planned_start_at, planned_end_at, state, logged_at, missed_at)
     VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    {
      bind: [
        cabinetId,
        start.toISOString(),
        end.toISOString(),
        state,
        extra.loggedAt ?? null,
        extra.missedAt ?? null,
      ],
    },
  );
  const id = (rows as Array<{ id: string }>)[0]!.id;
  for (const bankId of bankIds) {
    await sequelize.query('INSERT INTO visit_banks (visit_id, bank_id) VALUES ($1, $2)', {
      bind: [id, bankId],
    });
  }
  return id;
}

function query(input: DueListQueryInput) {
  return dueListQuerySchema.parse({ pageSize: '100', ...input });
}

/** A small fleet of its own: one site in `timeZone`, one area, one cabinet, one design of `intervalDays`. */
async function fleet(
  timeZone = 'Europe/London',
  intervalDays = 365,
  criticality: 'low' | 'medium' | 'high' | 'critical' = 'medium',
) {
  const site = await makeSite(planner.actor, { timeZone } as never);
  const area = await makeArea(planner.actor, site.id);
  const cabinet = await makeCabinet(planner.actor, area.id, { criticality });
  const design = await makeDesign(planner.actor, { inspectionIntervalDays: intervalDays });
  return { site, area, cabinet, design };
}

describe('the due dates in SQL and the domain rule', () => {
  it('when banks of varied designs, dates, visits and time zones are judged at varied instants, then the SQL gives the domain’s due date, start and bucket for every one', async () => {
    const zones = ['Europe/Berlin', 'America/Chicago', 'Pacific/Auckland', 'UTC'];
    const intervals = [30, 90, 182, 365, 400, 730];
    const installs = [null, '2025-01-31', '2025-11-30', '2026-02-28'];
    const bankIds: string[] = [];
    interface BankFacts {
      timeZone: string;
      intervalDays: number;
      installedOn: string | null;
      baselineAt: Date;
      loggedAts: string[];
    }
    const facts = new Map<string, BankFacts>();
    /** The local date of the latest visit logged by `asOf` (a visit logged after it has not happened yet), and the domain's due status then. */
    const domainDueAt = (f: BankFacts, asOf: Date) => {
      const past = f.loggedAts.filter((at) => new Date(at) <= asOf).sort();
      const lastInspectedOn = past.length ? calendarDateInZone(past[past.length - 1]!, f.timeZone) : null;
      const expected = dueStatusOf(
        {
          lastInspectedOn,
          installedOn: f.installedOn,
          baselineSetOn: calendarDateInZone(f.baselineAt, f.timeZone),
          inspectionIntervalDays: f.intervalDays,
        },
        asOf,
        f.timeZone,
      );
      return { lastInspectedOn, expected };
    };
    let k = 0;
    for (const zone of zones) {
      const { cabinet } = await fleet(zone);
      for (const intervalDays of intervals) {
        const design = await makeDesign(planner.actor, { inspectionIntervalDays: intervalDays });
        k += 1;
        const installedOn = installs[k % installs.length]!;
        // a baseline set late in the UTC evening: the local date differs east of Greenwich
        const baselineAt = new Date(Date.UTC(2025, (k * 5) % 12, 1 + (k % 27), 23, 30));
        const bank = await makeBankAt(cabinet.id, design.id, installedOn, baselineAt);
        bankIds.push(bank.id);
        const loggedAts: string[] = [];
        if (k % 3 !== 0) {
          // logged near midnight UTC, some months ago, and an older logged visit that must not count
          const loggedAt = new Date(
            Date.UTC(2026, (k * 7) % 11, 1 + ((k * 3) % 28), 22 + (k % 3), 45),
          ).toISOString();
          await insertVisit(cabinet.id, [bank.id], k % 2 ? 'logged' : 'reviewed', loggedAt, {
            loggedAt,
          });
          await insertVisit(cabinet.id, [bank.id], 'logged', '2024-06-01T08:00:00Z', {
            loggedAt: '2024-06-01T10:00:00Z',
          });
          loggedAts.push(loggedAt, '2024-06-01T10:00:00Z');
        }
        // visits that never count as an inspection
        await insertVisit(cabinet.id, [bank.id], 'missed', '2026-10-01T08:00:00Z', {
          missedAt: '2026-10-02T08:00:00Z',
        });
        await insertVisit(cabinet.id, [bank.id], 'cancelled', '2026-10-05T08:00:00Z');
        facts.set(bank.id, { timeZone: zone, intervalDays, installedOn, baselineAt, loggedAts });
      }
    }
    // month ends, a leap day, midnight at the sites, the turn of a year
    const instants = [
      '2026-11-30T23:30:00Z',
      '2026-12-31T11:00:00Z',
      '2027-02-28T12:00:00Z',
      '2028-02-29T10:59:00Z',
      '2026-06-15T00:00:00Z',
    ];
    let compared = 0;
    for (const at of instants) {
      const asOf = new Date(at);
      const dates = await dueDatesOfBanks(bankIds, asOf);
      expect(dates.size).toBe(bankIds.length);
      for (const id of bankIds) {
        const { expected } = domainDueAt(facts.get(id)!, asOf);
        const got = dates.get(id)!;
        expect({ id, dueOn: got.dueOn, bucket: got.bucket, todayOn: got.todayOn }).toEqual({
          id,
          dueOn: expected.dueOn,
          bucket: expected.bucket,
          todayOn: expected.todayOn,
        });
        compared += 1;
      }
      // the list shows the same, with start and basis
      const siteIds = [
        ...new Set(
          (await listDueBanks(query({ pageSize: '100' }), asOf)).items
            .filter((b) => bankIds.includes(b.bankId))
            .map((b) => b.siteId),
        ),
      ];
      expect(siteIds).toHaveLength(zones.length);
    }
    expect(compared).toBe(instants.length * zones.length * intervals.length);

    const asOf = new Date('2026-12-31T11:00:00Z');
    const listed = (await listDueBanks(query({ pageSize: '100' }), asOf)).items.filter((b) =>
      bankIds.includes(b.bankId),
    );
    expect(listed).toHaveLength(bankIds.length);
    for (const bank of listed) {
      const f = facts.get(bank.bankId)!;
      const { lastInspectedOn, expected } = domainDueAt(f, asOf);
      expect(bank).toMatchObject({
        dueOn: expected.dueOn,
        startOn: expected.startOn,
        startKind: expected.startKind,
        basis: expected.basis,
        bucket: expected.bucket,
        lastInspectedOn,
        timeZone: f.timeZone,
        inspectionIntervalDays: f.intervalDays,
      });
    }
  });
});

describe('one bank’s due date', () => {
  it('when a bank has no visit, then it is due a design interval after its install date; a logged visit moves it on', async () => {
    const { cabinet, design, site } = await fleet('Europe/Berlin', 182);
    const bank = await makeBankAt(
      cabinet.id,
      design.id,
      '2026-01-10',
      new Date('2026-01-12T09:00:00Z'),
    );
    const asOf = new Date('2026-07-01T10:00:00Z');
    let [row] = (await listDueBanks(query({ siteId: site.id }), asOf)).items;
    expect(row).toMatchObject({
      bankId: bank.id,
      dueOn: '2026-07-11',
      startKind: 'installed',
      basis: 'design-interval',
      bucket: 'this-month',
      daysUntilDue: 10,
    });
    // logged at 23:30 UTC on 1 July: 2 July in Berlin
    await insertVisit(cabinet.id, [bank.id], 'logged', '2026-07-01T20:00:00Z', {
      loggedAt: '2026-07-01T23:30:00Z',
    });
    [row] = (
      await listDueBanks(query({ siteId: site.id }), new Date('2026-07-02T08:00:00Z'))
    ).items;
    expect(row).toMatchObject({
      lastInspectedOn: '2026-07-02',
      startKind: 'last-visit',
      dueOn: '2026-12-31',
      bucket: 'later',
    });
  });

  it('when a design allows two years, then the bank is still due within a year (at least yearly: NFPA 70B, common practice)', async () => {
    const { cabinet, design, site } = await fleet('UTC', 730);
    await makeBankAt(cabinet.id, design.id, null, new Date('2026-03-01T12:00:00Z'));
    const [row] = (await listDueBanks(query({ siteId: site.id }), new Date('2026-12-01T00:00:00Z')))
      .items;
    expect(row).toMatchObject({
      startKind: 'baseline',
      baselineSetOn: '2026-03-01',
      dueOn: '2027-03-01',
      basis: 'yearly',
      bucket: 'next-quarter',
    });
  });
});

describe('planned and missed visits in the list', () => {
  it('when a planned visit covers a bank, then the list names it; a missed last visit is named too; cancelled ones are not', async () => {
    const { cabinet, design, site } = await fleet('Europe/London', 365);
    const a = await makeBankAt(
      cabinet.id,
      design.id,
      '2025-01-01',
      new Date('2025-01-02T09:00:00Z'),
    );
    const b = await makeBankAt(
      cabinet.id,
      design.id,
      '2025-01-01',
      new Date('2025-01-02T09:00:00Z'),
    );
    const c = await makeBankAt(
      cabinet.id,
      design.id,
      '2025-01-01',
      new Date('2025-01-02T09:00:00Z'),
    );
    const later = await insertVisit(cabinet.id, [a.id], 'planned', '2026-12-20T08:00:00Z');
    const sooner = await insertVisit(cabinet.id, [a.id, b.id], 'planned', '2026-12-10T08:00:00Z');
    const missed = await insertVisit(cabinet.id, [b.id], 'missed', '2026-11-10T08:00:00Z', {
      missedAt: '2026-11-10T22:00:00Z',
    });
    await insertVisit(cabinet.id, [c.id], 'cancelled', '2026-12-12T08:00:00Z');
    await insertVisit(cabinet.id, [c.id], 'missed', '2026-09-01T08:00:00Z', {
      missedAt: '2026-09-01T22:00:00Z',
    });
    await insertVisit(cabinet.id, [c.id], 'logged', '2026-10-01T08:00:00Z', {
      loggedAt: '2026-10-01T10:00:00Z',
    });
    const list = await listDueBanks(
      query({ siteId: site.id, sort: 'cabinet' }),
      new Date('2026-12-02T09:00:00Z'),
    );
    const byId = new Map(list.items.map((row) => [row.bankId, row]));
    expect(byId.get(a.id)!.plannedVisit).toEqual({
      id: sooner,
      plannedStartAt: '2026-12-10T08:00:00.000Z',
      plannedEndAt: '2026-12-10T10:00:00.000Z',
    });
    expect(later).not.toBe(sooner);
    expect(byId.get(a.id)!.missedVisit).toBeNull();
    expect(byId.get(b.id)!.plannedVisit?.id).toBe(sooner);
    expect(byId.get(b.id)!.missedVisit).toEqual({
      id: missed,
      plannedStartAt: '2026-11-10T08:00:00.000Z',
      plannedEndAt: '2026-11-10T10:00:00.000Z',
      missedAt: '2026-11-10T22:00:00.000Z',
    });
    // c: the cancelled visit plans nothing; its last visit was logged after the missed one
    expect(byId.get(c.id)!.plannedVisit).toBeNull();
    expect(byId.get(c.id)!.missedVisit).toBeNull();
    expect(byId.get(c.id)!.lastInspectedOn).toBe('2026-10-01');

    const planned = await listDueBanks(
      query({ siteId: site.id, planned: 'true' }),
      new Date('2026-12-02T09:00:00Z'),
    );
    expect(planned.items.map((r) => r.bankId).sort()).toEqual([a.id, b.id].sort());
    const unplanned = await listDueBanks(
      query({ siteId: site.id, planned: 'false' }),
      new Date('2026-12-02T09:00:00Z'),
    );
    expect(unplanned.items.map((r) => r.bankId)).toEqual([c.id]);
  });
});

describe('filters, buckets, sorting and paging', () => {
  let setup: {
    site: { id: string };
    area: { id: string };
    otherArea: { id: string };
    design: { id: string };
    otherDesign: { id: string; code: string };
    banks: Record<string, string>;
  };
  // judged on 2 December 2026 (UTC site)
  const asOf = new Date('2026-12-02T12:00:00Z');

  beforeAll(async () => {
    const { site, area, cabinet, design } = await fleet('UTC', 365, 'low');
    const otherArea = await makeArea(planner.actor, site.id);
    const critical = await makeCabinet(planner.actor, otherArea.id, { criticality: 'critical' });
    const otherDesign = await makeDesign(planner.actor, { inspectionIntervalDays: 90 });
    const at = new Date('2026-11-01T12:00:00Z');
    const banks: Record<string, string> = {};
    // due 2026-11-01 (overdue), 2026-12-20 (this month), 2027-02-10 (next quarter), 2027-06-01 (later)
    banks.overdue = (await makeBankAt(cabinet.id, design.id, '2025-11-01', at)).id;
    banks.thisMonth = (await makeBankAt(cabinet.id, design.id, '2025-12-20', at)).id;
    banks.nextQuarter = (await makeBankAt(critical.id, design.id, '2026-02-10', at)).id;
    banks.later = (await makeBankAt(critical.id, design.id, '2026-06-01', at)).id;
    // 90-day design installed 2026-09-20: due 2026-12-19 (this month)
    banks.shortInterval = (await makeBankAt(critical.id, otherDesign.id, '2026-09-20', at)).id;
    setup = { site, area, otherArea, design, otherDesign, banks };
  });

  it('when no bucket is asked, then every bank is listed by due date with the count of each bucket', async () => {
    const list = await listDueBanks(query({ siteId: setup.site.id }), asOf);
    const { banks } = setup;
    expect(list.items.map((r) => r.bankId)).toEqual([
      banks.overdue,
      banks.shortInterval,
      banks.thisMonth,
      banks.nextQuarter,
      banks.later,
    ]);
    expect(list.items.map((r) => r.dueOn)).toEqual([
      '2026-11-01',
      '2026-12-19',
      '2026-12-20',
      '2027-02-10',
      '2027-06-01',
    ]);
    expect(list.counts).toEqual({ overdue: 1, 'this-month': 2, 'next-quarter': 1, later: 1 });
    expect(list.total).toBe(5);
    expect(list.items[0]).toMatchObject({
      bucket: 'overdue',
      daysUntilDue: -31,
      health: 'unmeasured',
      todayOn: '2026-12-02',
    });
  });

  it('when a bucket is asked, then only its banks are listed, the total is its count and the counts still cover all', async () => {
    const list = await listDueBanks(query({ siteId: setup.site.id, bucket: 'this-month' }), asOf);
    expect(list.items.map((r) => r.bucket)).toEqual(['this-month', 'this-month']);
    expect(list.total).toBe(2);
    expect(list.counts.overdue).toBe(1);
  });

  it('when filtering by area, design, criticality, due-by date or search, then only matching banks', async () => {
    const { banks, site } = setup;
    const ids = async (input: DueListQueryInput) =>
      (await listDueBanks(query({ siteId: site.id, ...input }), asOf)).items.map((r) => r.bankId);
    expect(await ids({ areaId: setup.area.id })).toEqual([banks.overdue, banks.thisMonth]);
    expect(await ids({ bankDesignId: setup.otherDesign.id })).toEqual([banks.shortInterval]);
    expect(await ids({ criticality: 'critical' })).toEqual([
      banks.shortInterval,
      banks.nextQuarter,
      banks.later,
    ]);
    expect(await ids({ dueBy: '2026-12-19' })).toEqual([banks.overdue, banks.shortInterval]);
    expect(await ids({ q: setup.otherDesign.code.toLowerCase() })).toEqual([banks.shortInterval]);
    // decay runs are not kept yet: every bank is unmeasured
    expect(await ids({ health: 'unmeasured' })).toHaveLength(5);
    expect(await ids({ health: 'end-of-life' })).toEqual([]);
  });

  it('when sorting by due date descending or by criticality, then in that order; paging keeps the total', async () => {
    const { banks, site } = setup;
    const desc = await listDueBanks(query({ siteId: site.id, sort: '-dueOn' }), asOf);
    expect(desc.items.map((r) => r.bankId)).toEqual([
      banks.later,
      banks.nextQuarter,
      banks.thisMonth,
      banks.shortInterval,
      banks.overdue,
    ]);
    const critical = await listDueBanks(query({ siteId: site.id, sort: '-criticality' }), asOf);
    expect(critical.items.map((r) => r.criticality)).toEqual([
      'critical',
      'critical',
      'critical',
      'low',
      'low',
    ]);
    // within one criticality, by due date
    expect(critical.items.slice(0, 3).map((r) => r.bankId)).toEqual([
      banks.shortInterval,
      banks.nextQuarter,
      banks.later,
    ]);
    const page2 = await listDueBanks(query({ siteId: site.id, pageSize: '2', page: '2' }), asOf);
    expect(page2.items.map((r) => r.bankId)).toEqual([banks.thisMonth, banks.nextQuarter]);
    expect(page2.total).toBe(5);
    const past = await listDueBanks(query({ siteId: site.id, pageSize: '2', page: '9' }), asOf);
    expect(past.items).toEqual([]);
    expect(past.total).toBe(5);
  });

  it('when a bank is replaced or removed or its cabinet retired, then it leaves the list', async () => {
    const { cabinet, design, site } = await fleet('UTC', 365);
    const bank = await makeBankAt(
      cabinet.id,
      design.id,
      '2025-01-01',
      new Date('2025-01-01T12:00:00Z'),
    );
    expect((await listDueBanks(query({ siteId: site.id }), asOf)).total).toBe(1);
    await sequelize.query(`UPDATE banks SET status = 'removed' WHERE id = $1`, { bind: [bank.id] });
    expect((await listDueBanks(query({ siteId: site.id }), asOf)).total).toBe(0);
  });
});

describe('GET /api/due', () => {
  it('when a planner, an admin or a reliability engineer asks, then 200 in the list shape with counts', async () => {
    const { site, cabinet, design } = await fleet('Europe/Berlin', 365);
    await makeBankAt(cabinet.id, design.id, '2020-01-01', new Date('2020-01-01T12:00:00Z'));
    for (const roles of [['planner'], ['admin'], ['reliability']] as const) {
      const caller = await createActor([...roles]);
      const res = await request(app)
        .get(`/api/due?siteId=${site.id}&bucket=overdue`)
        .set('Authorization', caller.auth);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({
        total: 1,
        page: 1,
        pageSize: 25,
        counts: { overdue: 1, 'this-month': 0, 'next-quarter': 0, later: 0 },
      });
      const [row] = res.body.items as DueBank[];
      expect(row).toMatchObject({
        siteId: site.id,
        timeZone: 'Europe/Berlin',
        bucket: 'overdue',
        dueOn: '2020-12-31',
        plannedVisit: null,
        missedVisit: null,
      });
    }
  });

  it('when a technician asks, then only the banks of their sites; with no sites, none', async () => {
    const mine = await fleet('UTC', 365);
    const theirs = await fleet('UTC', 365);
    await makeBankAt(
      mine.cabinet.id,
      mine.design.id,
      '2020-01-01',
      new Date('2020-01-01T12:00:00Z'),
    );
    await makeBankAt(
      theirs.cabinet.id,
      theirs.design.id,
      '2020-01-01',
      new Date('2020-01-01T12:00:00Z'),
    );
    const technician = await createActor(['technician']);
    const none = await request(app).get('/api/due').set('Authorization', technician.auth);
    expect(none.status).toBe(200);
    expect(none.body.total).toBe(0);
    await sequelize.query('INSERT INTO person_sites (user_id, site_id) VALUES ($1, $2)', {
      bind: [technician.user.id, mine.site.id],
    });
    const res = await request(app).get('/api/due').set('Authorization', technician.auth);
    expect(res.body.items.map((r: DueBank) => r.siteId)).toEqual([mine.site.id]);
    expect(res.body.total).toBe(1);
    const other = await request(app)
      .get(`/api/due?siteId=${theirs.site.id}`)
      .set('Authorization', technician.auth);
    expect(other.body.total).toBe(0);
    // a technician who also plans sees the fleet
    const both = await createActor(['technician', 'planner']);
    const fleetWide = await request(app)
      .get(`/api/due?siteId=${theirs.site.id}`)
      .set('Authorization', both.auth);
    expect(fleetWide.body.total).toBe(1);
  });

  it('when the caller has no role, then 403; without credentials, 401', async () => {
    const nobody = await createActor([]);
    expect((await request(app).get('/api/due').set('Authorization', nobody.auth)).status).toBe(403);
    expect((await request(app).get('/api/due')).status).toBe(401);
  });

  it('when the query is wrong, then 400 naming the field', async () => {
    for (const [q, field] of [
      ['bucket=soon', 'bucket'],
      ['siteId=nope', 'siteId'],
      ['health=poorly', 'health'],
      ['dueBy=31/12/2026', 'dueBy'],
      ['sort=size', 'sort'],
      ['pageSize=500', 'pageSize'],
      ['planned=maybe', 'planned'],
    ] as const) {
      const res = await request(app).get(`/api/due?${q}`).set('Authorization', planner.auth);
      expect(res.status, q).toBe(400);
      expect(res.body.error.issues[0].path, q).toBe(field);
    }
  });
});

describe('a bank’s health in the Due list', () => {
  /** A decay run row written straight to its table (the decay-run services have their own tests). */
  async function insertRun(
    visitId: string,
    bankId: string,
    isolatedAt: string,
    health: 'healthy' | 'watch' | 'end-of-life' | null,
    review: 'pending' | 'accepted' | 'queried',
    supersedesId: string | null = null,
  ): Promise<string> {
    const [rows] = await sequelize.query(
      `INSERT INTO decay_runs (client_id, visit_id, bank_id, version, supersedes_id, correction_reason, source, isolated_at, samples, safety,
                               observations, verdict, health, body_sha256, review_state, reviewed_at, recorded_by_id, recorded_at)
       VALUES (gen_random_uuid(), $1, $2, $3, $4, $5, 'typed', $6, '[{"tSeconds":0,"volts":540}]', '{}', '{}', $7, $8,
               repeat('a', 64), $9, CASE WHEN $9 = 'pending' THEN NULL ELSE $6::timestamptz END, $10, $6)
       RETURNING id`,
      {
        bind: [
          visitId,
          bankId,
          supersedesId ? 2 : 1,
          supersedesId,
          supersedesId ? 'Mistyped reading' : null,
          isolatedAt,
          JSON.stringify({ status: 'ok', health }),
          health,
          review,
          planner.user.id,
        ],
      },
    );
    return (rows as Array<{ id: string }>)[0]!.id;
  }

  it('when a bank has accepted runs, then its health is the newest current accepted judged one’s; pending, queried, corrected, unjudged and later runs do not count; none: unmeasured', async () => {
    const { site, cabinet, design } = await fleet('UTC', 365);
    const at = new Date('2025-01-01T12:00:00Z');
    const ageing = await makeBankAt(cabinet.id, design.id, '2024-01-01', at);
    const corrected = await makeBankAt(cabinet.id, design.id, '2024-01-01', at);
    const queriedOnly = await makeBankAt(cabinet.id, design.id, '2024-01-01', at);
    const visit = await insertVisit(cabinet.id, [ageing.id, corrected.id, queriedOnly.id], 'reviewed', '2025-06-01T08:00:00Z', {
      loggedAt: '2025-06-01T12:00:00Z',
    });
    await insertRun(visit, ageing.id, '2025-06-01T09:00:00Z', 'healthy', 'accepted');
    await insertRun(visit, ageing.id, '2026-06-01T09:00:00Z', 'watch', 'accepted');
    await insertRun(visit, ageing.id, '2026-06-01T09:30:00Z', null, 'accepted'); // no τ: says nothing
    await insertRun(visit, ageing.id, '2026-07-01T09:00:00Z', 'end-of-life', 'pending');
    await insertRun(visit, ageing.id, '2027-01-01T09:00:00Z', 'end-of-life', 'accepted'); // after the instant
    const wrong = await insertRun(visit, corrected.id, '2026-06-01T09:00:00Z', 'end-of-life', 'accepted');
    await insertRun(visit, corrected.id, '2026-05-01T09:00:00Z', 'healthy', 'accepted', wrong);
    await insertRun(visit, queriedOnly.id, '2026-06-01T09:00:00Z', 'end-of-life', 'queried');

    const list = await listDueBanks(query({ siteId: site.id }), new Date('2026-12-02T12:00:00Z'));
    const healthOf = (id: string) => list.items.find((b) => b.bankId === id)?.health;
    expect(healthOf(ageing.id)).toBe('watch');
    expect(healthOf(corrected.id)).toBe('healthy');
    expect(healthOf(queriedOnly.id)).toBe('unmeasured');
    const watch = await listDueBanks(query({ siteId: site.id, health: 'watch' }), new Date('2026-12-02T12:00:00Z'));
    expect(watch.items.map((b) => b.bankId)).toEqual([ageing.id]);
  });
});
