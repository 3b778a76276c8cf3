/**
 * The register of the demo scenario: Brackenmoor Processing's three sites, their areas, ~150
 * drive cabinets with ~250 DC-link banks of 8 bank designs (electrolytic series pairs, single
 * cans, film), a few replaced banks with their history, and ~20 spares, some overdue for
 * reforming. Everything is invented; makers and models too.
 *
 * Deterministic (a seeded generator) and idempotent: each record is looked up by its natural
 * key (site code, area name, cabinet tag, design code, spare code) and only missing ones are
 * added, in bulk, so `--cabinets 20000` builds a large fleet in seconds. Every record added
 * gets its audit entry through the one audit writer, in the seed's unit of work, as if the
 * planner (or, for designs, the reliability engineer) made it.
 */
import crypto from 'node:crypto';
import type { Transaction } from 'sequelize';
import type { CapacitorTechnology } from '../../shared/constants/health';
import type { Criticality } from '../../shared/constants/register';
import { defaultDesignLimits } from '../../shared/schemas/bank-design';
import { bankCapacitanceMicrofarads, tauSecondsOf } from '../../shared/domain/capacitance';
import { timeToVoltsSeconds } from '../../shared/domain/discharge-safety';
import { seededRandom } from './seeded-random';
import { reformingDueOn } from '../../shared/schemas/spare';
import { sequelize } from '../../api/src/db/sequelize';
import { User } from '../../api/src/models/user';
import { recordAuditBatch, type AuditRecordInput } from '../../api/src/services/audit';
import type { Actor as Acting, UnitOfWork } from '../../api/src/services/unit-of-work';
import {
  AREA_AUDITED,
  BANK_AUDITED,
  BANK_DESIGN_AUDITED,
  CABINET_AUDITED,
  SITE_AUDITED,
  SPARE_AUDITED,
} from '../../api/src/services/audited-fields';

export interface RegisterSeedOptions {
  /** Cabinets in the register in all; beyond the ~150 of the demo they fill extra areas. */
  cabinets?: number;
}

export interface RegisterSeedSummary {
  sites: number;
  areas: number;
  cabinets: number;
  bankDesigns: number;
  banks: number;
  spares: number;
}

/** Number of cabinets in the demo's own areas. */
export const DEMO_CABINET_COUNT = 150;

// ---------------------------------------------------------------------------------------------
// The scenario
// ---------------------------------------------------------------------------------------------

const SITES = [
  { code: 'M', name: 'Marrowgate Works', address: 'Marrowgate Road, Brackenmoor BK4 7RT', timeZone: 'Europe/London' },
  { code: 'H', name: 'Hollin Quay', address: 'Dock 3, Hollin Quay, Brackenmoor BK2 9QH', timeZone: 'Europe/London' },
  { code: 'S', name: 'Stannet Fen Plant', address: 'Fen Drove, Stannet ST9 2FN', timeZone: 'Europe/London' },
] as const;

/** Areas of each site: number (as in the tags), name, what is there, cabinets. */
const AREAS: Record<string, Array<{ n: number; name: string; description: string; cabinets: number }>> = {
  M: [
    { n: 1, name: 'Line 1 milling', description: 'Roller mills and sifters; flour dust, filtered cabinet air', cabinets: 16 },
    { n: 2, name: 'Line 2 milling', description: 'Second milling line, commissioned with the 2016 extension', cabinets: 16 },
    { n: 3, name: 'Dryer hall', description: 'Belt dryers and exhaust fans; warm, 35-40 °C in summer', cabinets: 14 },
    { n: 4, name: 'Packing hall', description: 'Baggers, palletiser and stretch wrapper', cabinets: 14 },
  ],
  H: [
    { n: 1, name: 'Intake conveyors', description: 'Ship unloader feed and conveyor gallery; salt air', cabinets: 17 },
    { n: 2, name: 'Silo top', description: 'Bucket elevators and distribution conveyors', cabinets: 14 },
    { n: 3, name: 'Pump house', description: 'Fire, process and cooling water pumps', cabinets: 14 },
  ],
  S: [
    { n: 1, name: 'Press hall', description: 'Screw presses and decanters; damp, wash-down', cabinets: 16 },
    { n: 2, name: 'Boiler house', description: 'Boiler feed pumps, FD and ID fans; hot', cabinets: 14 },
    { n: 3, name: 'Effluent plant', description: 'Aeration blowers and sludge pumps', cabinets: 15 },
  ],
};

