/**
 * Use cases of DC-link banks: list, read, add, change, remove, replace, and set the baseline.
 * A new bank's baseline comes from its design's nameplate (C = p × C_unit / s, τ = R × C) until
 * a trusted decay run, or a reliability engineer, sets it.
 */
import { Op, type Includeable, type Order, type Transaction, type WhereOptions } from 'sequelize';
import type { BaselineSource } from '../../../shared/constants/register';
import type { BankRecordForEngine } from '../../../shared/domain/bank-engine-inputs';
import { bankCapacitanceMicrofarads, tauSecondsOf } from '../../../shared/domain/capacitance';
import type { BankData, BankListQuery, BankReplacementData, BankUpdate } from '../../../shared/schemas/bank';
import { AppError } from '../errors';
import { Area } from '../models/area';
import { Bank } from '../models/bank';
import { BankDesign } from '../models/bank-design';
import { BankDesignVersion } from '../models/bank-design-version';
import { Cabinet } from '../models/cabinet';
import { Site } from '../models/site';
import { User } from '../models/user';
import { recordAudit } from './audit';
import { recordCreation, saveChange } from './audited-change';
import { BANK_TRAIL } from './audited-fields';
import { checkBankOnBus, checkManualBaseline } from './register-checks';
import { changedFields, containsPattern, duplicateValue, fieldProblem, lockForChange, pageWindow, sameTextAs } from './register-records';
import type { UnitOfWork } from './unit-of-work';

/** Everything a bank's answer shows: cabinet, area, site, design and who set the baseline. */
function bankIncludes(siteId?: string): Includeable[] {
  return [
    {
      model: Cabinet,
      as: 'cabinet',
      required: true,
      include: [
        {
          model: Area,
          as: 'area',
          required: true,
          where: siteId ? { siteId } : undefined,
          include: [{ model: Site, as: 'site', required: true }],
        },
      ],
    },
    { model: BankDesign, as: 'bankDesign', required: true, include: [{ model: BankDesignVersion, as: 'currentVersion' }] },
    { model: User, as: 'baselineSetBy', attributes: ['id', 'name'] },
    { model: BankDesignVersion, as: 'baselineDesignVersion', attributes: ['id', 'revision'] },
  ];
}

function bankOrder(query: BankListQuery): Order {
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const byCabinet: Order = [
    [{ model: Cabinet, as: 'cabinet' }, 'tag', 'ASC'],
    ['position', 'ASC'],
    ['id', 'ASC'],
  ];
  switch (query.sort.field) {
    case 'cabinet':
      return [[{ model: Cabinet, as: 'cabinet' }, 'tag', dir], ['position', dir], ['id', 'ASC']];
    case 'design':
      return [[{ model: BankDesign, as: 'bankDesign' }, 'code', dir], ...byCabinet];
    case 'installedOn':
      return [['installedOn', `${dir} NULLS LAST`], ...byCabinet];
    default:
      return [[query.sort.field, dir], ...byCabinet];
  }
}

/** One page of banks matching the query (banks in service unless asked otherwise), with the total. */
export async function listBanks(query: BankListQuery): Promise<{ rows: Bank[]; count: number }> {
  const where: WhereOptions<Bank> = {};
  if (query.status) Object.assign(where, { status: query.status });
  else if (!query.includeRetired) Object.assign(where, { status: 'in-service' });
  if (query.cabinetId) Object.assign(where, { cabinetId: query.cabinetId });
  if (query.bankDesignId) Object.assign(where, { bankDesignId: query.bankDesignId });
  if (query.q) {
    const pattern = containsPattern(query.q);
    Object.assign(where, {
      [Op.or]: [
        { '$cabinet.tag$': { [Op.iLike]: pattern } },
        { position: { [Op.iLike]: pattern } },
        { serialNumber: { [Op.iLike]: pattern } },
      ],
    });
  }
  const include = bankIncludes(query.siteId);
  const [rows, count] = await Promise.all([
    Bank.findAll({ where, include, order: bankOrder(query), ...pageWindow(query), subQuery: false }),
    Bank.count({ where, include: include.slice(0, 1), distinct: true, col: 'id' }),
  ]);
  return { rows, count };
}

