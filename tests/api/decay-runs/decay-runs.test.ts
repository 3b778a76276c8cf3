/**
 * Decay runs over HTTP: recorded once however often the phone sends them, judged by the server
 * with the same function as the phone, refused whole when the body or the visit is wrong,
 * corrected as new versions, and read by visit, by bank and by id.
 */
import crypto from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { bankEngineInputs, type BankRecordForEngine } from '../../../shared/domain/bank-engine-inputs';
import { judgeRecordedRun } from '../../../shared/domain/recorded-run';
import type { DecayRun } from '../../../shared/schemas/decay-run';
import type { Visit } from '../../../shared/schemas/visit';
import { decaySamples, TEST_DESIGN_HEALTHY_TAU_SECONDS, validCorrectionInput, validRunInput } from '../../support/decay-runs';
import { makePlant, postRun, recordRun, runTables, visitOf, type Plant } from './fixtures';

const app = createApp();
let plant: Plant;

beforeAll(async () => {
  plant = await makePlant();
}, 120_000);

const json = (value: unknown) => JSON.parse(JSON.stringify(value)) as unknown;

async function readVisit(id: string): Promise<Visit> {
  return (await request(app).get(`/api/visits/${id}`).set('Authorization', plant.planner.auth)).body as Visit;
}

describe('POST /api/visits/:visitId/decay-runs: one run per clientId', () => {
  it('when the same clientId and body come three times, then one run: 201, 200, 200, one row, one audit entry, one outbox message', async () => {
    const visit = await visitOf(plant);
    const before = await runTables();
    const body = validRunInput(plant.bankA.id);
    const answers = [];
    for (let i = 0; i < 3; i++) answers.push(await postRun(app, visit.id, plant.ana.auth, body));
    expect(answers.map((res) => res.status)).toEqual([201, 200, 200]);
    expect(new Set(answers.map((res) => (res.body as DecayRun).id)).size).toBe(1);
    expect(answers[2]!.body).toEqual(answers[0]!.body);
    const after = await runTables();
    expect(after.runs - before.runs).toBe(1);
    expect(after.runAudits - before.runAudits).toBe(1);
    // one message: decay-run.recorded (starting the visit enqueues nothing)
    expect(after.outbox - before.outbox).toBe(1);
    const [messages] = await sequelize.query(`SELECT topic, payload FROM outbox_messages WHERE payload->>'runId' = $1`, {
      bind: [answers[0]!.body.id],
    });
    expect(messages).toEqual([
      {
        topic: 'decay-run.recorded',
        // the 5 min marked wait is shorter than this bank's discharge: a safety finding of the verdict
        payload: { runId: answers[0]!.body.id, bankId: plant.bankA.id, visitId: visit.id, health: 'healthy', safetyFinding: true },
      },
    ]);
  });

  it('when 20 submissions of one clientId arrive at once, then one run is stored and all answer it', async () => {
    const visit = await visitOf(plant);
    const before = await runTables();
    const body = validRunInput(plant.bankA.id);
    const answers = await Promise.all(Array.from({ length: 20 }, () => postRun(app, visit.id, plant.ana.auth, body)));
    const statuses = answers.map((res) => res.status).sort();
    expect(statuses.filter((s) => s === 201)).toHaveLength(1);
    expect(statuses.filter((s) => s === 200)).toHaveLength(19);
    expect(new Set(answers.map((res) => (res.body as DecayRun).id)).size).toBe(1);
    const after = await runTables();
    expect({ runs: after.runs - before.runs, audits: after.runAudits - before.runAudits, outbox: after.outbox - before.outbox }).toEqual({
      runs: 1,
      audits: 1,
      outbox: 1,
    });
    // the planned visit was started once
    const [starts] = await sequelize.query(`SELECT count(*)::int AS n FROM audit_entries WHERE entity_id = $1 AND action = 'start'`, {
      bind: [visit.id],
    });
    expect(starts).toEqual([{ n: 1 }]);
  }, 120_000);

  it('when the same clientId comes with another body, then 422 client-id-reused and nothing changes', async () => {
    const visit = await visitOf(plant);
    const body = validRunInput(plant.bankA.id);
    await recordRun(app, visit.id, plant.ana.auth, body);
    const before = await runTables();
    const changed = { ...body, samples: body.samples.map((s, i) => (i === 3 ? { ...s, volts: s.volts + 5 } : s)) };
    const res = await postRun(app, visit.id, plant.ana.auth, changed);
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: 'client-id-reused', issues: [{ path: 'clientId' }] });
    expect(await runTables()).toEqual(before);
  });

  it('when a body with its keys in another order is sent again, then it is the same submission (200)', async () => {
    const visit = await visitOf(plant);
    const body = validRunInput(plant.bankA.id);
    await recordRun(app, visit.id, plant.ana.auth, body);
    const reordered = Object.fromEntries(Object.entries(body).reverse());
    expect((await postRun(app, visit.id, plant.ana.auth, reordered)).status).toBe(200);
  });

  it('when a planned visit gets its first run, then the visit is under way, its start audited, in the same unit of work', async () => {
    const visit = await visitOf(plant);
    await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    const read = await readVisit(visit.id);
    expect(read.state).toBe('under-way');
    expect(read.startedAt).not.toBeNull();
  });
});

