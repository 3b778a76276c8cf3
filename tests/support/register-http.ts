/**
 * Register records made over HTTP, as a client makes them, for tests of the API's writes:
 * valid bodies with unique codes and tags, and a POST that must succeed.
 */
import type { Express } from 'express';
import fc from 'fast-check';
import request from 'supertest';
import { expect } from 'vitest';

let serial = 0;
/** A number no other record of this test file has used. */
export const nextSerial = () => (serial += 1);

/** A record as the API answers it. */
export type Answered = Record<string, unknown> & { id: string; version: number };

/** POSTs `body` and expects 201; returns the record. */
export async function postCreated(
  app: Express,
  headers: Record<string, string>,
  path: string,
  body: object,
): Promise<Answered> {
  const res = await request(app).post(path).set(headers).send(body);
  expect(res.status, `POST ${path} ${JSON.stringify(res.body)}`).toBe(201);
  return res.body as Answered;
}

/**
 * Asserts the outcome of simultaneous writes of one unique value: exactly one `winner` status,
 * and every other answer a 409 `duplicate` naming `field` (never a 500).
 */
export function expectOneWinnerRestDuplicate(
  answers: Array<{ status: number; body: { error?: unknown } }>,
  winner: 200 | 201,
  field: string,
): void {
  expect(answers.map((r) => r.status).sort()).toEqual([
    winner,
    ...Array(answers.length - 1).fill(409),
  ]);
  for (const refused of answers.filter((r) => r.status === 409)) {
    expect(refused.body.error).toMatchObject({ code: 'duplicate', issues: [{ path: field }] });
  }
}

/** Reads the version of the record at `path`, for the corpus and the change properties. */
export function targetAt(app: Express, headers: Record<string, string>, path: string) {
  return async () => ({
    version: (await request(app).get(path).set(headers)).body.version as number,
  });
}

export function siteBody(overrides: object = {}) {
  const n = nextSerial();
  return {
    name: `Writes Works ${n}`,
    code: `W${n}`,
    address: '1 Quay Road',
    timeZone: 'Europe/London',
    ...overrides,
  };
}

/** A 400 V drive's cabinet: 540 V bus, marked wait 7 min. */
export function cabinetBody(areaId: string, overrides: object = {}) {
  return {
    areaId,
    tag: `WR-VFD-${String(nextSerial()).padStart(4, '0')}`,
    location: 'Bay 3',
    driveMake: 'Tarnwick Drives',
    driveModel: 'TW-90',
    supplyVolts: 400,
    dcBusVolts: 540,
    ratedPowerKilowatts: 90,
    markedWaitMinutes: 7,
    criticality: 'high',
    environmentNotes: 'Warm mezzanine',
    commissionedOn: '2018-06-11',
    status: 'out-of-service',
    ...overrides,
  };
}

/** An electrolytic series pair: 3 strings of 2 × 4700 µF / 450 V (900 V), 47 kΩ bleeder. */
export function designBody(overrides: object = {}) {
  return {
    code: `WD-${nextSerial()}`,
    name: 'Series pair, 3 strings of 4700 µF',
    notes: 'From the maker’s sheet',
    technology: 'electrolytic',
    unitCapacitanceMicrofarads: 4700,
    unitRatedVolts: 450,
    seriesCount: 2,
    parallelCount: 3,
    bleederOhms: 47_000,
    capacitanceTolerancePercent: 20,
    tempCoefficientPercentPerKelvin: 0.25,
    ratedLifeHours: 5000,
    ratedLifeCelsius: 105,
    ...overrides,
  };
}

export function bankBody(bankDesignId: string, overrides: object = {}) {
  return {
    bankDesignId,
    position: `DC${nextSerial()}`,
    serialNumber: 'SN-1',
    installedOn: '2020-01-15',
    notes: 'Fitted at commissioning',
    ...overrides,
  };
}

export function spareBody(siteId: string, overrides: object = {}) {
  return {
    code: `WSP-${nextSerial()}`,
    kind: 'bank',
    description: 'Spare bank',
    siteId,
    bankDesignId: null,
    storageLocation: 'Store A',
    storageStartedOn: '2024-01-10',
    lastReformedOn: '2024-06-01',
    reformingIntervalDays: 200,
    status: 'in-store',
    notes: 'Shelf 2',
    ...overrides,
  };
}

/** Trimmed text of 1 to `max` characters. */
export const someText = (max: number) =>
  fc.string({ minLength: 1, maxLength: max }).filter((s) => s.trim() === s && s.length > 0);

/** A calendar date between 1985 and 2025. */
export const somePastDate = fc
  .integer({ min: 0, max: 40 * 365 })
  .map((days) => new Date(Date.UTC(1985, 0, 1) + days * 86_400_000).toISOString().slice(0, 10));