/** A bank with everything its answer shows. @throws AppError `not-found` */
export async function getBank(id: string, transaction?: Transaction): Promise<Bank> {
  const bank = await Bank.findByPk(id, { include: bankIncludes(), transaction });
  if (!bank) throw AppError.notFound('Bank');
  return bank;
}

/** The replacement chain a bank belongs to, oldest first (the bank itself included). */
export async function getBankLineage(bank: Bank): Promise<Bank[]> {
  const include = [{ model: BankDesign, as: 'bankDesign', attributes: ['id', 'code'] }];
  const chain: Bank[] = [bank];
  let earlier = bank.replacesBankId;
  while (earlier && chain.length < 100) {
    const found = await Bank.findByPk(earlier, { include });
    if (!found) break;
    chain.unshift(found);
    earlier = found.replacesBankId;
  }
  let later = bank.replacedByBankId;
  while (later && chain.length < 100) {
    const found = await Bank.findByPk(later, { include });
    if (!found) break;
    chain.push(found);
    later = found.replacedByBankId;
  }
  return chain;
}

/**
 * A bank loaded with its cabinet and its design's current revision (`getBank`), in the parts a
 * decay run on it is judged with: `bankEngineInputs` (shared/domain) turns it into the engine's
 * inputs exactly as the browser's check does with the bank's answer, which shows the same parts.
 */
export function bankRecordForEngine(bank: Bank): BankRecordForEngine {
  const current = bank.bankDesign?.currentVersion;
  return {
    technology: current?.technology ?? 'electrolytic',
    designFigures: current
      ? {
          unitCapacitanceMicrofarads: current.unitCapacitanceMicrofarads,
          seriesCount: current.seriesCount,
          parallelCount: current.parallelCount,
          bleederOhms: current.bleederOhms,
          tempCoefficientPercentPerKelvin: current.tempCoefficientPercentPerKelvin,
          watchRatio: current.watchRatio,
          endOfLifeRatio: current.endOfLifeRatio,
        }
      : null,
    baseline: { capacitanceMicrofarads: bank.baselineCapacitanceMicrofarads, source: bank.baselineSource },
    cabinetDcBusVolts: bank.cabinet?.dcBusVolts ?? null,
    cabinetMarkedWaitMinutes: bank.cabinet?.markedWaitMinutes ?? null,
  };
}

/** The nameplate baseline of a design revision: C = p × C_unit / s, τ = R_bleed × C. */
export function nameplateBaseline(version: BankDesignVersion): { tauSeconds: number; capacitanceMicrofarads: number } {
  const capacitanceMicrofarads = bankCapacitanceMicrofarads(version);
  return { capacitanceMicrofarads, tauSeconds: tauSecondsOf(version.bleederOhms, capacitanceMicrofarads) };
}

/** A baseline from the nameplate, set in `uow` (by its actor, at its instant). */
function nameplateBaselineFields(uow: UnitOfWork, version: BankDesignVersion, note: string) {
  const { tauSeconds, capacitanceMicrofarads } = nameplateBaseline(version);
  return {
    baselineTauSeconds: tauSeconds,
    baselineCapacitanceMicrofarads: capacitanceMicrofarads,
    baselineSource: 'nameplate' as BaselineSource,
    baselineSetAt: uow.now,
    baselineSetById: uow.actor.id,
    baselineDesignVersionId: version.id,
    baselineDecayRunId: null,
    baselineNote: note,
  };
}

/** The design a bank may be given: in use, with its current revision. */
async function designInUse(bankDesignId: string, transaction: Transaction): Promise<{ design: BankDesign; current: BankDesignVersion }> {
  const design = await BankDesign.findByPk(bankDesignId, {
    include: [{ model: BankDesignVersion, as: 'currentVersion' }],
    transaction,
  });
  if (!design || design.retiredAt || !design.currentVersion) {
    throw fieldProblem('bankDesignId', 'This bank design does not exist or is retired.');
  }
  return { design, current: design.currentVersion };
}

async function assertPositionFree(cabinetId: string, position: string, exceptId: string | null, transaction: Transaction) {
  const clash = await Bank.findOne({
    attributes: ['id'],
    where: {
      cabinetId,
      status: 'in-service',
      ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}),
      [Op.and]: [sameTextAs('position', position)],
    },
    transaction,
  });
  if (clash) throw duplicateValue('position', `This cabinet already has a bank in service at ${position}. Replace it instead.`);
}

