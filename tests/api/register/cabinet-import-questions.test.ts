/**
 * The cabinet import asks what the cabinet form asks: a DC bus far from the supply's rectifier
 * arithmetic and a commissioning date more than a year ahead are questions in the preview, and
 * the import stores such a file only when the request confirms them (`confirmed=true`).
 */
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import { IMPORT_PROBLEMS_LISTED } from '../../../shared/constants/register';
import { cabinetData, countRows, createActor, makeArea, makeSite } from '../../support/register';

const app = createApp();
let planner: Awaited<ReturnType<typeof createActor>>;
let areaId: string;

const HEADER = 'site_code,area,tag,location,drive_make,drive_model,supply_volts,dc_bus_volts,rated_power_kw,marked_wait_minutes,criticality,environment_notes,commissioned_on,status';
/** A date always more than a year after today, whenever the test runs. */
const YEARS_AHEAD = `${new Date().getUTCFullYear() + 2}-01-15`;
/** The words the register uses for a 5 V bus on a 400 V supply (shared/domain/register-plausibility.ts). */
const FIVE_VOLT_BUS = 'A 5 V DC bus on a 400 V supply is unlikely: expect about 540–564 V (1.35–1.41 × the supply).';
const FUTURE_DATE = `The commissioning date ${YEARS_AHEAD} is more than a year ahead: is the year right?`;

beforeAll(async () => {
  planner = await createActor(['planner']);
  const site = await makeSite(planner.actor, { code: 'QST', name: 'Question Works' });
  areaId = (await makeArea(planner.actor, site.id, 'Line 1')).id;
});

const csv = (...rows: string[]) => Buffer.from([HEADER, ...rows].join('\r\n') + '\r\n');

/** The planner's upload of `bytes` to `path` as the form field `file`, with any other form fields. */
const upload = (path: string, bytes: Buffer, filename: string, fields: Record<string, string> = {}) => {
  let req = request(app).post(path).set('Authorization', planner.auth);
  for (const [name, value] of Object.entries(fields)) req = req.field(name, value);
  return req.attach('file', bytes, { filename, contentType: 'text/csv' });
};

const stored = async (): Promise<[number, number, number]> => [await countRows('cabinets'), await countRows('areas'), await countRows('audit_entries')];

/** A file with an ordinary row, a 5 V bus, a commissioning date years ahead, and a new area. */
const questionedFile = (serial: string) =>
  csv(
    `QST,Line 1,QST-L1-VFD-${serial}1,Bay 1,Tarnwick Drives,TW-55,400,540,55,5,high,,2019-04-01,in-service`,
    `QST,Line 1,QST-L1-VFD-${serial}2,Bay 2,Tarnwick Drives,TW-55,400,5,55,5,high,,,in-service`,
    `QST,Line ${serial},QST-LN-VFD-${serial}3,Bay 3,Quellbrook Motion,QM-75,480,650,75,10,medium,,${YEARS_AHEAD},in-service`,
  );

describe('POST /api/cabinets/import/preview: unlikely values', () => {
  it('when rows hold a 5 V bus on 400 V and a date years ahead, then they are questions (row, column, message), apart from the problems', async () => {
    const before = await stored();
    const file = Buffer.concat([questionedFile('10'), Buffer.from('QST,Line 1,QST-L1-VFD-109,,,,four hundred,,,,,,,\r\n')]);
    const res = await upload('/api/cabinets/import/preview', file, 'questions.csv');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ rowCount: 4, validCount: 3, problemCount: 1, questionCount: 2, questionsNotListed: 0, committed: false });
    expect(res.body.problems).toEqual([{ row: 5, column: 'supply_volts', reason: 'supply voltage is missing or not a number' }]);
    expect(res.body.questions).toEqual([
      { row: 3, column: 'dc_bus_volts', message: FIVE_VOLT_BUS },
      { row: 4, column: 'commissioned_on', message: FUTURE_DATE },
    ]);
    expect(res.body.rows.map((r: { questions: unknown[] }) => r.questions.length)).toEqual([0, 1, 1, 0]);
    expect(await stored()).toEqual(before);
  });

  it('when the cabinet form is given the same values, then it asks the same questions in the same words', async () => {
    const res = await request(app)
      .post('/api/cabinets')
      .set('Authorization', planner.auth)
      .send(cabinetData(areaId, { supplyVolts: 400, dcBusVolts: 5, commissionedOn: YEARS_AHEAD }));
    expect(res.status).toBe(422);
    expect(res.body.error.issues).toEqual([
      { path: 'dcBusVolts', message: FIVE_VOLT_BUS },
      { path: 'commissionedOn', message: FUTURE_DATE },
    ]);
  });
});