describe('POST /api/visits/:visitId/decay-runs: a bad submission stores nothing', () => {
  type Case = { name: string; status: number; code: string; path?: string; body: (plant: Plant) => unknown; state?: string };
  /** A body the schema refuses: 400 validation-failed, naming `path`. */
  const invalid = (name: string, path: string, body: (plant: Plant) => unknown): Case => ({
    name,
    status: 400,
    code: 'validation-failed',
    path,
    body,
  });
  const cases: Case[] = [
    invalid('absence of voltage not confirmed', 'safety.absenceOfVoltageVerified', (p) =>
      validRunInput(p.bankA.id, { safety: { absenceOfVoltageVerified: false as true } }),
    ),
    invalid('lockout/tagout left out', 'safety.lockoutTagoutApplied', (p) => {
      const body = validRunInput(p.bankA.id);
      const { lockoutTagoutApplied: _left, ...safety } = body.safety;
      return { ...body, safety };
    }),
    invalid('a voltage that is not a number', 'samples.3.volts', (p) => {
      const body = validRunInput(p.bankA.id);
      return { ...body, samples: body.samples.map((s, i) => (i === 3 ? { ...s, volts: 'NaN' } : s)) };
    }),
    invalid('no readings', 'samples', (p) => validRunInput(p.bankA.id, { samples: [] })),
    {
      name: 'an unknown bank',
      status: 422,
      code: 'bank-not-on-visit',
      path: 'bankId',
      body: () => validRunInput(crypto.randomUUID()),
    },
    {
      name: 'a bank of another cabinet',
      status: 422,
      code: 'bank-not-on-visit',
      path: 'bankId',
      body: (p) => validRunInput(p.otherBank.id),
    },
    { name: 'a logged visit', status: 409, code: 'visit-not-open', state: 'logged', body: (p) => validRunInput(p.bankA.id) },
    { name: 'a cancelled visit', status: 409, code: 'visit-not-open', state: 'cancelled', body: (p) => validRunInput(p.bankA.id) },
  ];
  for (const c of cases) {
    it(`when the run has ${c.name}, then ${c.status} ${c.code}${c.path ? ` naming ${c.path}` : ''} and no row, audit entry or message is added`, async () => {
      const visit = await visitOf(plant, c.state ?? 'planned');
      const before = await runTables();
      const res = await postRun(app, visit.id, plant.ana.auth, c.body(plant));
      expect(res.status).toBe(c.status);
      expect(res.body.error.code).toBe(c.code);
      if (c.path) expect((res.body.error.issues as Array<{ path: string }>).map((i) => i.path)).toContain(c.path);
      // the planned visit is not started by a refused run either
      expect(await runTables()).toEqual(before);
    });
  }

  it('when the visit does not exist, then 404', async () => {
    const res = await postRun(app, crypto.randomUUID(), plant.ana.auth, validRunInput(plant.bankA.id));
    expect(res.status).toBe(404);
  });
});

