/**
 * Factories for register tests: records made through the services (as a planner or a
 * reliability engineer would), with unique names, so each test states only what it cares about.
 */
import type { Role } from '../../shared/constants/roles';
import type { BankDesignData } from '../../shared/schemas/bank-design';
import type { CabinetData } from '../../shared/schemas/cabinet';
import type { SpareData } from '../../shared/schemas/spare';
import type { AuthUser } from '../../api/src/types/express';
import { createArea } from '../../api/src/services/areas';
import { createBankDesign } from '../../api/src/services/bank-designs';
import { createBank } from '../../api/src/services/banks';
import { createCabinet } from '../../api/src/services/cabinets';
import { createSite } from '../../api/src/services/sites';
import { createSpare } from '../../api/src/services/spares';
import { withUnitOfWork } from '../../api/src/services/unit-of-work';
import { createCaller, type TestCaller } from './auth';

let serial = 0;
const next = () => (serial += 1);

/** A caller and the acting user the services take. */
export async function createActor(roles: Role[]): Promise<TestCaller & { actor: AuthUser }> {
  const caller = await createCaller(roles);
  return { ...caller, actor: { id: caller.user.id, name: caller.user.name, email: caller.user.email, roles } };
}

export async function makeSite(actor: AuthUser, overrides: Partial<{ name: string; code: string }> = {}) {
  const n = next();
  const input = { name: `Test Works ${n}`, code: `T${n}`, address: '', timeZone: 'Europe/London', ...overrides };
  return withUnitOfWork(actor, (uow) => createSite(uow, input));
}

export async function makeArea(actor: AuthUser, siteId: string, name = `Hall ${next()}`) {
  return withUnitOfWork(actor, (uow) => createArea(uow, { siteId, name, description: '' }));
}

export function cabinetData(areaId: string, overrides: Partial<CabinetData> = {}): CabinetData {
  return {
    areaId,
    tag: `TST-VFD-${String(next()).padStart(4, '0')}`,
    location: 'Bay 1',
    driveMake: 'Tarnwick Drives',
    driveModel: 'TW-55',
    supplyVolts: 400,
    dcBusVolts: 540,
    ratedPowerKilowatts: 55,
    markedWaitMinutes: 5,
    criticality: 'medium',
    environmentNotes: '',
    commissionedOn: '2019-04-01',
    status: 'in-service',
    ...overrides,
  };
}

export async function makeCabinet(actor: AuthUser, areaId: string, overrides: Partial<CabinetData> = {}) {
  return withUnitOfWork(actor, (uow) => createCabinet(uow, cabinetData(areaId, overrides)));
}

/** An electrolytic series pair design: 3 strings of 2 × 4700 µF / 450 V, 47 kΩ bleeder. */
export function designData(overrides: Partial<BankDesignData> = {}): BankDesignData {
  return {
    code: `TD-${next()}`,
    name: 'Series pair, 3 strings of 4700 µF',
    notes: '',
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

export async function makeDesign(actor: AuthUser, overrides: Partial<BankDesignData> = {}) {
  return withUnitOfWork(actor, (uow) => createBankDesign(uow, designData(overrides)));
}

export async function makeBank(actor: AuthUser, cabinetId: string, bankDesignId: string, position = `DC${next()}`) {
  const input = { cabinetId, bankDesignId, position, serialNumber: '', installedOn: '2020-01-15', notes: '' };
  return withUnitOfWork(actor, (uow) => createBank(uow, input));
}

export function spareData(siteId: string, overrides: Partial<SpareData> = {}): SpareData {
  return {
    code: `TSP-${next()}`,
    kind: 'bank',
    description: 'Spare bank',
    siteId,
    bankDesignId: null,
    storageLocation: 'Store A',
    storageStartedOn: '2024-01-10',
    lastReformedOn: null,
    reformingIntervalDays: 365,
    status: 'in-store',
    notes: '',
    ...overrides,
  };
}

export async function makeSpare(actor: AuthUser, siteId: string, overrides: Partial<SpareData> = {}) {
  return withUnitOfWork(actor, (uow) => createSpare(uow, spareData(siteId, overrides)));
}

/** Rows in a table, to show that a refused write stored nothing. */
export async function countRows(table: string): Promise<number> {
  const { sequelize } = await import('../../api/src/db/sequelize');
  const [rows] = await sequelize.query(`SELECT count(*)::int AS n FROM ${table}`);
  return (rows as Array<{ n: number }>)[0]!.n;
}
