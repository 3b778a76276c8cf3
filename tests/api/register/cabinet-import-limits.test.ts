/**
 * The cabinet import costs what its limits say: reading stops at the row limit, the problem
 * list is capped, and other requests are served while a large file is being read.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { IMPORT_MAX_BYTES, IMPORT_MAX_ROWS, IMPORT_PROBLEMS_LISTED, IMPORT_ROWS_LISTED } from '../../../shared/constants/register';
import { countRows, createActor, makeArea, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;

const HEADER = 'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';

beforeAll(async () => {
  planner = await createActor(['planner']);
  const site = await makeSite(planner.actor, { code: 'LIM', name: 'Limit Works' });
  await makeArea(planner.actor, site.id, 'Line 1');
});

/** A header and `count` rows made by `row` (numbered from 0), LF line ends. */
const csvOf = (count: number, row: (i: number) => string) => {
  const rows = Array.from({ length: count }, (_, i) => row(i));
  return Buffer.from(`${HEADER}\n${rows.join('\n')}\n`);
};
/** Rows whose one problem is a supply voltage in words. */
const badSupply = (i: number) => `LIM,Line 1,LIM-L1-VFD-${i},,,,four hundred,,,,,,,`;
/** The file of the report: a header, then a million one-character rows (2 MB, under the size limit). */
const millionRows = () => Buffer.from(`${HEADER}\n${'x\n'.repeat(1_000_000)}`);

const upload = (path: string, bytes: Buffer, filename: string) =>
  request(app).post(path).set('Authorization', planner.auth).attach('file', bytes, { filename, contentType: 'text/csv' });

const stored = async () => [await countRows('cabinets'), await countRows('areas'), await countRows('audit_entries')];

describe('the problem list', () => {
  it('when a preview finds more problems than it lists, then it lists the first ones in row order and counts the rest', async () => {
    const rows = IMPORT_PROBLEMS_LISTED + 137;
    const res = await upload('/api/cabinets/import/preview', csvOf(rows, badSupply), 'many-bad.csv');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rowCount: rows, validCount: 0, problemCount: rows, problemsNotListed: 137 });
    expect(res.body.problems).toHaveLength(IMPORT_PROBLEMS_LISTED);
    expect(res.body.problems[0]).toEqual({ row: 2, column: 'supply_volts', reason: 'supply voltage is missing or not a number' });
    expect(res.body.problems.at(-1).row).toBe(IMPORT_PROBLEMS_LISTED + 1);
    expect(res.body.rows).toHaveLength(IMPORT_ROWS_LISTED);
  });

  it('when every problem fits the list, then none is left out', async () => {
    const res = await upload('/api/cabinets/import/preview', csvOf(3, badSupply), 'three-bad.csv');
    expect(res.body).toMatchObject({ problemCount: 3, problemsNotListed: 0 });
    expect(res.body.problems).toHaveLength(3);
  });

  it('when a commit is refused for more problems than it lists, then it names the count, lists the first ones and stores nothing', async () => {
    const before = await stored();
    const rows = IMPORT_PROBLEMS_LISTED + 50;
    const res = await upload('/api/cabinets/import', csvOf(rows, badSupply), 'many-bad.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('import-rejected');
    expect(res.body.error.message).toContain(`${rows} problem(s) on ${rows} row(s); nothing was imported`);
    expect(res.body.error.message).toContain(`The first ${IMPORT_PROBLEMS_LISTED} are listed; 50 more are not.`);
    expect(res.body.error.issues).toHaveLength(IMPORT_PROBLEMS_LISTED);
    expect(res.body.error.issues[0]).toEqual({ path: 'row 2, column supply_volts', message: 'supply voltage is missing or not a number' });
    expect(await stored()).toEqual(before);
  });
});

describe('a large good file', () => {
  it('when 600 good rows are imported (several statements), then every cabinet is stored with its audit entry, in one go', async () => {
    const [cabinets, audit] = [await countRows('cabinets'), await countRows('audit_entries')];
    const res = await upload('/api/cabinets/import', csvOf(600, (i) => `LIM,Line 1,LIM-BULK-${String(i).padStart(4, '0')},,,,400,,,,,,,`), 'bulk.csv');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ committed: true, createdCount: 600, rowCount: 600, problemCount: 0, problemsNotListed: 0 });
    expect(res.body.rows).toHaveLength(IMPORT_ROWS_LISTED);
    expect([await countRows('cabinets'), await countRows('audit_entries')]).toEqual([cabinets + 600, audit + 600]);
  });
});