describe('who may record a run', () => {
  it('when the assigned technician records, then 201; another technician of the site, a planner or a reliability engineer: 403; a technician of another site: 404; nothing stored', async () => {
    const visit = await visitOf(plant);
    const before = await runTables();
    for (const caller of [plant.ben, plant.planner, plant.reliability]) {
      const res = await postRun(app, visit.id, caller.auth, validRunInput(plant.bankA.id));
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const outsider = await postRun(app, visit.id, plant.outsider.auth, validRunInput(plant.bankA.id));
    expect(outsider.status).toBe(404);
    expect((await request(app).get(`/api/visits/${visit.id}/decay-runs`).set('Authorization', plant.outsider.auth)).status).toBe(404);
    expect((await request(app).get(`/api/visits/${visit.id}/decay-runs`).set('Authorization', plant.ben.auth)).status).toBe(200);
    expect(await runTables()).toEqual(before);
    const run = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    expect(run.recordedBy).toEqual({ id: plant.ana.user.id, name: plant.ana.user.name });
  });

  it('when an admin records on a visit under way, then 201; on a planned visit (which only its technician starts), 403', async () => {
    const planned = await visitOf(plant);
    const before = await runTables();
    const refused = await postRun(app, planned.id, plant.admin.auth, validRunInput(plant.bankB.id));
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/only a technician assigned to it may start it/);
    expect(await runTables()).toEqual(before);
    const visit = await visitOf(plant, 'under-way');
    const run = await recordRun(app, visit.id, plant.admin.auth, validRunInput(plant.bankB.id));
    expect(run.recordedBy.id).toBe(plant.admin.user.id);
  });
});

describe('the server judges the run as the phone does', () => {
  async function engineOfBank(bankId: string) {
    const res = await request(app).get(`/api/banks/${bankId}`).set('Authorization', plant.planner.auth);
    return bankEngineInputs(res.body as BankRecordForEngine)!;
  }

  it('when readings are typed out of order with a noisy one, then they are stored as sent and the verdict is judgeRecordedRun of them', async () => {
    const visit = await visitOf(plant);
    const clean = decaySamples({ tauSeconds: TEST_DESIGN_HEALTHY_TAU_SECONDS * 0.85, v0Volts: 538, count: 16, noiseVolts: 0.8 });
    const samples = [clean[0]!, clean[2]!, clean[1]!, ...clean.slice(3)];
    samples[7] = { ...samples[7]!, volts: samples[7]!.volts + 9 };
    const observations = { bankTempC: 34.5, measuredBleederOhms: null, meterInputOhms: 1e6, visualFindings: [] as never[] };
    const body = validRunInput(plant.bankA.id, { samples, observations, source: 'typed' });
    const run = await recordRun(app, visit.id, plant.ana.auth, body);

    expect(run.samples).toEqual(samples);
    const [stored] = await sequelize.query('SELECT samples FROM decay_runs WHERE id = $1', { bind: [run.id] });
    expect((stored as Array<{ samples: unknown }>)[0]!.samples).toEqual(samples);

    const expected = judgeRecordedRun({ samples, engine: await engineOfBank(plant.bankA.id), observations: body.observations });
    expect(run.verdict).toEqual(json(expected));
    expect(expected.status).toBe('ok');
    if (expected.status !== 'ok') return;
    expect(expected.prepared.sorted).toBe(true);
    expect(run).toMatchObject({ tauSeconds: expected.tauSeconds, health: expected.health, capacitanceRatio: expected.baseline!.ratio });
  });

  it('when a visual finding is recorded on a healthy bank, then the stored run is end of life with a safety finding', async () => {
    const visit = await visitOf(plant);
    const run = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankB.id, { observations: { visualFindings: ['bulged-can'] } }));
    expect(run).toMatchObject({ health: 'end-of-life', safetyFinding: true });
    expect(run.verdict.findings?.[0]).toMatchObject({ code: 'visual-finding', severity: 'safety' });
  });

  it('when the readings give no usable fit, then the run is stored as unusable with its reason', async () => {
    const visit = await visitOf(plant);
    const samples = [
      { tSeconds: 0, volts: 540 },
      { tSeconds: 60, volts: 450 },
    ];
    const run = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id, { samples }));
    expect(run.verdict.status).toBe('unusable');
    expect(run.verdict.status === 'unusable' && run.verdict.reason.length).toBeGreaterThan(10);
    expect(run).toMatchObject({ tauSeconds: null, health: null, capacitanceRatio: null, safetyFinding: false, samples });
  });
});

