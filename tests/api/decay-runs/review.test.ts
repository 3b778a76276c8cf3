/**
 * The review of decay runs (`POST /api/decay-runs/:runId/review`): who may review, a query
 * needs a comment that reaches the technician, an accepted run can become the bank's baseline
 * (read back from the bank), only the current version is reviewed, and a logged visit becomes
 * reviewed with its last run.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { sequelize } from '../../../api/src/db/sequelize';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { transitionVisit } from '../../../api/src/services/visits';
import type { Bank } from '../../../shared/schemas/bank';
import type { DecayRun } from '../../../shared/schemas/decay-run';
import { validCorrectionInput, validRunInput } from '../../support/decay-runs';
import { assertCorpusHolds } from '../../support/hostile-bodies';
import { makePlace, storeVisitUnderWay } from '../../support/planner-visits';
import { createActor } from '../../support/register';

const app = createApp();
type Actor = Awaited<ReturnType<typeof createActor>>;
let reliability: Actor;
let admin: Actor;
let planner: Actor;
let technician: Actor;

beforeAll(async () => {
  reliability = await createActor(['reliability']);
  admin = await createActor(['admin']);
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
});

/** A cabinet of two fresh banks and a visit of the technician's to it, under way. */
async function visitUnderWay() {
  const place = await makePlace(planner.actor);
  const visit = await storeVisitUnderWay(place, technician.user.id);
  return { ...place, visitId: visit.id };
}