/** The names of the demo's own areas (not the large fleet's extra halls). */
export const DEMO_AREA_NAMES: readonly string[] = Object.values(AREAS).flatMap((areas) => areas.map((a) => a.name));

/** Invented drive makers and their models: supply volts and rated kW (marked waits: markedWaitMinutesOf). */
const DRIVES = [
  { make: 'Tarnwick Drives', model: 'TW-22', volts: 400, kw: 22, kind: 'VFD' },
  { make: 'Tarnwick Drives', model: 'TW-55', volts: 400, kw: 55, kind: 'VFD' },
  { make: 'Tarnwick Drives', model: 'TW-160', volts: 400, kw: 160, kind: 'VFD' },
  { make: 'Quellbrook Motion', model: 'QM-75', volts: 480, kw: 75, kind: 'VFD' },
  { make: 'Quellbrook Motion', model: 'QM-200', volts: 480, kw: 200, kind: 'VFD' },
  { make: 'Orrin & Vale', model: 'OV-Flux 7', volts: 230, kw: 7.5, kind: 'INV' },
  { make: 'Orrin & Vale', model: 'OV-Flux 30', volts: 400, kw: 30, kind: 'VFD' },
  { make: 'Sablecrest Power', model: 'SC-690 M', volts: 690, kw: 315, kind: 'VFD' },
  { make: 'Hexley Controls', model: 'HX-Servo 8', volts: 400, kw: 8, kind: 'SRV' },
] as const;

interface DesignSeed {
  code: string;
  name: string;
  technology: CapacitorTechnology;
  unitCapacitanceMicrofarads: number;
  unitRatedVolts: number;
  seriesCount: number;
  parallelCount: number;
  bleederOhms: number;
  capacitanceTolerancePercent: number;
  tempCoefficientPercentPerKelvin: number;
  ratedLifeHours: number;
  ratedLifeCelsius: number;
  notes: string;
}

const DESIGNS: DesignSeed[] = [
  { code: 'EL-1S1P-1500', name: 'Single can, 1500 µF / 450 V', technology: 'electrolytic', unitCapacitanceMicrofarads: 1500, unitRatedVolts: 450, seriesCount: 1, parallelCount: 1, bleederOhms: 150_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.3, ratedLifeHours: 5000, ratedLifeCelsius: 105, notes: 'Small 230 V inverters; snap-in can' },
  { code: 'EL-1S2P-3300', name: 'Two single cans in parallel, 3300 µF / 450 V', technology: 'electrolytic', unitCapacitanceMicrofarads: 3300, unitRatedVolts: 450, seriesCount: 1, parallelCount: 2, bleederOhms: 47_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.3, ratedLifeHours: 5000, ratedLifeCelsius: 105, notes: '' },
  { code: 'EL-2S1P-2200', name: 'Series pair, 2200 µF / 450 V cans', technology: 'electrolytic', unitCapacitanceMicrofarads: 2200, unitRatedVolts: 450, seriesCount: 2, parallelCount: 1, bleederOhms: 94_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.25, ratedLifeHours: 8000, ratedLifeCelsius: 105, notes: 'Balancing resistors 2 × 47 kΩ, which are also the bleeder' },
  { code: 'EL-2S2P-3300', name: 'Series pairs, 2 strings of 3300 µF / 450 V', technology: 'electrolytic', unitCapacitanceMicrofarads: 3300, unitRatedVolts: 450, seriesCount: 2, parallelCount: 2, bleederOhms: 66_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.25, ratedLifeHours: 8000, ratedLifeCelsius: 105, notes: 'Balancing resistors 2 × 33 kΩ' },
  { code: 'EL-2S3P-4700', name: 'Series pairs, 3 strings of 4700 µF / 450 V', technology: 'electrolytic', unitCapacitanceMicrofarads: 4700, unitRatedVolts: 450, seriesCount: 2, parallelCount: 3, bleederOhms: 44_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.25, ratedLifeHours: 10_000, ratedLifeCelsius: 105, notes: 'Screw-terminal cans on a laminated busbar' },
  { code: 'EL-2S4P-6800', name: 'Series pairs, 4 strings of 6800 µF / 450 V', technology: 'electrolytic', unitCapacitanceMicrofarads: 6800, unitRatedVolts: 450, seriesCount: 2, parallelCount: 4, bleederOhms: 30_000, capacitanceTolerancePercent: 20, tempCoefficientPercentPerKelvin: 0.25, ratedLifeHours: 10_000, ratedLifeCelsius: 85, notes: 'Large frames; cans rated at 85 °C' },
  { code: 'FI-1S1P-280', name: 'Film, 280 µF / 900 V', technology: 'film', unitCapacitanceMicrofarads: 280, unitRatedVolts: 900, seriesCount: 1, parallelCount: 1, bleederOhms: 330_000, capacitanceTolerancePercent: 5, tempCoefficientPercentPerKelvin: -0.02, ratedLifeHours: 100_000, ratedLifeCelsius: 70, notes: 'Servo amplifiers' },
  { code: 'FI-1S2P-420', name: 'Film, 2 × 420 µF / 1100 V in parallel', technology: 'film', unitCapacitanceMicrofarads: 420, unitRatedVolts: 1100, seriesCount: 1, parallelCount: 2, bleederOhms: 200_000, capacitanceTolerancePercent: 5, tempCoefficientPercentPerKelvin: -0.02, ratedLifeHours: 100_000, ratedLifeCelsius: 70, notes: '690 V drives; no reforming needed in store' },
];