describe('a logger run of many readings', () => {
  it('when a logger file gives 20 000 readings, then the run is stored whole; 20 001 readings are 400 naming samples', async () => {
    const visit = await visitOf(plant);
    const samples = decaySamples({ tauSeconds: TEST_DESIGN_HEALTHY_TAU_SECONDS, v0Volts: 541.3, count: 20_000, stepSeconds: 0.0825, noiseVolts: 0.4 });
    const body = validRunInput(plant.bankA.id, { source: 'logger', loggerFileName: 'DL-850 export 0612.csv', samples });
    expect(JSON.stringify(body).length).toBeGreaterThan(800_000);
    const run = await recordRun(app, visit.id, plant.ana.auth, body);
    expect(run.samples).toHaveLength(20_000);
    expect(run.verdict.status).toBe('ok');
    expect(run.loggerFileName).toBe('DL-850 export 0612.csv');

    const before = await runTables();
    const tooMany = validRunInput(plant.bankA.id, { samples: [...samples, { tSeconds: 1650, volts: 3 }] });
    const res = await postRun(app, visit.id, plant.ana.auth, tooMany);
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('samples');
    expect(await runTables()).toEqual(before);
  }, 120_000);
});

describe('corrections: a new version with its reason', () => {
  it('when a run is corrected, then version 2 supersedes it, both are listed, and a second correction of version 1 is 409', async () => {
    const visit = await visitOf(plant);
    const first = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    const correction = validCorrectionInput({ reason: 'Reading at 2 min was 421 V, not 412 V.' });
    const before = await runTables();
    const res = await request(app).post(`/api/decay-runs/${first.id}/corrections`).set('Authorization', plant.ana.auth).send(correction);
    expect(res.status).toBe(201);
    const second = res.body as DecayRun;
    expect(second).toMatchObject({
      version: 2,
      supersedesId: first.id,
      supersededById: null,
      correctionReason: 'Reading at 2 min was 421 V, not 412 V.',
      visitId: visit.id,
      bankId: plant.bankA.id,
    });
    const after = await runTables();
    expect({ runs: after.runs - before.runs, audits: after.runAudits - before.runAudits, outbox: after.outbox - before.outbox }).toEqual({
      runs: 1,
      audits: 1,
      outbox: 1,
    });

    // the same correction again: the same version 2
    const again = await request(app).post(`/api/decay-runs/${first.id}/corrections`).set('Authorization', plant.ana.auth).send(correction);
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(second.id);

    const listed = await request(app).get(`/api/visits/${visit.id}/decay-runs`).set('Authorization', plant.planner.auth);
    expect(listed.status).toBe(200);
    const items = listed.body.items as DecayRun[];
    expect(items.map((r) => [r.id, r.version, r.supersededById])).toEqual([
      [second.id, 2, null],
      [first.id, 1, second.id],
    ]);

    const twice = await request(app)
      .post(`/api/decay-runs/${first.id}/corrections`)
      .set('Authorization', plant.ana.auth)
      .send(validCorrectionInput({ reason: 'Another try' }));
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('already-corrected');

    const third = await request(app)
      .post(`/api/decay-runs/${second.id}/corrections`)
      .set('Authorization', plant.reliability.auth)
      .send(validCorrectionInput({ reason: 'Meter was the 1 MΩ one', observations: { meterInputOhms: 1e6 } }));
    expect(third.status).toBe(201);
    expect(third.body).toMatchObject({ version: 3, supersedesId: second.id });

    // the visit counts one current run on the bank
    const read = await readVisit(visit.id);
    expect(read.banks.find((b) => b.id === plant.bankA.id)).toMatchObject({ runCount: 1, lastTauSeconds: null });
  });

  it('when someone who did not record the run corrects it (another technician), then 403', async () => {
    const visit = await visitOf(plant);
    const first = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    for (const caller of [plant.ben, plant.planner]) {
      const res = await request(app).post(`/api/decay-runs/${first.id}/corrections`).set('Authorization', caller.auth).send(validCorrectionInput());
      expect(res.status).toBe(403);
    }
  });

  it('when a correction has no reason, then 400 naming reason', async () => {
    const visit = await visitOf(plant);
    const first = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    const res = await request(app)
      .post(`/api/decay-runs/${first.id}/corrections`)
      .set('Authorization', plant.ana.auth)
      .send({ ...validCorrectionInput(), reason: '  ' });
    expect(res.status).toBe(400);
    expect(res.body.error.issues[0].path).toBe('reason');
  });
});

