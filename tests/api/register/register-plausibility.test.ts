/**
 * The register refuses what cannot be true and asks "are you sure?" about what is unlikely,
 * naming the field: the rules of shared/domain/register-plausibility.ts as the API applies them.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { storedState } from '../../support/hostile-bodies';
import {
  bankBody,
  cabinetBody,
  designBody,
  postCreated,
  siteBody,
  spareBody,
  type Answered,
} from '../../support/register-http';

const app = createApp();
let admin: Record<string, string>;
let areaId: string;
let siteId: string;
/** 2 × 450 V = 900 V, and 1 × 450 V = 450 V. */
let seriesPair: Answered;
let singleCan: Answered;

const created = (path: string, body: object) => postCreated(app, admin, path, body);
const yearsAhead = (years: number) => `${new Date().getUTCFullYear() + years}-06-01`;

/** Sends a write and expects it refused or questioned with nothing stored; returns the error. */
async function refused(send: () => request.Test, status: number) {
  const before = await storedState();
  const res = await send();
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect(await storedState()).toEqual(before);
  return res.body.error as {
    code: string;
    message: string;
    issues: Array<{ path: string; message: string }>;
  };
}

beforeAll(async () => {
  admin = { Authorization: (await createCaller(['admin'])).auth };
  siteId = (await created('/api/sites', siteBody())).id;
  areaId = (await created(`/api/sites/${siteId}/areas`, { name: 'Plausibility hall' })).id;
  seriesPair = await created('/api/bank-designs', designBody());
  singleCan = await created('/api/bank-designs', designBody({ seriesCount: 1, parallelCount: 2 }));
}, 30_000);

describe('cabinets', () => {
  it('when the DC bus is 5 V on a 400 V supply, then 422 confirmation-needed naming dcBusVolts; confirmed, it is saved', async () => {
    const body = cabinetBody(areaId, { dcBusVolts: 5 });
    const error = await refused(
      () => request(app).post('/api/cabinets').set(admin).send(body),
      422,
    );
    expect(error).toMatchObject({ code: 'confirmation-needed', issues: [{ path: 'dcBusVolts' }] });
    expect(error.issues[0]!.message).toMatch(/5 V DC bus on a 400 V supply is unlikely/);
    const saved = await request(app)
      .post('/api/cabinets')
      .set(admin)
      .send({ ...body, confirmed: true });
    expect(saved.status).toBe(201);
    expect(saved.body.dcBusVolts).toBe(5);
  });

  it('when the DC bus follows the rectifier arithmetic (1.35–1.41 × the supply), then no question', async () => {
    // rectifier arithmetic (DOMAIN.md): 690 V AC → about 930–975 V DC
    const res = await request(app)
      .post('/api/cabinets')
      .set(admin)
      .send(cabinetBody(areaId, { supplyVolts: 690, dcBusVolts: 950 }));
    expect(res.status).toBe(201);
  });

  it('when the commissioning date is two years ahead (or 2200), then 422 naming commissionedOn', async () => {
    for (const date of [yearsAhead(2), '2200-01-01']) {
      const error = await refused(
        () =>
          request(app)
            .post('/api/cabinets')
            .set(admin)
            .send(cabinetBody(areaId, { commissionedOn: date })),
        422,
      );
      expect(error.issues).toEqual([
        expect.objectContaining({
          path: 'commissionedOn',
          message: expect.stringContaining('more than a year ahead'),
        }),
      ]);
    }
  });

  it('when the bus and the date are both unlikely, then both fields are asked about at once', async () => {
    const error = await refused(
      () =>
        request(app)
          .post('/api/cabinets')
          .set(admin)
          .send(cabinetBody(areaId, { dcBusVolts: 400, commissionedOn: '2150-01-01' })),
      422,
    );
    expect(error.issues.map((i) => i.path)).toEqual(['dcBusVolts', 'commissionedOn']);
  });

  it('when an unlikely bus was confirmed, then a later change of another field is not asked about again', async () => {
    const cabinet = await created('/api/cabinets', {
      ...cabinetBody(areaId, { dcBusVolts: 800 }),
      confirmed: true,
    });
    const res = await request(app)
      .patch(`/api/cabinets/${cabinet.id}`)
      .set(admin)
      .send({ version: cabinet.version, location: 'Bay 12' });
    expect(res.status).toBe(200);
    const supply = await request(app)
      .patch(`/api/cabinets/${cabinet.id}`)
      .set(admin)
      .send({ version: res.body.version, supplyVolts: 480 });
    expect(supply.status, 'changing the supply asks about the bus again').toBe(422);
    expect(supply.body.error.issues).toEqual([expect.objectContaining({ path: 'dcBusVolts' })]);
  });

  it('when the marked wait is 0 minutes, then 400 naming markedWaitMinutes, confirmed or not', async () => {
    const error = await refused(
      () =>
        request(app)
          .post('/api/cabinets')
          .set(admin)
          .send({ ...cabinetBody(areaId, { markedWaitMinutes: 0 }), confirmed: true }),
      400,
    );
    expect(error.issues).toEqual([
      expect.objectContaining({
        path: 'markedWaitMinutes',
        message: 'The marked wait time is at least 1 minute; leave it empty when none is marked.',
      }),
    ]);
  });
});