/** Loads an in-service bank for change. @throws AppError `not-found`, `stale-version`, `retired`, `replaced` */
async function lockBankInService(id: string, version: number, transaction: Transaction): Promise<Bank> {
  const bank = await lockForChange(Bank, id, version, 'bank', transaction);
  if (bank.status !== 'in-service') {
    throw new AppError('replaced', `This bank was ${bank.status}; its record stays as history and cannot be changed.`);
  }
  return bank;
}

/**
 * Adds a bank to a cabinet in use, with its baseline from the design's nameplate.
 * @throws AppError `validation-failed` naming `cabinetId` / `bankDesignId`; `duplicate` naming `position`
 */
export async function createBank(uow: UnitOfWork, input: BankData): Promise<Bank> {
  const { transaction } = uow;
  // FOR SHARE: waits for a retirement of the cabinet under way, and holds one off meanwhile
  const cabinet = await Cabinet.findByPk(input.cabinetId, { transaction, lock: transaction.LOCK.SHARE });
  if (!cabinet || cabinet.retiredAt) throw fieldProblem('cabinetId', 'This cabinet does not exist or is retired.');
  const { current } = await designInUse(input.bankDesignId, transaction);
  await assertPositionFree(input.cabinetId, input.position, null, transaction);
  checkBankOnBus(uow, { revision: current, dcBusVolts: cabinet.dcBusVolts, installedOn: input.installedOn, confirmed: input.confirmed });
  const bank = await Bank.create(
    {
      ...input,
      ...nameplateBaselineFields(uow, current, ''),
      replacesBankId: null,
      replacedByBankId: null,
      replacedOn: null,
    },
    { transaction },
  );
  await recordCreation(uow, BANK_TRAIL, bank, `Added bank ${bank.position} to cabinet ${cabinet.tag}`);
  return getBank(bank.id, transaction);
}

/**
 * Changes a bank in service. A new design corrects a wrong record: a nameplate baseline follows it.
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `replaced`, `duplicate`
 */
export async function updateBank(uow: UnitOfWork, id: string, input: BankUpdate): Promise<Bank> {
  const { transaction } = uow;
  const { version, confirmed, ...fields } = input;
  const bank = await lockBankInService(id, version, transaction);
  const changes: Record<string, unknown> = changedFields(bank, fields);
  if (Object.keys(changes).length > 0) {
    if (fields.position !== undefined && changes.position !== undefined) {
      await assertPositionFree(bank.cabinetId, fields.position, id, transaction);
    }
    if (fields.bankDesignId !== undefined && changes.bankDesignId !== undefined) {
      const { current } = await designInUse(fields.bankDesignId, transaction);
      // FOR SHARE: a change of the cabinet's bus waits for this one, and the other way round
      const cabinet = await Cabinet.findByPk(bank.cabinetId, { transaction, lock: transaction.LOCK.SHARE });
      checkBankOnBus(uow, { revision: current, dcBusVolts: cabinet?.dcBusVolts ?? null });
      if (bank.baselineSource === 'nameplate') {
        Object.assign(changes, nameplateBaselineFields(uow, current, 'Design corrected'));
      }
    }
    checkBankOnBus(uow, { dcBusVolts: null, installedOn: changes.installedOn as string | null | undefined, confirmed });
    await saveChange(uow, BANK_TRAIL, bank, changes, { action: 'update', summary: (b) => `Changed bank ${b.position}` });
  }
  return getBank(id, transaction);
}

/** Removes a bank in service (soft delete; its history stays). @throws AppError `not-found`, `stale-version`, `replaced` */
export async function retireBank(uow: UnitOfWork, id: string, version: number): Promise<Bank> {
  const bank = await lockBankInService(id, version, uow.transaction);
  await saveChange(uow, BANK_TRAIL, bank, { status: 'removed', retiredAt: uow.now }, {
    action: 'retire',
    summary: (b) => `Removed bank ${b.position}`,
  });
  return getBank(id, uow.transaction);
}

/** A new baseline for a bank. */
export interface BaselineChange {
  version: number;
  source: BaselineSource;
  /** Required unless the source is the nameplate. */
  tauSeconds?: number | null;
  capacitanceMicrofarads?: number | null;
  /** The trusted decay run, for source `decay-run`. */
  decayRunId?: string | null;
  note: string;
  /** True to keep a hand-entered τ far from R × C (see register-checks). */
  confirmed?: boolean;
}

