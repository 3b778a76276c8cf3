import { beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../../api/src/db/sequelize';
import { listDueBanks } from '../../../api/src/services/due';
import { dueListQuerySchema } from '../../../shared/schemas/due';
import { seedDemo, type SeedSummary } from '../../../infra/seed/index';
import { DEMO_AREA_NAMES } from '../../../infra/seed/register';
import { localWallTimeOf, windowOccurrences } from '../../../shared/domain/shutdown-windows';

// the seed's instant, fixed: a Wednesday in December (London on GMT)
const NOW = new Date('2026-12-02T10:20:00Z');
const DAY_MS = 86_400_000;
let first: SeedSummary;

beforeAll(async () => {
  first = await seedDemo({ now: NOW });
});

async function rows<T>(sql: string, bind: unknown[] = []): Promise<T[]> {
  const [result] = await sequelize.query(sql, { bind });
  return result as T[];
}

interface WindowRow {
  id: string;
  areaId: string;
  areaName: string;
  timeZone: string;
  title: string;
  startsAt: Date;
  endsAt: Date;
  recurrence: string | null;
}

const windowsSql = `SELECT w.id, w.area_id AS "areaId", a.name AS "areaName", s.time_zone AS "timeZone", w.title,
                           w.starts_at AS "startsAt", w.ends_at AS "endsAt", w.recurrence
                      FROM shutdown_windows w JOIN areas a ON a.id = w.area_id JOIN sites s ON s.id = a.site_id`;

function occurrencesOf(w: WindowRow, fromMs: number, toMs: number) {
  return windowOccurrences(
    {
      startsAt: w.startsAt.toISOString(),
      endsAt: w.endsAt.toISOString(),
      recurrence: w.recurrence,
    },
    w.timeZone,
    new Date(fromMs).toISOString(),
    new Date(toMs).toISOString(),
  );
}

interface VisitRow {
  id: string;
  areaId: string;
  state: string;
  plannedStartAt: Date;
  plannedEndAt: Date;
  loggedAt: Date | null;
  technicians: string[];
}

const visitsSql = `SELECT v.id, c.area_id AS "areaId", v.state, v.planned_start_at AS "plannedStartAt", v.planned_end_at AS "plannedEndAt",
                          v.logged_at AS "loggedAt", array_agg(u.email ORDER BY u.email) AS technicians
                     FROM visits v JOIN cabinets c ON c.id = v.cabinet_id
                     JOIN visit_technicians vt ON vt.visit_id = v.id JOIN users u ON u.id = vt.user_id
                    GROUP BY v.id, c.area_id`;

describe('the Planner’s demo', () => {
  it('when seeded, then every demo area has shutdown windows in the next three months, some recurring weekly, fortnightly or monthly and some one-off, at local wall times of the site', async () => {
    expect(first.shutdownWindows).toBeGreaterThanOrEqual(DEMO_AREA_NAMES.length * 2);
    const windows = await rows<WindowRow>(windowsSql);
    const nowMs = NOW.getTime();
    for (const name of DEMO_AREA_NAMES) {
      const ofArea = windows.filter((w) => w.areaName === name);
      const ahead = ofArea.flatMap((w) => occurrencesOf(w, nowMs, nowMs + 92 * DAY_MS));
      expect(ahead.length, name).toBeGreaterThanOrEqual(2);
      expect(
        ofArea.some((w) => w.recurrence !== null),
        name,
      ).toBe(true);
      expect(
        ofArea.some((w) => w.recurrence === null),
        name,
      ).toBe(true);
    }
    const rules = new Set(
      windows.map((w) =>
        w.recurrence
          ?.split(';')
          .filter((p) => /^(FREQ|INTERVAL)=/.test(p))
          .join(';'),
      ),
    );
    expect(rules).toContain('FREQ=WEEKLY');
    expect(rules).toContain('FREQ=WEEKLY;INTERVAL=2');
    expect(rules).toContain('FREQ=MONTHLY');
    // every weekly line stop keeps its 06:00 local start, after the clocks change in March too
    for (const w of windows.filter((x) => x.title === 'Saturday line stop')) {
      const starts = occurrencesOf(w, nowMs, nowMs + 200 * DAY_MS).map((o) =>
        localWallTimeOf(o.startsAt, w.timeZone),
      );
      expect(starts.length).toBeGreaterThan(10);
      expect(new Set(starts.map((s) => s.slice(11)))).toEqual(new Set(['06:00']));
    }
  });

  it('when seeded, then Dario, Lucia and Kofi each work at two sites', async () => {
    const sites = await rows<{ email: string; n: number }>(
      `SELECT u.email, count(ps.site_id)::int AS n FROM users u LEFT JOIN person_sites ps ON ps.user_id = u.id
        WHERE u.email IN ('dario@brackenmoor.example', 'lucia@brackenmoor.example', 'kofi@brackenmoor.example') GROUP BY u.email ORDER BY u.email`,
    );
    expect(sites).toEqual([
      { email: 'dario@brackenmoor.example', n: 2 },
      { email: 'kofi@brackenmoor.example', n: 2 },
      { email: 'lucia@brackenmoor.example', n: 2 },
    ]);
    // Kofi is registered by e-mail; his first sign-in links his account
    const [kofi] = await rows<{ subject: string | null; roles: string[] }>(
      `SELECT subject, roles FROM users WHERE email = 'kofi@brackenmoor.example'`,
    );
    expect(kofi).toEqual({ subject: null, roles: ['technician'] });
  });

  it('when seeded, then every technician has planned visits in the coming three weeks, each wholly inside a window of its area, at one of their sites, nobody booked twice', async () => {
    const visits = await rows<VisitRow>(visitsSql);
    const windows = await rows<WindowRow>(windowsSql);
    const nowMs = NOW.getTime();
    const planned = visits.filter((v) => v.state === 'planned');
    for (const email of [
      'dario@brackenmoor.example',
      'lucia@brackenmoor.example',
      'kofi@brackenmoor.example',
    ]) {
      const theirs = planned.filter(
        (v) => v.technicians.includes(email) && v.plannedStartAt.getTime() < nowMs + 21 * DAY_MS,
      );
      expect(theirs.length, email).toBeGreaterThanOrEqual(3);
    }
    expect(planned.some((v) => v.plannedStartAt.getTime() - nowMs < DAY_MS)).toBe(true);
    for (const v of visits.filter((x) => x.state !== 'cancelled')) {
      const inside = windows
        .filter((w) => w.areaId === v.areaId)
        .flatMap((w) =>
          occurrencesOf(
            w,
            v.plannedStartAt.getTime() - 2 * DAY_MS,
            v.plannedEndAt.getTime() + 2 * DAY_MS,
          ),
        )
        .some(
          (o) =>
            Date.parse(o.startsAt) <= v.plannedStartAt.getTime() &&
            Date.parse(o.endsAt) >= v.plannedEndAt.getTime(),
        );
      expect(inside, `visit ${v.id}`).toBe(true);
    }
    const outsideSites = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM visit_technicians vt JOIN visits v ON v.id = vt.visit_id JOIN cabinets c ON c.id = v.cabinet_id
         JOIN areas a ON a.id = c.area_id
        WHERE NOT EXISTS (SELECT 1 FROM person_sites ps WHERE ps.user_id = vt.user_id AND ps.site_id = a.site_id)`,
    );
    expect(outsideSites[0]!.n).toBe(0);
    const overlaps = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM visit_technicians a JOIN visit_technicians b ON a.user_id = b.user_id AND a.visit_id < b.visit_id
         JOIN visits va ON va.id = a.visit_id JOIN visits vb ON vb.id = b.visit_id
        WHERE va.planned_start_at < vb.planned_end_at AND vb.planned_start_at < va.planned_end_at`,
    );
    expect(overlaps[0]!.n).toBe(0);
  });

  it('when seeded, then some banks were inspected in the last weeks, some about a year ago, others not for over a year (overdue), and one visit was missed', async () => {
    const visits = await rows<VisitRow>(visitsSql);
    const nowMs = NOW.getTime();
    const byState = (s: string) => visits.filter((v) => v.state === s);
    const recent = [...byState('logged'), ...byState('reviewed')].filter(
      (v) => nowMs - v.loggedAt!.getTime() < 60 * DAY_MS,
    );
    const yearAgo = byState('reviewed').filter((v) => nowMs - v.loggedAt!.getTime() > 300 * DAY_MS);
    expect(recent.length).toBeGreaterThanOrEqual(DEMO_AREA_NAMES.length);
    expect(byState('logged').length).toBeGreaterThan(0);
    expect(yearAgo.length).toBeGreaterThanOrEqual(DEMO_AREA_NAMES.length);
    expect(byState('missed')).toHaveLength(1);
    for (const v of [...recent, ...yearAgo]) expect(v.loggedAt!.getTime()).toBeLessThan(nowMs);
    // not inspected for over a year (the decay-run history ends before that) and installed over
    // a year ago: overdue whatever the design's interval
    const [overdue] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM banks b WHERE b.status = 'in-service' AND b.installed_on < ($1::timestamptz - interval '1 year')::date
          AND NOT EXISTS (SELECT 1 FROM visit_banks vb JOIN visits v ON v.id = vb.visit_id WHERE vb.bank_id = b.id AND v.state IN ('logged', 'reviewed')
                             AND v.logged_at > $1::timestamptz - interval '1 year')`,
      [NOW.toISOString()],
    );
    expect(overdue!.n).toBeGreaterThan(50);
  });

  it('when the Due list is judged at the seed’s instant, then it has overdue banks, banks due this month or next quarter, banks inspected lately, planned ones and the missed one', async () => {
    const due = await listDueBanks(dueListQuerySchema.parse({}), NOW);
    expect(due.counts.overdue).toBeGreaterThan(50);
    expect(due.counts['this-month'] + due.counts['next-quarter']).toBeGreaterThanOrEqual(
      DEMO_AREA_NAMES.length,
    );
    expect(due.counts.later).toBeGreaterThanOrEqual(DEMO_AREA_NAMES.length);
    const overdue = { items: [] as Awaited<ReturnType<typeof listDueBanks>>['items'] };
    for (let page = 1; page <= Math.ceil(due.counts.overdue / 100); page += 1) {
      const query = dueListQuerySchema.parse({
        bucket: 'overdue',
        pageSize: '100',
        page: String(page),
      });
      overdue.items.push(...(await listDueBanks(query, NOW)).items);
    }
    expect(overdue.items).toHaveLength(due.counts.overdue);
    expect(overdue.items.some((bank) => bank.plannedVisit !== null)).toBe(true);
    expect(overdue.items.some((bank) => bank.plannedVisit === null)).toBe(true);
    expect(overdue.items.filter((bank) => bank.missedVisit !== null).length).toBeGreaterThan(0);
  });

  it('when seeded, then every visit and window has its audit trail: planned by Tomas, started and logged by its technician, reviewed by Ines, missed by Ebbline itself', async () => {
    const [missing] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM visits v WHERE NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity_id = v.id AND a.action = 'create')`,
    );
    expect(missing!.n).toBe(0);
    const [windowsMissing] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM shutdown_windows w WHERE NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity_id = w.id)`,
    );
    expect(windowsMissing!.n).toBe(0);
    const actions = await rows<{ action: string; actors: string[] }>(
      `SELECT a.action, array_agg(DISTINCT coalesce(a.actor_name, 'Ebbline') ORDER BY coalesce(a.actor_name, 'Ebbline')) AS actors
         FROM audit_entries a JOIN visits v ON v.id = a.entity_id GROUP BY a.action ORDER BY a.action`,
    );
    const of = (action: string) => actions.find((a) => a.action === action)?.actors;
    expect(of('create')).toEqual(['Tomas Keelan']);
    expect(of('review')).toEqual(['Ines Carvell']);
    expect(of('miss')).toEqual(['Ebbline']);
    expect(of('log')!.length).toBeGreaterThanOrEqual(2);
    // a history step is stamped when it happened, never after the seed's instant
    const [later] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM audit_entries WHERE at > $1::timestamptz`,
      [NOW.toISOString()],
    );
    expect(later!.n).toBe(0);
  });

  it('when seeded again, then nothing is added', async () => {
    const again = await seedDemo({ now: new Date(NOW.getTime() + 9 * DAY_MS) });
    expect(again).toMatchObject({ shutdownWindows: 0, personSites: 0, visits: 0 });
  });
});
