/**
 * The decay-run write routes against hostile bodies: never a 5xx, and a refusal stores nothing
 * (no run, audit entry or outbox message; the visit not started).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { assertCorpusHolds } from '../../support/hostile-bodies';
import { validCorrectionInput, validRunInput } from '../../support/decay-runs';
import { makePlant, recordRun, visitOf, type Plant } from './fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
}, 120_000);

describe('hostile bodies: never a 5xx, a refusal stores nothing', () => {
  it('POST /api/visits/:visitId/decay-runs', async () => {
    const visit = await visitOf(plant);
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/visits/${visit.id}/decay-runs`, headers: { Authorization: plant.ana.auth } },
      validRunInput(plant.bankA.id) as unknown as Record<string, unknown>,
      200,
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('POST /api/decay-runs/:runId/corrections', async () => {
    const visit = await visitOf(plant);
    await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankB.id));
    // the newest version of the bank's run on the visit: the one a correction may go to
    const target = async () => {
      const [rows] = await sequelize.query(
        `SELECT id, version FROM decay_runs r WHERE visit_id = $1 AND bank_id = $2
            AND NOT EXISTS (SELECT 1 FROM decay_runs n WHERE n.supersedes_id = r.id)`,
        { bind: [visit.id, plant.bankB.id] },
      );
      return (rows as Array<{ id: string; version: number }>)[0]!;
    };
    const tally = await assertCorpusHolds(
      app,
      {
        method: 'post',
        path: (_query, run) => `/api/decay-runs/${run.id!}/corrections`,
        headers: { Authorization: plant.ana.auth },
        target,
      },
      validCorrectionInput() as unknown as Record<string, unknown>,
      150,
    );
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);
});