/** Which designs suit a drive of this supply and power. */
function designsFor(volts: number, kw: number, kind: string): string[] {
  if (kind === 'SRV') return ['FI-1S1P-280'];
  if (volts <= 230) return ['EL-1S1P-1500', 'EL-1S2P-3300'];
  if (volts >= 690) return ['FI-1S2P-420'];
  if (kw <= 30) return ['EL-2S1P-2200', 'EL-2S2P-3300'];
  if (kw <= 90) return ['EL-2S2P-3300', 'EL-2S3P-4700'];
  return ['EL-2S3P-4700', 'EL-2S4P-6800'];
}

/** The wait markings makers choose from, minutes. */
const WAIT_MARKINGS_MINUTES = [5, 10, 15, 20, 30, 45, 60];

/**
 * The wait a maker marks on a model: the next standard marking above the slowest nameplate
 * discharge of the model's banks from the nominal bus to 50 V, with the capacitance tolerance
 * as margin (a bank at the top of its tolerance discharges slower).
 */
function markedWaitMinutesOf(drive: (typeof DRIVES)[number]): number {
  const slowestSeconds = Math.max(
    ...designsFor(drive.volts, drive.kw, drive.kind).map((code) => {
      const design = DESIGNS.find((d) => d.code === code)!;
      const tauSeconds = tauSecondsOf(design.bleederOhms, bankCapacitanceMicrofarads(design));
      return timeToVoltsSeconds(tauSeconds * (1 + design.capacitanceTolerancePercent / 100), dcBusVoltsOf(drive), 50);
    }),
  );
  return WAIT_MARKINGS_MINUTES.find((m) => m * 60 >= slowestSeconds) ?? Math.ceil(slowestSeconds / 600) * 10;
}

/** Nominal DC-bus voltage of a drive: about 1.35 × the AC line (DOMAIN.md). */
function dcBusVoltsOf(drive: (typeof DRIVES)[number]): number {
  return Math.round(drive.volts * 1.35);
}

const CRITICALITY_WEIGHTS: Array<[Criticality, number]> = [
  ['low', 0.2],
  ['medium', 0.45],
  ['high', 0.25],
  ['critical', 0.1],
];

// ---------------------------------------------------------------------------------------------
// Bulk insert
// ---------------------------------------------------------------------------------------------

type Row = Record<string, unknown>;
const snake = (name: string) => name.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);

