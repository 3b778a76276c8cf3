import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { IMPORT_MAX_BYTES } from '../../../shared/constants/register';
import { countRows, createActor, makeArea, makeCabinet, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let technician: Awaited<ReturnType<typeof createActor>>;

const HEADER = 'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';

beforeAll(async () => {
  planner = await createActor(['planner']);
  technician = await createActor(['technician']);
  const site = await makeSite(planner.actor, { code: 'IMP', name: 'Import Works' });
  const area = await makeArea(planner.actor, site.id, 'Line 1');
  await makeCabinet(planner.actor, area.id, { tag: 'IMP-L1-VFD-900' });
});

const csv = (...rows: string[]) => Buffer.from([HEADER, ...rows].join('\r\n') + '\r\n');

/** The planner's upload of `bytes` to `path`, as the form field `file`. */
const upload = (path: string, bytes: Buffer, filename: string, contentType = 'text/csv') =>
  request(app).post(path).set('Authorization', planner.auth).attach('file', bytes, { filename, contentType });

describe('GET /api/cabinets/import/template', () => {
  it('when a planner downloads it, then a CSV with every column that the preview accepts', async () => {
    const res = await request(app).get('/api/cabinets/import/template').set('Authorization', planner.auth);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="?ebbline-cabinet-register-template.csv"?/);
    expect(res.text.split('\r\n')[0]).toBe(HEADER);
  });

  it('when a technician asks, then 403; without a header, 401', async () => {
    expect((await request(app).get('/api/cabinets/import/template').set('Authorization', technician.auth)).status).toBe(403);
    expect((await request(app).get('/api/cabinets/import/template')).status).toBe(401);
  });
});

describe('POST /api/cabinets/import/preview', () => {
  it('when one row is bad, then the preview names its row, column and reason, and stores nothing', async () => {
    const before = await countRows('cabinets');
    const res = await upload(
      '/api/cabinets/import/preview',
      csv(
        'IMP,Line 1,IMP-L1-VFD-001,Bay 1,Tarnwick Drives,TW-55,400,540,55,5,high,,2019-04-01,in-service',
        'IMP,Line 1,IMP-L1-VFD-002,Bay 2,Tarnwick Drives,TW-55,four hundred,,,,,,,',
        'IMP,Line 9,IMP-L9-VFD-001,Bay 3,Quellbrook Motion,QM-200,"690",,,,,,,',
      ),
      'register.csv',
    );
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rowCount: 3, validCount: 2, problemCount: 1, committed: false, newAreas: ['IMP / Line 9'] });
    expect(res.body.problems).toEqual([{ row: 3, column: 'supply_volts', reason: 'supply voltage is missing or not a number' }]);
    expect(res.body.rows[2]).toMatchObject({ row: 4, newArea: true, problems: [] });
    expect(await countRows('cabinets')).toBe(before);
  });

  it('when tags clash with the register or each other and the site is unknown, then each is named', async () => {
    const res = await upload(
      '/api/cabinets/import/preview',
      csv(
        'IMP,Line 1,imp-l1-vfd-900,,,,400,,,,,,,',
        'IMP,Line 1,IMP-L1-VFD-010,,,,400,,,,,,,',
        'IMP,Line 1,IMP-L1-VFD-010,,,,400,,,,,,,',
        'NOPE,Line 1,NOPE-1,,,,400,,,,urgent,,2020-13-01,',
      ),
      'clash.csv',
    );
    expect(res.body.problems).toEqual([
      { row: 2, column: 'tag', reason: 'IMP-L1-VFD-900 is already in the register' },
      { row: 4, column: 'tag', reason: 'IMP-L1-VFD-010 is also on row 3' },
      { row: 5, column: 'criticality', reason: expect.stringContaining('criticality must be one of') },
      { row: 5, column: 'commissioned_on', reason: 'commissioning date must be YYYY-MM-DD' },
    ]);
  });

  it('when a required column is missing, then row 1 names it', async () => {
    const res = await upload('/api/cabinets/import/preview', Buffer.from('site_code,area,tag\nIMP,Line 1,X-1\n'), 'short.csv');
    expect(res.body.problems).toContainEqual({ row: 1, column: 'supply_volts', reason: 'this column is missing from the header' });
  });

  it('when the file comes from a European spreadsheet (semicolons, decimal commas, BOM, Windows-1252), then it reads', async () => {
    const text = ['\uFEFFSite code;Area;Tag;Supply volts;Rated power kW;Location', 'IMP;Line 1;IMP-L1-VFD-050;400;7,5;Bay 5'].join('\r\n');
    const res = await upload('/api/cabinets/import/preview', Buffer.from(text, 'utf8'), 'excel.csv', 'application/vnd.ms-excel');
    expect(res.body).toMatchObject({ rowCount: 1, validCount: 1, problemCount: 0 });
    const latin = Buffer.concat([Buffer.from('site_code,area,tag,supply_volts,location\nIMP,Line 1,IMP-L1-VFD-051,400,Gr'), Buffer.from([0xfc]), Buffer.from('n hall\n')]);
    const read = await upload('/api/cabinets/import/preview', latin, 'latin.csv');
    expect(read.body.rows[0].values.location).toBe('Grün hall');
  });

  it('when the file is not CSV, then 415; too large, then 413; no file, then 400 naming file', async () => {
    const pdf = await upload('/api/cabinets/import/preview', Buffer.from('%PDF-1.4'), 'register.pdf', 'application/pdf');
    expect(pdf.status).toBe(415);
    expect(pdf.body.error.code).toBe('unsupported-file');
    const big = await upload('/api/cabinets/import/preview', Buffer.alloc(IMPORT_MAX_BYTES + 10, 'a'), 'big.csv');
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('file-too-large');
    const none = await request(app).post('/api/cabinets/import/preview').set('Authorization', planner.auth).field('note', 'x');
    expect(none.status).toBe(400);
    expect(none.body.error.issues[0].path).toBe('file');
  });

  it('when a technician tries, then 403; without a header, 401', async () => {
    const file = csv('IMP,Line 1,IMP-L1-VFD-070,,,,400,,,,,,,');
    expect((await request(app).post('/api/cabinets/import/preview').set('Authorization', technician.auth).attach('file', file, 'a.csv')).status).toBe(403);
    expect((await request(app).post('/api/cabinets/import/preview').attach('file', file, 'a.csv')).status).toBe(401);
  });
});