/** Records a run over HTTP as the visit's technician. */
async function recordRun(visitId: string, bankId: string, overrides: Parameters<typeof validRunInput>[1] = {}): Promise<DecayRun> {
  const res = await request(app)
    .post(`/api/visits/${visitId}/decay-runs`)
    .set('Authorization', technician.auth)
    .send(validRunInput(bankId, overrides));
  if (res.status !== 201) throw new Error(`run not recorded: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body as DecayRun;
}

/** The technician marks the visit logged (as at the end of the work). */
async function logVisit(visitId: string) {
  const [rows] = (await sequelize.query('SELECT version FROM visits WHERE id = $1', { bind: [visitId] })) as [Array<{ version: number }>, unknown];
  await withUnitOfWork(technician.actor, (uow) => transitionVisit(uow, visitId, { action: 'log', version: rows[0]!.version }));
}

async function visitState(visitId: string): Promise<string> {
  const [rows] = (await sequelize.query('SELECT state FROM visits WHERE id = $1', { bind: [visitId] })) as [Array<{ state: string }>, unknown];
  return rows[0]!.state;
}

/** What a refused review must leave untouched: the run's review, the audit trail, the outbox, the bank's baseline, the visit. */
async function footprint(runId: string) {
  const [rows] = await sequelize.query(
    `SELECT r.review_state, r.review_comment, r.reviewed_by_id, r.reviewed_at,
            b.baseline_source, b.baseline_decay_run_id, b.version AS bank_version,
            v.state AS visit_state, v.version AS visit_version,
            (SELECT count(*)::int FROM audit_entries) AS audits,
            (SELECT count(*)::int FROM outbox_messages) AS messages
       FROM decay_runs r JOIN banks b ON b.id = r.bank_id JOIN visits v ON v.id = r.visit_id WHERE r.id = $1`,
    { bind: [runId] },
  );
  return rows[0] as Record<string, unknown>;
}

function review(runId: string, caller: Actor, body: Record<string, unknown>) {
  return request(app).post(`/api/decay-runs/${runId}/review`).set('Authorization', caller.auth).send(body);
}

describe('POST /api/decay-runs/:runId/review: who may review', () => {
  it('when a technician or a planner reviews, then 403 and nothing changes; a reliability engineer and an admin get 200', async () => {
    const place = await visitUnderWay();
    const first = await recordRun(place.visitId, place.banks[0]!.id);
    const second = await recordRun(place.visitId, place.banks[1]!.id);
    const before = await footprint(first.id);
    for (const caller of [technician, planner]) {
      const res = await review(first.id, caller, { outcome: 'accepted', comment: '' });
      expect(res.status).toBe(403);
    }
    expect(await footprint(first.id)).toEqual(before);

    const byReliability = await review(first.id, reliability, { outcome: 'accepted', comment: '' });
    expect(byReliability.status).toBe(200);
    expect(byReliability.body).toMatchObject({
      id: first.id,
      review: { state: 'accepted', comment: '', reviewedBy: { id: reliability.user.id } },
    });
    const byAdmin = await review(second.id, admin, { outcome: 'accepted', comment: 'Fine.' });
    expect(byAdmin.status).toBe(200);
    expect(byAdmin.body.review).toMatchObject({ state: 'accepted', comment: 'Fine.', reviewedBy: { id: admin.user.id } });
  });
});

describe('POST /api/decay-runs/:runId/review: a query and its comment', () => {
  it('when a run is queried without a comment, then 400 names comment and nothing changes', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    const before = await footprint(run.id);
    for (const body of [{ outcome: 'queried', comment: '' }, { outcome: 'queried', comment: '   \n ' }, { outcome: 'queried' }]) {
      const res = await review(run.id, reliability, body);
      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('comment');
    }
    expect(await footprint(run.id)).toEqual(before);
  });

  it('when a run is queried with a comment, then the technician reads the comment on the run, with the audit entry and the outbox message', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    const comment = 'The reading at 2 min looks mistyped: check the paper sheet and correct the run.';
    const res = await review(run.id, reliability, { outcome: 'queried', comment: `  ${comment} ` });
    expect(res.status).toBe(200);
    const read = await request(app).get(`/api/decay-runs/${run.id}`).set('Authorization', technician.auth);
    expect(read.status).toBe(200);
    expect(read.body.review).toMatchObject({ state: 'queried', comment, reviewedBy: { id: reliability.user.id, name: reliability.user.name } });
    expect(Date.parse(read.body.review.reviewedAt)).not.toBeNaN();
    const listed = await request(app).get(`/api/visits/${place.visitId}/decay-runs`).set('Authorization', technician.auth);
    expect(listed.body.items.find((r: DecayRun) => r.id === run.id).review.comment).toBe(comment);

    const [audits] = await sequelize.query(
      `SELECT action, actor_id, summary FROM audit_entries WHERE entity_type = 'decay-run' AND entity_id = $1 AND action = 'review'`,
      { bind: [run.id] },
    );
    expect(audits).toEqual([expect.objectContaining({ action: 'review', actor_id: reliability.user.id, summary: expect.stringContaining(comment) })]);
    const [messages] = await sequelize.query(`SELECT payload FROM outbox_messages WHERE topic = 'decay-run.reviewed' AND payload->>'runId' = $1`, {
      bind: [run.id],
    });
    expect(messages).toEqual([{ payload: expect.objectContaining({ runId: run.id, visitId: place.visitId, bankId: run.bankId, outcome: 'queried' }) }]);
  });
});

describe('POST /api/decay-runs/:runId/review: use this run as the baseline', () => {
  it('when a run is accepted as the baseline, then the bank answers with the run’s τ and capacitance, set by the reviewer, with an audit entry', async () => {
    const place = await visitUnderWay();
    const bankId = place.banks[0]!.id;
    const run = await recordRun(place.visitId, bankId);
    expect(run.verdict.status).toBe('ok');
    const res = await review(run.id, reliability, { outcome: 'accepted', comment: 'First run of the new bank.', useAsBaseline: true });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: run.id, usedAsBaseline: true, review: { state: 'accepted' } });

    const bank = (await request(app).get(`/api/banks/${bankId}`).set('Authorization', reliability.auth)).body as Bank;
    if (run.verdict.status !== 'ok') throw new Error('unreachable');
    const expectedMicrofarads = run.verdict.capacitance.at20CMicrofarads ?? run.verdict.capacitance.comparedMicrofarads;
    expect(bank.baseline).toMatchObject({ source: 'decay-run', decayRunId: run.id, setBy: { id: reliability.user.id } });
    expect(bank.baseline.tauSeconds).toBeCloseTo(run.verdict.tauSeconds, 6);
    expect(bank.baseline.capacitanceMicrofarads).toBeCloseTo(expectedMicrofarads, 6);
    // the design's test bank is read at 28 °C: the baseline is the capacitance normalised to 20 °C when the design says how
    expect(Date.parse(bank.baseline.setAt)).toBeGreaterThan(Date.now() - 60_000);

    const [bankAudits] = await sequelize.query(
      `SELECT action, actor_id, after FROM audit_entries WHERE entity_type = 'bank' AND entity_id = $1 AND action = 'baseline'`,
      { bind: [bankId] },
    );
    expect(bankAudits).toHaveLength(1);
    expect(bankAudits[0]).toMatchObject({ actor_id: reliability.user.id });
    const [messages] = await sequelize.query(`SELECT payload FROM outbox_messages WHERE topic = 'decay-run.reviewed' AND payload->>'runId' = $1`, {
      bind: [run.id],
    });
    expect(messages).toEqual([{ payload: expect.objectContaining({ outcome: 'accepted', baselineSet: true }) }]);
  });

  it('when the run gave no trustworthy τ, then using it as the baseline is refused with 422 and nothing changes', async () => {
    const place = await visitUnderWay();
    // a flat line: no decay to fit
    const flat = Array.from({ length: 6 }, (_, i) => ({ tSeconds: i * 30, volts: 540 }));
    const run = await recordRun(place.visitId, place.banks[0]!.id, { samples: flat });
    expect(run.verdict.status).toBe('unusable');
    const before = await footprint(run.id);
    const res = await review(run.id, reliability, { outcome: 'accepted', comment: '', useAsBaseline: true });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('baseline-refused');
    expect(await footprint(run.id)).toEqual(before);
  });

  it('when useAsBaseline comes with a query, then 400 names useAsBaseline', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    const res = await review(run.id, reliability, { outcome: 'queried', comment: 'Why so low?', useAsBaseline: true });
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('useAsBaseline');
  });
});

describe('POST /api/decay-runs/:runId/review: versions', () => {
  it('when a queried run was corrected, then its old version is refused with 409 and the new version is reviewed', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    expect((await review(run.id, reliability, { outcome: 'queried', comment: 'Check the reading at 2 min.' })).status).toBe(200);
    const corrected = await request(app)
      .post(`/api/decay-runs/${run.id}/corrections`)
      .set('Authorization', technician.auth)
      .send(validCorrectionInput());
    expect(corrected.status).toBe(201);
    const before = await footprint(run.id);
    const old = await review(run.id, reliability, { outcome: 'accepted', comment: '' });
    expect(old.status).toBe(409);
    expect(old.body.error.code).toBe('superseded');
    expect(await footprint(run.id)).toEqual(before);
    const current = await review(corrected.body.id, reliability, { outcome: 'accepted', comment: 'Corrected: fine now.' });
    expect(current.status).toBe(200);
    expect(current.body).toMatchObject({ id: corrected.body.id, version: 2, review: { state: 'accepted' } });
  });

  it('when the run does not exist, then 404', async () => {
    const res = await review(crypto.randomUUID(), reliability, { outcome: 'accepted', comment: '' });
    expect(res.status).toBe(404);
  });
});

describe('POST /api/decay-runs/:runId/review: the visit', () => {
  it('when a logged visit’s last run is reviewed, then the visit becomes reviewed (not before), with its audit entry', async () => {
    const place = await visitUnderWay();
    const first = await recordRun(place.visitId, place.banks[0]!.id);
    const second = await recordRun(place.visitId, place.banks[1]!.id);
    await logVisit(place.visitId);
    expect((await review(first.id, reliability, { outcome: 'queried', comment: 'Readings stop at 200 V: take the run to 50 V next time.' })).status).toBe(200);
    expect(await visitState(place.visitId)).toBe('logged');
    expect((await review(second.id, reliability, { outcome: 'accepted', comment: '' })).status).toBe(200);
    expect(await visitState(place.visitId)).toBe('reviewed');
    const visit = await request(app).get(`/api/visits/${place.visitId}`).set('Authorization', reliability.auth);
    expect(visit.body).toMatchObject({ state: 'reviewed' });
    const [audits] = await sequelize.query(
      `SELECT actor_id FROM audit_entries WHERE entity_type = 'visit' AND entity_id = $1 AND action = 'review'`,
      { bind: [place.visitId] },
    );
    expect(audits).toEqual([{ actor_id: reliability.user.id }]);
    const [messages] = await sequelize.query(`SELECT payload FROM outbox_messages WHERE topic = 'decay-run.reviewed' AND payload->>'visitId' = $1 ORDER BY id`, {
      bind: [place.visitId],
    });
    expect(messages.map((m) => (m as { payload: { visitReviewed: boolean } }).payload.visitReviewed)).toEqual([false, true]);
  });

  it('when a run of a visit still under way is reviewed, then the run is reviewed and the visit stays under way', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    const res = await review(run.id, reliability, { outcome: 'accepted', comment: '' });
    expect(res.status).toBe(200);
    expect(res.body.review.state).toBe('accepted');
    expect(await visitState(place.visitId)).toBe('under-way');
  });
});

describe('POST /api/decay-runs/:runId/review: a corpus of hostile bodies', () => {
  it('when 1,000 hostile bodies are sent, then never a 5xx, and a refusal stores nothing', async () => {
    const place = await visitUnderWay();
    const run = await recordRun(place.visitId, place.banks[0]!.id);
    const tally = await assertCorpusHolds(
      app,
      { method: 'post', path: `/api/decay-runs/${run.id}/review`, headers: { Authorization: reliability.auth } },
      { outcome: 'accepted', comment: 'Fine.', useAsBaseline: true },
    );
    expect(tally[200]).toBeGreaterThan(0);
    expect(tally[400]).toBeGreaterThan(0);
  }, 300_000);
});

describe('GET /api/review-queue', () => {
  async function queuedIds(caller: Actor = reliability): Promise<string[]> {
    const res = await request(app).get('/api/review-queue?pageSize=200').set('Authorization', caller.auth);
    expect(res.status).toBe(200);
    return (res.body.items as Array<{ id: string }>).map((v) => v.id);
  }

  it('when a technician or a planner asks for the queue, then 403', async () => {
    for (const caller of [technician, planner]) {
      expect((await request(app).get('/api/review-queue').set('Authorization', caller.auth)).status).toBe(403);
    }
    expect((await request(app).get('/api/review-queue').set('Authorization', admin.auth)).status).toBe(200);
  });

  it('when a queried run of a reviewed visit is corrected, then the visit is back in the queue until the correction is reviewed', async () => {
    const place = await visitUnderWay();
    const first = await recordRun(place.visitId, place.banks[0]!.id);
    const second = await recordRun(place.visitId, place.banks[1]!.id);
    // under way: not yet the reviewers'
    expect(await queuedIds()).not.toContain(place.visitId);
    await logVisit(place.visitId);
    const queue = await request(app).get('/api/review-queue?pageSize=200').set('Authorization', reliability.auth);
    expect(queue.body.items.find((v: { id: string }) => v.id === place.visitId)).toMatchObject({ state: 'logged', cabinetTag: place.cabinet.tag });
    expect(queue.body.total).toBeGreaterThanOrEqual(1);

    await review(first.id, reliability, { outcome: 'queried', comment: 'Check the reading at 2 min.' });
    await review(second.id, reliability, { outcome: 'accepted', comment: '' });
    expect(await visitState(place.visitId)).toBe('reviewed');
    expect(await queuedIds()).not.toContain(place.visitId);

    const corrected = await request(app)
      .post(`/api/decay-runs/${first.id}/corrections`)
      .set('Authorization', technician.auth)
      .send(validCorrectionInput());
    expect(corrected.status).toBe(201);
    expect(await queuedIds()).toContain(place.visitId);
    expect((await review(corrected.body.id, reliability, { outcome: 'accepted', comment: 'Fine now.' })).status).toBe(200);
    expect(await queuedIds()).not.toContain(place.visitId);
    expect(await visitState(place.visitId)).toBe('reviewed');
  });

  it('when the page is out of bounds, then 400 names it', async () => {
    const res = await request(app).get('/api/review-queue?pageSize=5000').set('Authorization', reliability.auth);
    expect(res.status).toBe(400);
    expect(res.body.error.issues.map((i: { path: string }) => i.path)).toContain('pageSize');
  });
});