/** Inserts rows with one `INSERT … SELECT unnest(…)` per chunk: one round trip per 5000 rows. */
async function insertRows(table: string, columns: Record<string, string>, rows: Row[], transaction: Transaction): Promise<void> {
  const names = Object.keys(columns);
  for (let start = 0; start < rows.length; start += 5000) {
    const chunk = rows.slice(start, start + 5000);
    const bind = names.map((name) => chunk.map((row) => row[name] ?? null));
    const selects = names.map((name, i) => `$${i + 1}::${columns[name]}[]`).join(', ');
    await sequelize.query(`INSERT INTO ${table} (${names.map(snake).join(', ')}) SELECT * FROM unnest(${selects})`, {
      bind,
      transaction,
    });
  }
}

function pick(row: Row, fields: readonly string[]): Row {
  return Object.fromEntries(fields.map((f) => [f, row[f] instanceof Date ? (row[f] as Date).toISOString() : (row[f] ?? null)]));
}

interface Actor {
  id: string;
  name: string;
}

/** An audit entry naming the demo person the record is made as. */
function auditRow(
  entityType: AuditRecordInput['entityType'],
  entityId: string,
  action: AuditRecordInput['action'],
  actor: Actor | null,
  summary: string,
  before: Row | null,
  after: Row,
): AuditRecordInput {
  return { entityType, entityId, action, actor, summary, before, after };
}

async function existingKeys(sql: string, transaction: Transaction): Promise<Set<string>> {
  const [rows] = await sequelize.query(sql, { transaction });
  return new Set((rows as Array<{ key: string }>).map((r) => r.key));
}