describe('POST /api/cabinets/import: unlikely values', () => {
  it('when the request does not confirm them, then 422 confirmation-needed naming rows and columns, and nothing is stored', async () => {
    const before = await stored();
    const unconfirming: Array<Record<string, string>> = [{}, { confirmed: 'false' }, { confirmed: 'yes' }];
    for (const fields of unconfirming) {
      const res = await upload('/api/cabinets/import', questionedFile('20'), 'unconfirmed.csv', fields);
      expect(res.status, JSON.stringify(fields)).toBe(422);
      expect(res.body.error.code).toBe('confirmation-needed');
      expect(res.body.error.message).toMatch(/^Are you sure\? 2 unlikely value\(s\) on 2 row\(s\); nothing was imported/);
      expect(res.body.error.issues).toEqual([
        { path: 'row 3, column dc_bus_volts', message: FIVE_VOLT_BUS },
        { path: 'row 4, column commissioned_on', message: FUTURE_DATE },
      ]);
    }
    expect(await stored()).toEqual(before);
  });

  it('when the request confirms them, then every row is stored with its values, each with an audit entry saying what was confirmed', async () => {
    const [cabinets, areas, audit] = await stored();
    const res = await upload('/api/cabinets/import', questionedFile('30'), 'confirmed.csv', { confirmed: 'true' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ committed: true, createdCount: 3, questionCount: 2, newAreas: ['QST / Line 30'] });
    // three cabinets and one new area, each with its audit entry
    expect(await stored()).toEqual([cabinets + 3, areas + 1, audit + 4]);
    const list = await request(app).get('/api/cabinets?q=QST-L&sort=tag').set('Authorization', planner.auth);
    expect(list.body.items).toEqual([
      expect.objectContaining({ tag: 'QST-L1-VFD-301', dcBusVolts: 540 }),
      expect.objectContaining({ tag: 'QST-L1-VFD-302', dcBusVolts: 5 }),
      expect.objectContaining({ tag: 'QST-LN-VFD-303', areaName: 'Line 30', commissionedOn: YEARS_AHEAD }),
    ]);
    const summaries = await Promise.all(
      list.body.items.map(async (c: { id: string }) => {
        const entries = await request(app).get(`/api/cabinets/${c.id}/audit`).set('Authorization', planner.auth);
        return entries.body.items.map((e: { action: string; summary: string }) => `${e.action}: ${e.summary}`);
      }),
    );
    expect(summaries).toEqual([
      ['import: Imported cabinet QST-L1-VFD-301 from confirmed.csv'],
      ['import: Imported cabinet QST-L1-VFD-302 from confirmed.csv (unlikely dc_bus_volts confirmed)'],
      ['import: Imported cabinet QST-LN-VFD-303 from confirmed.csv (unlikely commissioned_on confirmed)'],
    ]);
  });

  it('when a file has problems too, then confirming its questions does not let it in: 400 import-rejected, nothing stored', async () => {
    const before = await stored();
    const file = Buffer.concat([questionedFile('40'), Buffer.from('QST,Line 1,QST-L1-VFD-409,,,,400,,,999,,,,\r\n')]);
    const res = await upload('/api/cabinets/import', file, 'both.csv', { confirmed: 'true' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('import-rejected');
    expect(res.body.error.issues).toEqual([{ path: 'row 5, column marked_wait_minutes', message: 'marked wait time above 240 min' }]);
    expect(await stored()).toEqual(before);
  });
});

describe('the question list', () => {
  const extra = 37;
  const manyQuestions = () =>
    csv(...Array.from({ length: IMPORT_PROBLEMS_LISTED + extra }, (_, i) => `QST,Line 1,QST-MANY-${String(i).padStart(4, '0')},,,,400,5,,,,,,`));

  it('when a file has more questions than are listed, then the preview lists the first ones in row order and counts the rest', async () => {
    const res = await upload('/api/cabinets/import/preview', manyQuestions(), 'many.csv');
    expect(res.body).toMatchObject({ questionCount: IMPORT_PROBLEMS_LISTED + extra, questionsNotListed: extra, problemCount: 0 });
    expect(res.body.questions).toHaveLength(IMPORT_PROBLEMS_LISTED);
    expect(res.body.questions[0]).toEqual({ row: 2, column: 'dc_bus_volts', message: FIVE_VOLT_BUS });
    expect(res.body.questions.at(-1).row).toBe(IMPORT_PROBLEMS_LISTED + 1);
  });

  it('when such a file is imported unconfirmed, then the 422 lists the first ones and says how many more there are', async () => {
    const before = await stored();
    const res = await upload('/api/cabinets/import', manyQuestions(), 'many.csv');
    expect(res.status).toBe(422);
    expect(res.body.error.issues).toHaveLength(IMPORT_PROBLEMS_LISTED);
    expect(res.body.error.message).toContain(`The first ${IMPORT_PROBLEMS_LISTED} are listed; ${extra} more are not.`);
    expect(await stored()).toEqual(before);
  });
});