describe('the row limit', () => {
  it('when the file has a million one-character rows, then the preview answers 413 naming the limit, in a small answer', async () => {
    const file = millionRows();
    expect(file.length).toBeLessThan(IMPORT_MAX_BYTES);
    const res = await upload('/api/cabinets/import/preview', file, 'million.csv');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file-too-large');
    expect(res.body.error.message).toBe(`The file has more than 5,000 rows; import at most 5,000 at a time. Split it and import the parts.`);
    expect(res.body.error.issues).toEqual([{ path: 'file', message: res.body.error.message }]);
    expect(res.text.length).toBeLessThan(200 * 1024);
  });

  it('when the same file is imported, then 413 and nothing at all is stored', async () => {
    const before = await stored();
    const res = await upload('/api/cabinets/import', millionRows(), 'million.csv');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file-too-large');
    expect(res.text.length).toBeLessThan(200 * 1024);
    expect(await stored()).toEqual(before);
  });

  it('when the file has exactly the row limit, then it reads; one row more, and it is refused', async () => {
    const exact = await upload('/api/cabinets/import/preview', csvOf(IMPORT_MAX_ROWS, badSupply), 'exact.csv');
    expect(exact.status).toBe(200);
    expect(exact.body).toMatchObject({ rowCount: IMPORT_MAX_ROWS, problemCount: IMPORT_MAX_ROWS, problemsNotListed: IMPORT_MAX_ROWS - IMPORT_PROBLEMS_LISTED });
    const over = await upload('/api/cabinets/import/preview', csvOf(IMPORT_MAX_ROWS + 1, badSupply), 'over.csv');
    expect(over.status).toBe(413);
  });
});

describe('other requests while a large file is read', () => {
  let server: http.Server;
  let port: number;
  /** Called when the server has read the whole body of an upload: the import's reading starts next. */
  let uploadRead: (() => void) | undefined;
  beforeAll(async () => {
    server = http.createServer((req, res) => {
      if (req.url === '/api/cabinets/import/preview') req.once('end', () => uploadRead?.());
      void app(req, res);
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    port = (server.address() as AddressInfo).port;
  });
  afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

  /** Sends a multipart upload of `bytes` to the preview. */
  function sendUpload(bytes: Buffer): Promise<{ status: number; body: string }> {
    const boundary = 'ebbline-limits-boundary';
    const body = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\n`),
      bytes,
      Buffer.from(`\r\n--${boundary}--\r\n`),
    ]);
    return new Promise((resolve, reject) => {
      const req = http.request(
        {
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: '/api/cabinets/import/preview',
          headers: { Authorization: planner.auth, 'Content-Type': `multipart/form-data; boundary=${boundary}`, 'Content-Length': body.length },
        },
        (res) => {
          let text = '';
          res.setEncoding('utf8');
          res.on('data', (c: string) => (text += c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text }));
        },
      );
      req.on('error', reject);
      req.end(body);
    });
  }

  function getHealth(): Promise<number> {
    return new Promise((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: '/api/health' }, (res) => {
          res.resume();
          res.on('end', () => resolve(res.statusCode ?? 0));
        })
        .on('error', reject);
    });
  }

  it('when a file at the row limit is being read, then /api/health is answered before the import answers', async () => {
    expect(await getHealth()).toBe(200); // a warm database pool: the health check then needs no new connection
    // wide rows at the row limit: the largest work a file within the limits can ask for, all of it parsing and checking
    const wide = `,${'w'.repeat(80)},${'w'.repeat(80)},four hundred,x,y,z,unknown,dusty,someday,gone`;
    const file = csvOf(IMPORT_MAX_ROWS, (i) => `LIM,Line 1,LIM-WIDE-${i},${'l'.repeat(150)}${wide}`);
    expect(file.length).toBeLessThan(IMPORT_MAX_BYTES);
    const order: string[] = [];
    let health: Promise<void> | undefined;
    // the health check is asked for only once the server holds the whole file, so it arrives while the file is read
    uploadRead = () => {
      health = getHealth().then((status) => {
        order.push(`health ${status}`);
      });
    };
    await sendUpload(file).then((res) => {
      order.push(`import ${res.status}`);
    });
    uploadRead = undefined;
    await health;
    expect(order).toEqual(['health 200', 'import 200']);
  });
});
