/**
 * Shutdown window writes: a change moves only what it names, and 1,000 hostile bodies per
 * write route never get a 5xx and store nothing when refused.
 */
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createCaller } from '../../support/auth';
import { assertChangesOnlyWhatTheyName } from '../../support/change-property';
import { assertCorpusHolds, CURRENT_VERSION } from '../../support/hostile-bodies';
import { postCreated, siteBody, someText, targetAt, type Answered } from '../../support/register-http';

const app = createApp();
let planner: Record<string, string>;
let areaA: Answered;
let areaB: Answered;

const created = (path: string, body: object) => postCreated(app, planner, path, body);

beforeAll(async () => {
  planner = { Authorization: (await createCaller(['planner'])).auth };
  const site = await created('/api/sites', siteBody({ timeZone: 'Europe/Berlin' }));
  areaA = await created(`/api/sites/${site.id}/areas`, { name: 'Press line', description: '' });
  areaB = await created(`/api/sites/${site.id}/areas`, { name: 'Paint shop', description: '' });
}, 30_000);

// Saturday 9 January 2027, 06:00–14:00 Berlin (CET) = 05:00Z–13:00Z
const windowBody = () => ({
  areaId: areaA.id,
  title: 'Weekend stop',
  startsAt: '2027-01-09T05:00:00.000Z',
  endsAt: '2027-01-09T13:00:00.000Z',
  recurrence: null,
  notes: '',
});

/** An instant between `from` and `to` (whole minutes), UTC ISO. */
const instantBetween = (from: string, to: string) =>
  fc.integer({ min: Date.parse(from) / 60_000, max: Date.parse(to) / 60_000 }).map((m) => new Date(m * 60_000).toISOString());

describe('a change changes only what it names', () => {
  it('when a window change names any one field, then every other field stays as it was', async () => {
    const window = await created('/api/shutdown-windows', windowBody());
    await assertChangesOnlyWhatTheyName(app, {
      path: `/api/shutdown-windows/${window.id}`,
      headers: planner,
      fields: {
        title: someText(120),
        notes: someText(500),
        areaId: fc.constantFrom(areaA.id, areaB.id),
        // starts always before the earliest end, ends always after the latest start, at most 2 days apart
        startsAt: instantBetween('2027-01-08T05:00:00Z', '2027-01-09T05:00:00Z'),
        endsAt: instantBetween('2027-01-09T13:00:00Z', '2027-01-10T05:00:00Z'),
        recurrence: fc.constantFrom(null, 'FREQ=WEEKLY', 'FREQ=WEEKLY;COUNT=4', 'FREQ=MONTHLY;INTERVAL=3'),
      },
      follows: { areaId: ['areaName'], recurrence: ['recurrenceText'] },
    });
  }, 120_000);
});

describe('a corpus of hostile bodies never gets a 5xx and stores nothing when refused', () => {
  it('POST /api/shutdown-windows', async () => {
    const tally = await assertCorpusHolds(app, { method: 'post', path: '/api/shutdown-windows', headers: planner }, {
      ...windowBody(),
      recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8',
    });
    expect(tally[201]).toBeGreaterThan(0);
  }, 300_000);

  it('PATCH /api/shutdown-windows/:id', async () => {
    const path = `/api/shutdown-windows/${(await created('/api/shutdown-windows', windowBody())).id}`;
    const tally = await assertCorpusHolds(
      app,
      { method: 'patch', path, headers: planner, target: targetAt(app, planner, path) },
      { ...windowBody(), recurrence: 'FREQ=WEEKLY;COUNT=3', version: CURRENT_VERSION },
    );
    expect(tally[200]).toBeGreaterThan(0);
  }, 300_000);

  it('DELETE /api/shutdown-windows/:id (the version in the query)', async () => {
    const path = `/api/shutdown-windows/${(await created('/api/shutdown-windows', windowBody())).id}`;
    await assertCorpusHolds(app, { method: 'delete', path: (q) => `${path}?version=${q}`, headers: planner, target: targetAt(app, planner, path) }, {});
  }, 300_000);
});