const iso = (d: Date) => d.toISOString().slice(0, 10);
const addDays = (date: string, days: number) => {
  const d = new Date(`${date}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return iso(d);
};

// ---------------------------------------------------------------------------------------------
// The seed
// ---------------------------------------------------------------------------------------------

/**
 * Adds what is missing of the register's demo scenario (and, with `cabinets`, a larger fleet)
 * in the caller's unit of work; dates count back from its instant. Returns how many records
 * of each kind it added.
 */
export async function seedRegister(uow: UnitOfWork<Acting>, options: RegisterSeedOptions = {}): Promise<RegisterSeedSummary> {
  const { transaction, now } = uow;
  // each cabinet draws from a generator of its own, so adding to the fleet never shifts the demo
  let random = seededRandom(20_260_401);
  const chance = (p: number) => random() < p;
  const choose = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)]!;
  const added: RegisterSeedSummary = { sites: 0, areas: 0, cabinets: 0, bankDesigns: 0, banks: 0, spares: 0 };
  const audit: AuditRecordInput[] = [];

  const planner = await User.findOne({ where: { email: 'tomas@brackenmoor.example' }, transaction });
  const engineer = await User.findOne({ where: { email: 'ines@brackenmoor.example' }, transaction });
  const plannerActor: Actor | null = planner ? { id: planner.id, name: planner.name } : null;
  const engineerActor: Actor | null = engineer ? { id: engineer.id, name: engineer.name } : null;

  // sites, by code
  const [siteRows] = await sequelize.query('SELECT id, lower(code) AS code FROM sites', { transaction });
  const siteIdByCode = new Map((siteRows as Array<{ id: string; code: string }>).map((s) => [s.code, s.id]));
  const newSites: Row[] = [];
  for (const site of SITES) {
    if (siteIdByCode.has(site.code.toLowerCase())) continue;
    const row = { id: crypto.randomUUID(), ...site, version: 1, retiredAt: null };
    siteIdByCode.set(site.code.toLowerCase(), row.id);
    newSites.push(row);
    audit.push(auditRow('site', row.id, 'create', plannerActor, `Added site ${site.name}`, null, pick(row, SITE_AUDITED)));
  }
  await insertRows('sites', { id: 'uuid', name: 'text', code: 'text', address: 'text', timeZone: 'text' }, newSites, transaction);
  added.sites = newSites.length;

  // bank designs, by code, each with its first revision
  const [designRows] = await sequelize.query(
    `SELECT d.id, lower(d.code) AS code, v.id AS version_id, v.unit_capacitance_microfarads AS c, v.series_count AS s,
            v.parallel_count AS p, v.bleeder_ohms AS r
       FROM bank_designs d JOIN bank_design_versions v ON v.id = d.current_version_id`,
    { transaction },
  );
  const designByCode = new Map(
    (designRows as Array<{ id: string; code: string; version_id: string; c: number; s: number; p: number; r: number }>).map((d) => [
      d.code,
      { id: d.id, versionId: d.version_id, unitCapacitanceMicrofarads: d.c, seriesCount: d.s, parallelCount: d.p, bleederOhms: d.r },
    ]),
  );
  const newDesigns: Row[] = [];
  const newVersions: Row[] = [];
  for (const design of DESIGNS) {
    if (designByCode.has(design.code.toLowerCase())) continue;
    const id = crypto.randomUUID();
    const versionId = crypto.randomUUID();
    const { code, name, notes, ...technical } = design;
    const version = { id: versionId, bankDesignId: id, revision: 1, ...technical, ...defaultDesignLimits(design.technology), changeNote: 'First revision', createdById: engineerActor?.id ?? null };
    const row = { id, code, name, notes, currentVersionId: versionId, version: 1, retiredAt: null };
    newDesigns.push(row);
    newVersions.push(version);
    designByCode.set(code.toLowerCase(), { id, versionId, ...technical });
    audit.push(
      auditRow('bank-design', id, 'create', engineerActor, `Added bank design ${code}`, null, {
        ...pick(row, BANK_DESIGN_AUDITED),
        revision: 1,
        ...pick(version, Object.keys(technical).concat(['watchRatio', 'endOfLifeRatio', 'inspectionIntervalDays'])),
      }),
    );
  }
  await insertRows('bank_designs', { id: 'uuid', code: 'text', name: 'text', notes: 'text', currentVersionId: 'uuid' }, newDesigns, transaction);
  await insertRows(
    'bank_design_versions',
    {
      id: 'uuid',
      bankDesignId: 'uuid',
      revision: 'int4',
      technology: 'text',
      unitCapacitanceMicrofarads: 'float8',
      unitRatedVolts: 'float8',
      seriesCount: 'int4',
      parallelCount: 'int4',
      bleederOhms: 'float8',
      capacitanceTolerancePercent: 'float8',
      tempCoefficientPercentPerKelvin: 'float8',
      ratedLifeHours: 'int4',
      ratedLifeCelsius: 'float8',
      watchRatio: 'float8',
      endOfLifeRatio: 'float8',
      inspectionIntervalDays: 'int4',
      changeNote: 'text',
      createdById: 'uuid',
    },
    newVersions,
    transaction,
  );
  added.bankDesigns = newDesigns.length;

  // areas: the demo's, then as many "fleet" areas of 100 cabinets as the fleet size needs
  const total = Math.max(options.cabinets ?? DEMO_CABINET_COUNT, DEMO_CABINET_COUNT);
  const plan: Array<{ siteCode: string; n: number; name: string; description: string; cabinets: number }> = [];
  for (const site of SITES) for (const area of AREAS[site.code]!) plan.push({ siteCode: site.code, ...area });
  let remaining = total - plan.reduce((sum, a) => sum + a.cabinets, 0);
  for (let k = 0; remaining > 0; k += 1) {
    const site = SITES[k % SITES.length]!;
    const n = 10 + Math.floor(k / SITES.length);
    const cabinets = Math.min(100, remaining);
    plan.push({ siteCode: site.code, n, name: `Fleet hall ${n}`, description: 'Extra hall of the large-fleet seed', cabinets });
    remaining -= cabinets;
  }
  const [areaRows] = await sequelize.query(`SELECT id, site_id || '|' || lower(name) AS key FROM areas`, { transaction });
  const areaIdByKey = new Map((areaRows as Array<{ id: string; key: string }>).map((a) => [a.key, a.id]));
  const newAreas: Row[] = [];
  for (const area of plan) {
    const siteId = siteIdByCode.get(area.siteCode.toLowerCase())!;
    const key = `${siteId}|${area.name.toLowerCase()}`;
    if (areaIdByKey.has(key)) continue;
    const row = { id: crypto.randomUUID(), siteId, name: area.name, description: area.description, version: 1, retiredAt: null };
    areaIdByKey.set(key, row.id);
    newAreas.push(row);
    audit.push(auditRow('area', row.id, 'create', plannerActor, `Added area ${area.name}`, null, pick(row, AREA_AUDITED)));
  }
  await insertRows('areas', { id: 'uuid', siteId: 'uuid', name: 'text', description: 'text' }, newAreas, transaction);
  added.areas = newAreas.length;

  // cabinets, by tag (in use or retired: a retired demo cabinet is not brought back), and their banks
  const takenTags = await existingKeys('SELECT lower(tag) AS key FROM cabinets', transaction);
  const newCabinets: Row[] = [];
  const newBanks: Row[] = [];
  const replacedLinks: Array<{ oldId: string; newId: string }> = [];
  const baselineAudits: AuditRecordInput[] = [];
  let demoIndex = 0;
  for (const area of plan) {
    const siteId = siteIdByCode.get(area.siteCode.toLowerCase())!;
    const areaId = areaIdByKey.get(`${siteId}|${area.name.toLowerCase()}`)!;
    const counters: Record<string, number> = {};
    for (let i = 0; i < area.cabinets; i += 1) {
      random = seededRandom(20_260_401 + demoIndex);
      const drive = choose(DRIVES);
      const isDemo = demoIndex < DEMO_CABINET_COUNT;
      demoIndex += 1;
      counters[drive.kind] = (counters[drive.kind] ?? 0) + 1;
      const tag = `BRK-${area.siteCode}${area.n}-${drive.kind}-${String(counters[drive.kind]).padStart(3, '0')}`;
      const year = 2008 + Math.floor(random() * 17);
      const commissionedOn = `${year}-${String(1 + Math.floor(random() * 12)).padStart(2, '0')}-${String(1 + Math.floor(random() * 28)).padStart(2, '0')}`;
      let r = random();
      const criticality = CRITICALITY_WEIGHTS.find(([, w]) => (r -= w) < 0)?.[0] ?? 'medium';
      const outOfService = chance(0.04);
      const bankCount = drive.kind === 'SRV' ? 1 + (chance(0.5) ? 1 : 0) + (chance(0.3) ? 1 : 0) : 1 + (chance(0.4) ? 1 : 0) + (chance(0.15) ? 1 : 0);
      const bankDesigns = Array.from({ length: bankCount }, () => choose(designsFor(drive.volts, drive.kw, drive.kind)));
      const replaced = Array.from({ length: bankCount }, () => year < 2015 && chance(isDemo ? 0.12 : 0.05));
      const manual = Array.from({ length: bankCount }, () => chance(0.08));
      const bay = 1 + Math.floor(random() * 12);
      if (takenTags.has(tag.toLowerCase())) continue;
      takenTags.add(tag.toLowerCase());

      const cabinet = {
        id: crypto.randomUUID(),
        areaId,
        tag,
        location: `${area.name}, bay ${bay}`,
        driveMake: drive.make,
        driveModel: drive.model,
        supplyVolts: drive.volts,
        dcBusVolts: dcBusVoltsOf(drive),
        ratedPowerKilowatts: drive.kw * bankCount,
        markedWaitMinutes: markedWaitMinutesOf(drive),
        criticality,
        environmentNotes: area.description.split(';')[1]?.trim() ?? '',
        commissionedOn,
        status: outOfService ? 'out-of-service' : 'in-service',
        version: 1,
        retiredAt: null,
      };
      newCabinets.push(cabinet);
      audit.push(auditRow('cabinet', cabinet.id, 'create', plannerActor, `Added cabinet ${tag} to ${area.name}`, null, pick(cabinet, CABINET_AUDITED)));

      for (let b = 0; b < bankCount; b += 1) {
        const design = designByCode.get(bankDesigns[b]!.toLowerCase())!;
        const capacitance = bankCapacitanceMicrofarads(design);
        const nameplate = {
          baselineTauSeconds: tauSecondsOf(design.bleederOhms, capacitance),
          baselineCapacitanceMicrofarads: capacitance,
          baselineSource: 'nameplate',
          baselineSetAt: now,
          baselineSetById: plannerActor?.id ?? null,
          baselineDesignVersionId: design.versionId,
          baselineDecayRunId: null,
          baselineNote: '',
        };
        const bank = {
          id: crypto.randomUUID(),
          cabinetId: cabinet.id,
          bankDesignId: design.id,
          position: `Drive ${b + 1} DC link`,
          serialNumber: `${bankDesigns[b]!.slice(0, 2)}${year % 100}-${String(Math.floor(random() * 90_000) + 10_000)}`,
          installedOn: commissionedOn,
          notes: '',
          status: 'in-service',
          ...nameplate,
          replacesBankId: null as string | null,
          replacedByBankId: null,
          replacedOn: null as string | null,
          version: 1,
          retiredAt: null,
        };
        if (replaced[b]) {
          // the original bank, replaced years later: its record stays; the new one starts afresh
          const replacedOn = addDays(commissionedOn, 2200 + Math.floor(random() * 1200));
          const original = { ...bank, status: 'replaced', replacedOn };
          const successor = {
            ...bank,
            id: crypto.randomUUID(),
            serialNumber: `${bank.serialNumber}-R`,
            installedOn: replacedOn,
            replacesBankId: original.id,
            notes: 'Replaced after the cans bulged',
          };
          newBanks.push(original, successor);
          replacedLinks.push({ oldId: original.id, newId: successor.id });
          audit.push(auditRow('bank', original.id, 'create', plannerActor, `Added bank ${bank.position} to cabinet ${tag}`, null, pick({ ...original, status: 'in-service', replacedOn: null }, BANK_AUDITED)));
          audit.push(
            auditRow('bank', original.id, 'replace', plannerActor, `Replaced bank ${bank.position} on ${replacedOn}: bulged cans`, pick({ ...original, status: 'in-service', replacedOn: null }, BANK_AUDITED), pick({ ...original, replacedByBankId: successor.id }, BANK_AUDITED)),
          );
          audit.push(auditRow('bank', successor.id, 'create', plannerActor, `Installed bank ${bank.position} in place of the replaced one`, null, pick(successor, BANK_AUDITED)));
        } else if (manual[b] && engineerActor) {
          // a commissioning measurement entered by the reliability engineer
          const measured = {
            ...bank,
            baselineCapacitanceMicrofarads: Math.round(capacitance * (0.96 + random() * 0.06)),
            baselineSource: 'manual',
            baselineSetById: engineerActor.id,
            baselineDesignVersionId: null,
            baselineNote: 'Commissioning measurement',
          };
          measured.baselineTauSeconds = Math.round(tauSecondsOf(design.bleederOhms, measured.baselineCapacitanceMicrofarads) * 10) / 10;
          newBanks.push(measured);
          audit.push(auditRow('bank', bank.id, 'create', plannerActor, `Added bank ${bank.position} to cabinet ${tag}`, null, pick(bank, BANK_AUDITED)));
          baselineAudits.push(auditRow('bank', bank.id, 'baseline', engineerActor, `Set the baseline of bank ${bank.position} by hand`, pick(bank, BANK_AUDITED), pick(measured, BANK_AUDITED)));
        } else {
          newBanks.push(bank);
          audit.push(auditRow('bank', bank.id, 'create', plannerActor, `Added bank ${bank.position} to cabinet ${tag}`, null, pick(bank, BANK_AUDITED)));
        }
      }
    }
  }
  await insertRows(
    'cabinets',
    {
      id: 'uuid',
      areaId: 'uuid',
      tag: 'text',
      location: 'text',
      driveMake: 'text',
      driveModel: 'text',
      supplyVolts: 'float8',
      dcBusVolts: 'float8',
      ratedPowerKilowatts: 'float8',
      markedWaitMinutes: 'int4',
      criticality: 'text',
      environmentNotes: 'text',
      commissionedOn: 'date',
      status: 'text',
    },
    newCabinets,
    transaction,
  );
  await insertRows(
    'banks',
    {
      id: 'uuid',
      cabinetId: 'uuid',
      bankDesignId: 'uuid',
      position: 'text',
      serialNumber: 'text',
      installedOn: 'date',
      notes: 'text',
      status: 'text',
      baselineTauSeconds: 'float8',
      baselineCapacitanceMicrofarads: 'float8',
      baselineSource: 'text',
      baselineSetAt: 'timestamptz',
      baselineSetById: 'uuid',
      baselineDesignVersionId: 'uuid',
      baselineNote: 'text',
      replacesBankId: 'uuid',
      replacedOn: 'date',
    },
    newBanks,
    transaction,
  );
  if (replacedLinks.length) {
    await sequelize.query(
      `UPDATE banks b SET replaced_by_bank_id = l.new_id FROM unnest($1::uuid[], $2::uuid[]) AS l(old_id, new_id) WHERE b.id = l.old_id`,
      { bind: [replacedLinks.map((l) => l.oldId), replacedLinks.map((l) => l.newId)], transaction },
    );
  }
  added.cabinets = newCabinets.length;
  added.banks = newBanks.length;

  // spares, by code. Their dates count back from the day of seeding, so the demo always has
  // about a third of its spares overdue for reforming, whenever it is started.
  const today = iso(now);
  const takenSpares = await existingKeys('SELECT lower(code) AS key FROM spares', transaction);
  const spareRandom = seededRandom(7_331);
  const newSpares: Row[] = [];
  const sparePlan = [
    ...DESIGNS.filter((d) => d.technology === 'electrolytic').flatMap((d) => [d.code, d.code]),
    'FI-1S1P-280',
    'FI-1S2P-420',
  ];
  const driveSpares = ['Tarnwick Drives TW-55', 'Tarnwick Drives TW-160', 'Quellbrook Motion QM-75', 'Orrin & Vale OV-Flux 30', 'Sablecrest Power SC-690 M', 'Hexley Controls HX-Servo 8'];
  const stores = ['Main store, rack B', 'Electrical store, shelf 4', 'Workshop cage', 'Quayside store, bay 2'];
  const spareSeeds = [
    ...sparePlan.map((code) => ({ kind: 'bank' as const, designCode: code, description: `Spare bank ${code}` })),
    ...driveSpares.map((drive) => ({ kind: 'drive' as const, designCode: null, description: `Spare drive ${drive}` })),
  ];
  spareSeeds.forEach((spare, index) => {
    const code = `BRK-SP-${String(index + 1).padStart(3, '0')}`;
    const site = SITES[index % SITES.length]!;
    const film = spare.designCode?.startsWith('FI');
    const reformingIntervalDays = film ? 1825 : spare.kind === 'drive' ? 730 : 365;
    const overdue = index % 3 === 0 && !film;
    // days since the last reforming (or, never reformed, since it went into store)
    const sinceLast = overdue
      ? reformingIntervalDays + 10 + Math.floor(spareRandom() * 200)
      : 20 + Math.floor(spareRandom() * (reformingIntervalDays - 60));
    const reformed = spareRandom() < 0.5;
    const lastEvent = addDays(today, -sinceLast);
    const storageStartedOn = reformed ? addDays(lastEvent, -(200 + Math.floor(spareRandom() * 600))) : lastEvent;
    const lastReformedOn = reformed ? lastEvent : null;
    if (takenSpares.has(code.toLowerCase())) return;
    const design = spare.designCode ? designByCode.get(spare.designCode.toLowerCase()) : undefined;
    const row = {
      id: crypto.randomUUID(),
      code,
      kind: spare.kind,
      description: spare.description,
      siteId: siteIdByCode.get(site.code.toLowerCase())!,
      bankDesignId: design?.id ?? null,
      storageLocation: stores[index % stores.length]!,
      storageStartedOn,
      lastReformedOn,
      reformingIntervalDays,
      reformingDueOn: reformingDueOn(storageStartedOn, lastReformedOn, reformingIntervalDays),
      status: index % 9 === 8 ? 'issued' : 'in-store',
      notes: film ? 'Film: reforming not needed; checked every 5 years' : '',
      version: 1,
      retiredAt: null,
    };
    newSpares.push(row);
    audit.push(auditRow('spare', row.id, 'create', plannerActor, `Added spare ${code}`, null, pick(row, SPARE_AUDITED)));
  });
  await insertRows(
    'spares',
    {
      id: 'uuid',
      code: 'text',
      kind: 'text',
      description: 'text',
      siteId: 'uuid',
      bankDesignId: 'uuid',
      storageLocation: 'text',
      storageStartedOn: 'date',
      lastReformedOn: 'date',
      reformingIntervalDays: 'int4',
      reformingDueOn: 'date',
      status: 'text',
      notes: 'text',
    },
    newSpares,
    transaction,
  );
  added.spares = newSpares.length;

  await recordAuditBatch(uow, [...audit, ...baselineAudits]);
  return added;
}