describe('a bank rated below its cabinet’s DC bus', () => {
  let highBus: Answered;

  beforeAll(async () => {
    // 690 V supply, 930 V bus: a single 450 V can cannot sit on it, nor a series pair (900 V)
    highBus = await created(
      '/api/cabinets',
      cabinetBody(areaId, { supplyVolts: 690, dcBusVolts: 930 }),
    );
  });

  it('when a single 450 V can is added to a 930 V bus, then 400 naming bankDesignId even when confirmed', async () => {
    const error = await refused(
      () =>
        request(app)
          .post(`/api/cabinets/${highBus.id}/banks`)
          .set(admin)
          .send({ ...bankBody(singleCan.id), confirmed: true }),
      400,
    );
    expect(error.issues).toEqual([
      expect.objectContaining({
        path: 'bankDesignId',
        message: expect.stringMatching(/rated 450 V, below the cabinet's 930 V DC bus/),
      }),
    ]);
  });

  it('when a cabinet’s bus is raised above the rating of a bank in it, then 400 naming dcBusVolts and nothing changes', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody(areaId));
    await created(
      `/api/cabinets/${cabinet.id}/banks`,
      bankBody(seriesPair.id, { position: 'DC1' }),
    );
    const error = await refused(
      () =>
        request(app)
          .patch(`/api/cabinets/${cabinet.id}`)
          .set(admin)
          .send({ version: cabinet.version, supplyVolts: 690, dcBusVolts: 960, confirmed: true }),
      400,
    );
    expect(error.issues).toEqual([
      expect.objectContaining({
        path: 'dcBusVolts',
        message: expect.stringMatching(
          /^Bank DC1 .* is rated 900 V, below the cabinet's 960 V DC bus/,
        ),
      }),
    ]);
  });

  it('when a bank in a 540 V cabinet is given a design rated 450 V, then 400 naming bankDesignId', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody(areaId));
    const bank = await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(seriesPair.id));
    await refused(
      () =>
        request(app)
          .patch(`/api/banks/${bank.id}`)
          .set(admin)
          .send({ version: bank.version, bankDesignId: singleCan.id }),
      400,
    );
    await refused(
      () =>
        request(app)
          .post(`/api/banks/${bank.id}/replacement`)
          .set(admin)
          .send({ version: bank.version, bankDesignId: singleCan.id, installedOn: '2024-03-01' }),
      400,
    );
  });

  it('when a design in use is changed to a rating below a bus it sits on, then 400 naming unitRatedVolts', async () => {
    const design = await created('/api/bank-designs', designBody());
    const cabinet = await created('/api/cabinets', cabinetBody(areaId));
    await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(design.id));
    const error = await refused(
      () =>
        request(app)
          .patch(`/api/bank-designs/${design.id}`)
          .set(admin)
          .send({ version: design.version, unitRatedVolts: 250 }),
      400,
    );
    expect(error.issues).toEqual([
      expect.objectContaining({
        path: 'unitRatedVolts',
        message: expect.stringContaining("below the cabinet's 540 V DC bus"),
      }),
    ]);
    const fine = await request(app)
      .patch(`/api/bank-designs/${design.id}`)
      .set(admin)
      .send({ version: design.version, unitRatedVolts: 400 });
    expect(fine.status, '2 × 400 V = 800 V still holds a 540 V bus').toBe(200);
  });

  it('when the cabinet’s bus is not known, then any design may go in', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody(areaId, { dcBusVolts: null }));
    expect(
      (
        await request(app)
          .post(`/api/cabinets/${cabinet.id}/banks`)
          .set(admin)
          .send(bankBody(singleCan.id))
      ).status,
    ).toBe(201);
  });
});

