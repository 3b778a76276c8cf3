/**
 * One mapping from a bank to the decay engine's inputs: the server, from its records, and the
 * browser, from the bank's answer, hand the engine the same design, baseline and cabinet.
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { bankEngineInputs } from '../../../shared/domain/bank-engine-inputs';
import { bankRecordForEngine, getBank, setBankBaseline } from '../../../api/src/services/banks';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import {
  createActor,
  makeArea,
  makeBank,
  makeCabinet,
  makeDesign,
  makeSite,
} from '../../support/register';

const app = createApp();
let engineer: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  engineer = await createActor(['planner', 'reliability']);
});

/** The engine's inputs of a bank as the server maps them and as the browser maps its answer. */
async function bothSides(bankId: string) {
  const server = bankEngineInputs(bankRecordForEngine(await getBank(bankId)));
  const answer = await request(app).get(`/api/banks/${bankId}`).set('Authorization', engineer.auth);
  expect(answer.status).toBe(200);
  return { server, browser: bankEngineInputs(answer.body) };
}

describe('bankEngineInputs on both sides', () => {
  it('when a bank has a nameplate baseline, then the server and the browser judge with the same inputs', async () => {
    const site = await makeSite(engineer.actor);
    const area = await makeArea(engineer.actor, site.id);
    const cabinet = await makeCabinet(engineer.actor, area.id, {
      supplyVolts: 480,
      dcBusVolts: 650,
      markedWaitMinutes: 15,
    });
    const design = await makeDesign(engineer.actor, {
      tempCoefficientPercentPerKelvin: 0.3,
      bleederOhms: 39_000,
    });
    const bank = await makeBank(engineer.actor, cabinet.id, design.id);
    const { server, browser } = await bothSides(bank.id);
    expect(server).not.toBeNull();
    expect(browser).toEqual(server);
    expect(server).toMatchObject({
      design: {
        bleederOhms: 39_000,
        capacitanceTemperature: { kind: 'coefficient', perKelvin: 0.003 },
      },
      baseline: { source: 'nameplate' },
      cabinet: { nominalBusVolts: 650, markedWaitSeconds: 900 },
    });
  });

  it('when the baseline was set by hand and the cabinet has no marked wait, then both sides still agree', async () => {
    const site = await makeSite(engineer.actor);
    const area = await makeArea(engineer.actor, site.id);
    const cabinet = await makeCabinet(engineer.actor, area.id, { markedWaitMinutes: null });
    const design = await makeDesign(engineer.actor);
    const bank = await makeBank(engineer.actor, cabinet.id, design.id);
    await withUnitOfWork(engineer.actor, (uow) =>
      setBankBaseline(uow, bank.id, {
        version: bank.version,
        source: 'manual',
        tauSeconds: 300,
        capacitanceMicrofarads: 6800,
        note: 'measured',
      }),
    );
    const { server, browser } = await bothSides(bank.id);
    expect(browser).toEqual(server);
    expect(server).toMatchObject({
      baseline: { capacitanceMicrofarads: 6800, source: 'decay-run' },
      cabinet: { nominalBusVolts: 540 },
    });
    expect(server!.cabinet.markedWaitSeconds).toBeUndefined();
  });
});