describe('reading runs', () => {
  it("when a bank's runs are read, then every version of every visit is listed newest first, and one run reads by id", async () => {
    const visitA = await visitOf(plant);
    const visitB = await visitOf(plant);
    const older = await recordRun(app, visitA.id, plant.ana.auth, validRunInput(plant.bankB.id));
    const newer = await recordRun(app, visitB.id, plant.ana.auth, validRunInput(plant.bankB.id));
    const res = await request(app).get(`/api/banks/${plant.bankB.id}/decay-runs`).set('Authorization', plant.ben.auth);
    expect(res.status).toBe(200);
    const ids = (res.body.items as DecayRun[]).map((r) => r.id);
    expect(ids.indexOf(newer.id)).toBeLessThan(ids.indexOf(older.id));

    const one = await request(app).get(`/api/decay-runs/${older.id}`).set('Authorization', plant.reliability.auth);
    expect(one.status).toBe(200);
    expect(one.body).toMatchObject({
      id: older.id,
      bankPosition: 'DC2',
      cabinetTag: 'HW-PRESS-VFD-001',
      siteName: 'Harbour Works',
      review: { state: 'pending', comment: '', reviewedBy: null, reviewedAt: null },
      usedAsBaseline: false,
    });
    expect((await request(app).get(`/api/decay-runs/${crypto.randomUUID()}`).set('Authorization', plant.ana.auth)).status).toBe(404);
    expect((await request(app).get(`/api/banks/${crypto.randomUUID()}/decay-runs`).set('Authorization', plant.ana.auth)).status).toBe(404);
  });

  it("when a bank's newest current run is accepted, then the visit shows its τ as lastTauSeconds", async () => {
    const visit = await visitOf(plant);
    const run = await recordRun(app, visit.id, plant.ana.auth, validRunInput(plant.bankA.id));
    await sequelize.query(`UPDATE decay_runs SET review_state = 'accepted', reviewed_at = now() WHERE id = $1`, { bind: [run.id] });
    const later = await visitOf(plant);
    const read = await readVisit(later.id);
    expect(read.banks.find((b) => b.id === plant.bankA.id)).toMatchObject({ runCount: 0, lastTauSeconds: run.tauSeconds });
    const list = await request(app).get('/api/visits').query({ cabinetId: plant.cabinet.id, pageSize: 100 }).set('Authorization', plant.planner.auth);
    const listed = (list.body.items as Visit[]).find((v) => v.id === visit.id)!;
    expect(listed.banks.find((b) => b.id === plant.bankA.id)).toMatchObject({ runCount: 1, lastTauSeconds: run.tauSeconds });
  });
});
