import { readFileSync } from 'node:fs';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { createSite } from '../../../api/src/services/sites';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import { countRows, createActor, makeArea } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;

const fixture = (name: string) => readFileSync(new URL(`../../fixtures/shutdown-windows/${name}`, import.meta.url));

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
  const site = await withUnitOfWork(planner.actor, (uow) =>
    createSite(uow, { name: 'Import Windows Works', code: 'SWI', address: '', timeZone: 'Europe/Berlin' }),
  );
  await makeArea(planner.actor, site.id, 'Press line');
});

const upload = (path: string, bytes: Buffer, filename = 'windows.csv', fields: Record<string, string> = {}) => {
  let req = request(app).post(path).set('Authorization', planner.auth);
  for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
  return req.attach('file', bytes, { filename, contentType: 'text/csv' });
};

const stored = async () => ({ windows: await countRows('shutdown_windows'), audit: await countRows('audit_entries') });

describe('GET /api/shutdown-windows/import/template', () => {
  it('when a planner downloads it, then the columns the import reads; a technician gets 403', async () => {
    const res = await request(app).get('/api/shutdown-windows/import/template').set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.text.split('\r\n')[0]).toBe('site,area,title,start,end,recurrence,notes');
    expect((await request(app).get('/api/shutdown-windows/import/template').set('Authorization', technician.auth)).status).toBe(403);
  });
});

describe('POST /api/shutdown-windows/import/preview', () => {
  it('when the file is messy, then every problem is named by row and column and nothing is stored', async () => {
    const before = await stored();
    const res = await upload('/api/shutdown-windows/import/preview', fixture('messy.csv'), 'messy.csv');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rowCount: 10, validCount: 1, problemCount: 9, committed: false });
    const byRow = Object.fromEntries(res.body.problems.map((p: { row: number; column: string }) => [p.row, p.column]));
    expect(byRow).toEqual({
      3: 'start', // 09/01/2027: not YYYY-MM-DD
      4: 'start', // 30 February
      5: 'end', // end before start
      6: 'area', // no Paint shop
      7: 'site', // no site NOPE
      8: 'recurrence', // FREQ=FORTNIGHTLY
      9: 'recurrence', // a Friday start for a Saturday rule
      10: 'title', // missing
      11: 'title', // the same as row 2
    });
    expect(res.body.problems.find((p: { row: number }) => p.row === 11).reason).toBe('the same window is also on row 2');
    expect(await stored()).toEqual(before);
  });

  it('when the file has a BOM, semicolons, capitalised headers and a site named by name, then its times are read in the site’s zone', async () => {
    const res = await upload('/api/shutdown-windows/import/preview', fixture('semicolons-bom.csv'), 'semicolons.csv');
    expect(res.body).toMatchObject({ rowCount: 2, validCount: 2, problemCount: 0, questionCount: 0 });
    // 2027-01-09 06:00 CET = 05:00Z; 2027-07-12 07:00 CEST = 05:00Z (EU Directive 2000/84/EC summer time)
    expect(res.body.rows[0]).toMatchObject({
      timeZone: 'Europe/Berlin',
      startsAt: '2027-01-09T05:00:00.000Z',
      endsAt: '2027-01-09T13:00:00.000Z',
      recurrence: 'FREQ=WEEKLY;BYDAY=SA;COUNT=8',
      recurrenceText: 'every week on Saturday for 8 times',
    });
    expect(res.body.rows[0].values.notes).toBe('Trafo-Prüfung first');
    expect(res.body.rows[1]).toMatchObject({ startsAt: '2027-07-12T05:00:00.000Z', endsAt: '2027-07-16T15:00:00.000Z', recurrence: null });
  });

  it('when a rule with semicolons is not quoted in a semicolon file, then the row has too many cells', async () => {
    const res = await upload('/api/shutdown-windows/import/preview', fixture('semicolons-unquoted-rule.csv'));
    expect(res.body.problemCount).toBeGreaterThan(0);
    expect(res.body.problems[0].reason).toMatch(/more cells than the header.*quotes/);
  });

  it('when a required column is missing, then the header row names it', async () => {
    const res = await upload('/api/shutdown-windows/import/preview', Buffer.from('site,area,title,start\nSWI,Press line,x,2027-01-09 06:00\n'));
    expect(res.body.problems).toContainEqual({ row: 1, column: 'end', reason: 'this column is missing from the header' });
  });
});

describe('POST /api/shutdown-windows/import', () => {
  it('when the file has problems, then 400 import-rejected naming row and column and nothing is stored', async () => {
    const before = await stored();
    const res = await upload('/api/shutdown-windows/import', fixture('messy.csv'));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('import-rejected');
    expect(res.body.error.issues[0]).toEqual({ path: 'row 3, column start', message: expect.stringContaining('09/01/2027 06:00') });
    expect(await stored()).toEqual(before);
  });

  it('when a start is in the past or a window lasts weeks, then 422 confirmation-needed until confirmed=true', async () => {
    const before = await stored();
    const preview = await upload('/api/shutdown-windows/import/preview', fixture('past-and-long.csv'));
    expect(preview.body.questions.map((q: { row: number; column: string }) => `${q.row}:${q.column}`)).toEqual(['2:start', '3:end']);
    const refused = await upload('/api/shutdown-windows/import', fixture('past-and-long.csv'));
    expect(refused.status).toBe(422);
    expect(refused.body.error.code).toBe('confirmation-needed');
    expect(await stored()).toEqual(before);
    const confirmed = await upload('/api/shutdown-windows/import', fixture('past-and-long.csv'), 'past.csv', { confirmed: 'true' });
    expect(confirmed.status).toBe(201);
    expect(confirmed.body).toMatchObject({ committed: true, createdCount: 2 });
    expect(await stored()).toEqual({ windows: before.windows + 2, audit: before.audit + 2 });
  });

  it('when a good file is imported, then every row is a window with an import entry; importing it again is refused as already there', async () => {
    const before = await stored();
    const res = await upload('/api/shutdown-windows/import', fixture('semicolons-bom.csv'), 'semicolons.csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ committed: true, createdCount: 2 });
    expect(await stored()).toEqual({ windows: before.windows + 2, audit: before.audit + 2 });
    const list = await request(app)
      .get('/api/shutdown-windows?from=2027-01-01T00:00:00Z&to=2027-01-17T00:00:00Z')
      .set('Authorization', technician.auth);
    const weekend = list.body.items.find((w: { title: string }) => w.title === 'Weekend stop');
    expect(weekend.occurrences.map((o: { startsAt: string }) => o.startsAt)).toEqual(['2027-01-09T05:00:00.000Z', '2027-01-16T05:00:00.000Z']);
    const again = await upload('/api/shutdown-windows/import', fixture('semicolons-bom.csv'), 'semicolons.csv');
    expect(again.status).toBe(400);
    expect(again.body.error.issues[0].message).toMatch(/already in the register/);
  });

  it('when a technician uploads, then 403 and nothing is stored', async () => {
    const before = await stored();
    const res = await request(app)
      .post('/api/shutdown-windows/import')
      .set('Authorization', technician.auth)
      .attach('file', fixture('semicolons-bom.csv'), { filename: 'w.csv', contentType: 'text/csv' });
    expect(res.status).toBe(403);
    expect(await stored()).toEqual(before);
  });
});
