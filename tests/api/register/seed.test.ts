import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { seedDemo, type SeedSummary } from '../../../infra/seed/index';
import { createActor } from '../../support/register';

const app = createApp();
let first: SeedSummary;
let reader: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  first = await seedDemo();
  reader = await createActor(['technician']);
});

async function one<T>(sql: string): Promise<T> {
  const [rows] = await sequelize.query(sql);
  return (rows as T[])[0]!;
}

describe('the demo register', () => {
  it('when seeded, then Brackenmoor’s 3 sites, ~150 cabinets, ~250 banks of 8 designs and ~20 spares', () => {
    expect(first).toMatchObject({ sites: 3, cabinets: 150, bankDesigns: 8 });
    expect(first.banks).toBeGreaterThanOrEqual(220);
    expect(first.banks).toBeLessThanOrEqual(290);
    expect(first.spares).toBeGreaterThanOrEqual(18);
    expect(first.spares).toBeLessThanOrEqual(22);
  });

  it('when seeded, then it has series pairs, single cans and film, replaced banks with successors, and overdue spares', async () => {
    const mix = await one<{ series: number; single: number; film: number }>(
      `SELECT count(*) FILTER (WHERE series_count = 2)::int AS series, count(*) FILTER (WHERE series_count = 1 AND technology = 'electrolytic')::int AS single,
              count(*) FILTER (WHERE technology = 'film')::int AS film FROM bank_design_versions`,
    );
    expect(mix.series).toBeGreaterThan(0);
    expect(mix.single).toBeGreaterThan(0);
    expect(mix.film).toBeGreaterThan(0);
    const replaced = await one<{ n: number; linked: number }>(
      `SELECT count(*)::int AS n, count(s.id)::int AS linked FROM banks b LEFT JOIN banks s ON s.id = b.replaced_by_bank_id AND s.replaces_bank_id = b.id WHERE b.status = 'replaced'`,
    );
    expect(replaced.n).toBeGreaterThan(0);
    expect(replaced.linked).toBe(replaced.n);
    const overdue = await request(app).get('/api/spares?overdue=true').set('Authorization', reader.auth);
    expect(overdue.body.total).toBeGreaterThan(0);
    const tags = await request(app).get('/api/cabinets?q=BRK-M2-VFD-0&sort=tag').set('Authorization', reader.auth);
    expect(tags.body.items[0].tag).toMatch(/^BRK-M2-VFD-0\d\d$/);
  });

  it('when a cabinet is listed, then its bank count is the number of its banks in service', async () => {
    const list = await request(app).get('/api/cabinets?pageSize=100').set('Authorization', reader.auth);
    const counts = await sequelize.query(`SELECT cabinet_id, count(*)::int AS n FROM banks WHERE status = 'in-service' GROUP BY cabinet_id`);
    const byCabinet = new Map((counts[0] as Array<{ cabinet_id: string; n: number }>).map((r) => [r.cabinet_id, r.n]));
    for (const cabinet of list.body.items as Array<{ id: string; bankCount: number }>) {
      expect(cabinet.bankCount).toBe(byCabinet.get(cabinet.id) ?? 0);
    }
  });

  it('when every record is new, then each has its audit entry', async () => {
    const missing = await one<{ n: number }>(
      `SELECT count(*)::int AS n FROM cabinets c WHERE NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity_type = 'cabinet' AND a.entity_id = c.id)`,
    );
    expect(missing.n).toBe(0);
  });

  it('when seeded, then the register’s audit entries are written in its one unit of work: one instant, each naming the demo person it acts as', async () => {
    // the Planner's demo history (visits of past weeks) and the decay-run history (baselines set
    // from a bank's first trusted run) are written at the instants they happened
    const entries = await one<{ instants: number; people: string }>(
      `SELECT count(DISTINCT at)::int AS instants, string_agg(DISTINCT actor_name, ',' ORDER BY actor_name) AS people FROM audit_entries
        WHERE entity_type IN ('site', 'area', 'cabinet', 'bank', 'bank-design', 'spare')
          AND NOT (action = 'baseline' AND after->>'baselineSource' = 'decay-run')`,
    );
    expect(entries.instants).toBe(1);
    const [planner, engineer] = await Promise.all([
      one<{ name: string }>(`SELECT name FROM users WHERE email = 'tomas@brackenmoor.example'`),
      one<{ name: string }>(`SELECT name FROM users WHERE email = 'ines@brackenmoor.example'`),
    ]);
    expect(entries.people.split(',').sort()).toEqual([planner.name, engineer.name].sort());
    const stamped = await one<{ n: number }>(`SELECT count(*)::int AS n FROM banks b JOIN audit_entries a ON a.entity_id = b.id AND a.action = 'create' WHERE b.baseline_set_at <> a.at AND b.baseline_source <> 'decay-run'`);
    expect(stamped.n).toBe(0);
  });

  it('when seeded again, then nothing is added (idempotent by natural keys)', async () => {
    const again = await seedDemo();
    expect(again).toMatchObject({ sites: 0, areas: 0, cabinets: 0, bankDesigns: 0, banks: 0, spares: 0 });
  });

  it('when grown to a larger fleet, then only the extra cabinets are added and the demo stays as it was', async () => {
    const before = await one<{ tags: string }>(`SELECT string_agg(tag || ':' || drive_model, ',' ORDER BY tag) AS tags FROM cabinets`);
    const grown = await seedDemo({ cabinets: 400 });
    expect(grown.cabinets).toBe(250);
    const demoAfter = await one<{ tags: string }>(
      `SELECT string_agg(c.tag || ':' || c.drive_model, ',' ORDER BY c.tag) AS tags FROM cabinets c JOIN areas a ON a.id = c.area_id WHERE a.name NOT LIKE 'Fleet hall%'`,
    );
    expect(demoAfter.tags).toBe(before.tags);
  });
});