describe('POST /api/cabinets/import', () => {
  it('when one row of the file is bad, then 400 naming it and nothing at all is stored', async () => {
    const [cabinets, areas, audit] = [await countRows('cabinets'), await countRows('areas'), await countRows('audit_entries')];
    const res = await upload(
      '/api/cabinets/import',
      csv(
        'IMP,Line 1,IMP-L1-VFD-101,,,,400,,,,,,,',
        'IMP,Line 7,IMP-L7-VFD-101,,,,400,,,,,,,',
        'IMP,Line 1,IMP-L1-VFD-102,,,,400,,,999,,,,',
      ),
      'one-bad.csv',
    );
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('import-rejected');
    expect(res.body.error.message).toMatch(/nothing was imported/);
    expect(res.body.error.issues).toEqual([{ path: 'row 4, column marked_wait_minutes', message: 'marked wait time above 240 min' }]);
    expect([await countRows('cabinets'), await countRows('areas'), await countRows('audit_entries')]).toEqual([cabinets, areas, audit]);
  });

  it('when every row is good, then all are stored in one go, new areas too, each with an audit entry', async () => {
    const res = await upload(
      '/api/cabinets/import',
      csv(
        'IMP,Line 1,IMP-L1-VFD-201,Bay 1,Tarnwick Drives,TW-55,400,540,55,5,high,dusty,2019-04-01,in-service',
        'IMP,Line 8,IMP-L8-VFD-201,,,,480,,,,,,,out-of-service',
      ),
      'good.csv',
    );
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ committed: true, createdCount: 2, newAreas: ['IMP / Line 8'] });
    const list = await request(app).get('/api/cabinets?q=VFD-201&sort=tag').set('Authorization', technician.auth);
    expect(list.body.items).toEqual([
      expect.objectContaining({ tag: 'IMP-L1-VFD-201', areaName: 'Line 1', criticality: 'high', markedWaitMinutes: 5, commissionedOn: '2019-04-01' }),
      expect.objectContaining({ tag: 'IMP-L8-VFD-201', areaName: 'Line 8', status: 'out-of-service', supplyVolts: 480 }),
    ]);
    const audit = await request(app).get(`/api/cabinets/${list.body.items[0].id}/audit`).set('Authorization', technician.auth);
    expect(audit.body.items).toEqual([
      expect.objectContaining({ action: 'import', summary: 'Imported cabinet IMP-L1-VFD-201 from good.csv', actor: { id: planner.user.id, name: planner.user.name } }),
    ]);
  });

  it('when a technician tries, then 403; without a header, 401', async () => {
    const file = csv('IMP,Line 1,IMP-L1-VFD-301,,,,400,,,,,,,');
    expect((await request(app).post('/api/cabinets/import').set('Authorization', technician.auth).attach('file', file, 'a.csv')).status).toBe(403);
    expect((await request(app).post('/api/cabinets/import').attach('file', file, 'a.csv')).status).toBe(401);
  });
});