/**
 * Sets a bank's baseline: back to its design's current nameplate, to values entered by hand,
 * or from a trusted decay run. Records who and when (the unit of work's actor and instant).
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `replaced`
 */
export async function setBankBaseline(uow: UnitOfWork, id: string, change: BaselineChange): Promise<Bank> {
  const { transaction, actor } = uow;
  const bank = await lockBankInService(id, change.version, transaction);
  let baseline: object;
  if (change.source === 'nameplate') {
    const { current } = await designInUse(bank.bankDesignId, transaction);
    baseline = nameplateBaselineFields(uow, current, change.note);
  } else {
    if (!change.tauSeconds) throw fieldProblem('tauSeconds', 'Enter the baseline τ in seconds.');
    if (!change.capacitanceMicrofarads) throw fieldProblem('capacitanceMicrofarads', 'Enter the baseline capacitance in µF.');
    if (change.source === 'decay-run' && !change.decayRunId) throw fieldProblem('decayRunId', 'Name the trusted decay run.');
    if (change.source === 'manual') {
      const { current } = await designInUse(bank.bankDesignId, transaction);
      checkManualBaseline({
        tauSeconds: change.tauSeconds,
        capacitanceMicrofarads: change.capacitanceMicrofarads,
        bleederOhms: current.bleederOhms,
        confirmed: change.confirmed,
      });
    }
    baseline = {
      baselineTauSeconds: change.tauSeconds,
      baselineCapacitanceMicrofarads: change.capacitanceMicrofarads,
      baselineSource: change.source,
      baselineSetAt: uow.now,
      baselineSetById: actor.id,
      baselineDesignVersionId: null,
      baselineDecayRunId: change.source === 'decay-run' ? (change.decayRunId ?? null) : null,
      baselineNote: change.note,
    };
  }
  await saveChange(uow, BANK_TRAIL, bank, baseline, {
    action: 'baseline',
    summary: (b) =>
      `Set the baseline of bank ${b.position} ${change.source === 'nameplate' ? 'from the nameplate' : change.source === 'manual' ? 'by hand' : 'from a decay run'}`,
  });
  return getBank(id, transaction);
}

/**
 * Replaces a bank: the old one is marked replaced (its record and history stay) and a new bank
 * takes its cabinet and position, with a fresh baseline from its design's nameplate. One unit of work.
 * @returns the new bank
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `replaced`
 */
export async function replaceBank(uow: UnitOfWork, id: string, input: BankReplacementData): Promise<Bank> {
  const { transaction } = uow;
  const old = await lockBankInService(id, input.version, transaction);
  if (old.installedOn && input.installedOn < old.installedOn) {
    throw fieldProblem('installedOn', `The new bank cannot go in before the old one did (${old.installedOn}).`);
  }
  const { current } = await designInUse(input.bankDesignId ?? old.bankDesignId, transaction);
  const cabinet = await Cabinet.findByPk(old.cabinetId, { transaction, lock: transaction.LOCK.SHARE });
  checkBankOnBus(uow, { revision: current, dcBusVolts: cabinet?.dcBusVolts ?? null, installedOn: input.installedOn, confirmed: input.confirmed });
  const before = BANK_TRAIL.snapshot(old);
  old.set({ status: 'replaced', replacedOn: input.installedOn, version: old.version + 1 });
  await old.save({ transaction });
  const successor = await Bank.create(
    {
      cabinetId: old.cabinetId,
      bankDesignId: current.bankDesignId,
      position: old.position,
      serialNumber: input.serialNumber,
      installedOn: input.installedOn,
      notes: input.note,
      ...nameplateBaselineFields(uow, current, 'New bank'),
      replacesBankId: old.id,
      replacedByBankId: null,
      replacedOn: null,
    },
    { transaction },
  );
  old.set({ replacedByBankId: successor.id });
  await old.save({ transaction });
  await recordAudit(uow, {
    entityType: 'bank',
    entityId: old.id,
    action: 'replace',
    summary: `Replaced bank ${old.position} on ${input.installedOn}${input.note ? `: ${input.note}` : ''}`,
    before,
    after: BANK_TRAIL.snapshot(old),
  });
  await recordCreation(uow, BANK_TRAIL, successor, `Installed bank ${successor.position} in place of the replaced one`);
  return getBank(successor.id, transaction);
}