describe('baselines and dates', () => {
  let bank: Answered;

  beforeAll(async () => {
    const cabinet = await created('/api/cabinets', cabinetBody(areaId));
    bank = await created(`/api/cabinets/${cabinet.id}/banks`, bankBody(seriesPair.id));
  });

  it('when a hand-entered τ of 218 s goes with 1 µF on a 47 kΩ bleeder, then 422 naming tauSeconds; confirmed, it is saved', async () => {
    const body = {
      version: bank.version,
      source: 'manual',
      tauSeconds: 218,
      capacitanceMicrofarads: 1,
      note: 'Typed in',
    };
    const error = await refused(
      () => request(app).put(`/api/banks/${bank.id}/baseline`).set(admin).send(body),
      422,
    );
    expect(error.issues).toEqual([
      expect.objectContaining({
        path: 'tauSeconds',
        message: expect.stringContaining('R × C is 0.047 s'),
      }),
    ]);
    const saved = await request(app)
      .put(`/api/banks/${bank.id}/baseline`)
      .set(admin)
      .send({ ...body, confirmed: true });
    expect(saved.status).toBe(200);
    expect(saved.body.baseline).toMatchObject({ tauSeconds: 218, source: 'manual' });
  });

  it('when a hand-entered τ is R × C (47 kΩ × 7050 µF = 331 s), then no question', async () => {
    const current = (await request(app).get(`/api/banks/${bank.id}`).set(admin)).body;
    const res = await request(app)
      .put(`/api/banks/${bank.id}/baseline`)
      .set(admin)
      .send({
        version: current.version,
        source: 'manual',
        tauSeconds: 331,
        capacitanceMicrofarads: 7050,
        note: 'Commissioning',
      });
    expect(res.status).toBe(200);
  });

  it('when a bank’s install date is two years ahead, then 422 naming installedOn', async () => {
    const cabinet = await created('/api/cabinets', cabinetBody(areaId));
    const error = await refused(
      () =>
        request(app)
          .post(`/api/cabinets/${cabinet.id}/banks`)
          .set(admin)
          .send(bankBody(seriesPair.id, { installedOn: yearsAhead(2) })),
      422,
    );
    expect(error.issues).toEqual([expect.objectContaining({ path: 'installedOn' })]);
  });

  it('when a spare’s reforming date is years ahead, then 422 naming lastReformedOn; today is not asked about', async () => {
    const spare = await created('/api/spares', spareBody(siteId));
    const error = await refused(
      () =>
        request(app)
          .patch(`/api/spares/${spare.id}`)
          .set(admin)
          .send({ version: spare.version, lastReformedOn: yearsAhead(3) }),
      422,
    );
    expect(error.issues).toEqual([expect.objectContaining({ path: 'lastReformedOn' })]);
    const today = new Date().toISOString().slice(0, 10);
    expect(
      (
        await request(app)
          .patch(`/api/spares/${spare.id}`)
          .set(admin)
          .send({ version: spare.version, lastReformedOn: today })
      ).status,
    ).toBe(200);
  });
});
