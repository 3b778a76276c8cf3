/**
 * The demo's decay-run history: years of accepted runs per bank, held by reviewed visits in past
 * shutdown windows, judged as the API judges a run, the first trusted run as the baseline; and
 * a second seed adds nothing.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../../api/src/db/sequelize';
import { listDueBanks } from '../../../api/src/services/due';
import { seedDemo, type SeedSummary } from '../../../infra/seed/index';
import { dueListQuerySchema } from '../../../shared/schemas/due';

// the seed's instant, fixed: a Wednesday in December (London on GMT)
const NOW = new Date('2026-12-02T10:20:00Z');
const DAY_MS = 86_400_000;
let first: SeedSummary;
let seedSeconds = 0;

beforeAll(async () => {
  const started = performance.now();
  first = await seedDemo({ now: NOW });
  seedSeconds = (performance.now() - started) / 1000;
}, 300_000);

async function rows<T>(sql: string, bind: unknown[] = []): Promise<T[]> {
  const [result] = await sequelize.query(sql, { bind });
  return result as T[];
}

describe('the demo’s decay-run history', () => {
  it('when seeded, then every demo bank in service installed over five years ago has years of runs (at least 3), 6–12 months apart, in reviewed visits', async () => {
    console.log(`seed: ${seedSeconds.toFixed(1)} s, ${JSON.stringify(first)}`);
    expect(first.decayRuns).toBeGreaterThan(1000);
    const banks = await rows<{ id: string; installedOn: string; runs: number; firstAt: Date | null; lastAt: Date | null; maxGapDays: number | null }>(
      `SELECT b.id, to_char(b.installed_on, 'YYYY-MM-DD') AS "installedOn", count(r.id)::int AS runs,
              min(r.isolated_at) AS "firstAt", max(r.isolated_at) AS "lastAt",
              (SELECT max(gap) FROM (SELECT extract(epoch FROM r2.isolated_at - lag(r2.isolated_at) OVER (ORDER BY r2.isolated_at)) / 86400 AS gap
                                      FROM decay_runs r2 JOIN visits v2 ON v2.id = r2.visit_id
                                     WHERE r2.bank_id = b.id AND v2.planned_start_at < $1::timestamptz - interval '395 days') g)::float8 AS "maxGapDays"
         FROM banks b LEFT JOIN decay_runs r ON r.bank_id = b.id
        WHERE b.status = 'in-service' GROUP BY b.id`,
      [NOW.toISOString()],
    );
    const old = banks.filter((b) => Date.parse(b.installedOn) < NOW.getTime() - 5 * 365 * DAY_MS);
    expect(old.length).toBeGreaterThan(100);
    for (const bank of old) {
      expect(bank.runs, bank.id).toBeGreaterThanOrEqual(3);
      expect(bank.lastAt!.getTime() - bank.firstAt!.getTime(), bank.id).toBeGreaterThan(365 * DAY_MS);
      expect(bank.maxGapDays ?? 0, bank.id).toBeLessThan(400);
    }
    const perBank = banks.map((b) => b.runs).sort((a, b) => a - b);
    console.log(`runs per bank in service: min ${perBank[0]}, median ${perBank[Math.floor(perBank.length / 2)]}, max ${perBank[perBank.length - 1]}, banks ${perBank.length}`);
    // every run sits in a reviewed visit (accepted or queried), or in the visit still waiting for review (pending)
    const states = await rows<{ state: string; review: string; n: number }>(
      `SELECT v.state, r.review_state AS review, count(*)::int AS n FROM decay_runs r JOIN visits v ON v.id = r.visit_id GROUP BY 1, 2 ORDER BY 1, 2`,
    );
    for (const s of states) {
      if (s.state === 'reviewed') expect(['accepted', 'queried']).toContain(s.review);
      else expect(s).toMatchObject({ state: 'logged', review: 'pending' });
    }
    expect(states.find((s) => s.state === 'reviewed' && s.review === 'accepted')!.n).toBeGreaterThan(1000);
  }, 60_000);

  it('when the runs are read, then their figures are the stored verdict’s, some banks are in watch or at end of life, some bleeders faulted (τ rise), some drives have a control-supply phase, some readings were mistyped', async () => {
    const [mismatch] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM decay_runs WHERE health IS DISTINCT FROM verdict->>'health'
          OR safety_finding IS DISTINCT FROM (verdict->>'safetyFinding')::boolean
          OR (verdict->>'status' = 'ok' AND abs(tau_seconds - (verdict->>'tauSeconds')::float8) > 1e-9)`,
    );
    expect(mismatch!.n).toBe(0);
    const findings = await rows<{ code: string; n: number }>(
      `SELECT f->>'code' AS code, count(*)::int AS n FROM decay_runs r, jsonb_array_elements(r.verdict->'findings') f GROUP BY 1`,
    );
    const of = (code: string) => findings.find((f) => f.code === code)?.n ?? 0;
    expect(of('tau-rise')).toBeGreaterThan(0);
    expect(of('control-supply-phase')).toBeGreaterThan(0);
    expect(of('readings-left-out')).toBeGreaterThan(0);
    expect(of('visual-finding')).toBeGreaterThan(0);
    // judged against a baseline they can be compared with: few runs outside what ageing explains
    // (a bleeder fault raising τ by over a third is one)
    const [judged] = await rows<{ implausible: number; all: number }>(
      `SELECT count(*) FILTER (WHERE verdict->>'notJudgedBecause' = 'implausible-ratio')::int AS implausible, count(*)::int AS "all" FROM decay_runs`,
    );
    expect(judged!.implausible).toBeLessThan(judged!.all * 0.03);
    const latest = await rows<{ health: string; n: number }>(
      `SELECT health, count(*)::int AS n FROM (
         SELECT DISTINCT ON (r.bank_id) r.health FROM decay_runs r JOIN banks b ON b.id = r.bank_id
          WHERE b.status = 'in-service' AND r.review_state = 'accepted' AND r.health IS NOT NULL
          ORDER BY r.bank_id, r.isolated_at DESC) t GROUP BY 1`,
    );
    const count = (h: string) => latest.find((l) => l.health === h)?.n ?? 0;
    console.log(`newest accepted health: ${JSON.stringify(latest)}`);
    expect(count('healthy')).toBeGreaterThan(100);
    expect(count('watch') + count('end-of-life')).toBeGreaterThan(3);
  }, 60_000);

  it('when a bank had a nameplate baseline, then its first trusted run is its baseline now, set by Ines', async () => {
    const baselines = await rows<{ source: string; ok: boolean; n: number }>(
      `SELECT b.baseline_source AS source,
              (b.baseline_decay_run_id IS NULL OR (r.bank_id = b.id AND r.review_state = 'accepted' AND b.baseline_tau_seconds = r.tau_seconds)) AS ok,
              count(*)::int AS n
         FROM banks b LEFT JOIN decay_runs r ON r.id = b.baseline_decay_run_id GROUP BY 1, 2`,
    );
    expect(baselines.filter((b) => !b.ok)).toEqual([]);
    expect(baselines.find((b) => b.source === 'decay-run')!.n).toBeGreaterThan(150);
    const [audited] = await rows<{ n: number }>(
      `SELECT count(*)::int AS n FROM banks b WHERE b.baseline_source = 'decay-run'
          AND NOT EXISTS (SELECT 1 FROM audit_entries a WHERE a.entity_id = b.id AND a.action = 'baseline' AND a.actor_name = 'Ines Carvell')`,
    );
    expect(audited!.n).toBe(0);
  }, 60_000);

  it('when the Due list is read, then a bank’s health is its newest accepted run’s', async () => {
    const due = await listDueBanks(dueListQuerySchema.parse({ pageSize: '100' }), NOW);
    const healths = new Set(due.items.map((b) => b.health));
    expect(healths.has('healthy')).toBe(true);
    expect(due.counts.overdue).toBeGreaterThan(50);
  }, 60_000);

  it('when seeded again, then nothing is added', async () => {
    const runs = await rows<{ n: number }>('SELECT count(*)::int AS n FROM decay_runs');
    const again = await seedDemo({ now: new Date(NOW.getTime() + 9 * DAY_MS) });
    expect(again).toMatchObject({ historyWindows: 0, historyVisits: 0, decayRuns: 0, visits: 0 });
    expect(await rows<{ n: number }>('SELECT count(*)::int AS n FROM decay_runs')).toEqual(runs);
  }, 300_000);
});
