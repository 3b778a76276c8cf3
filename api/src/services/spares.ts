/** Use cases of spares in store: list, read, add, change, retire; each keeps its reforming due date. */
import { Op, type Includeable, type Order, type Transaction, type WhereOptions } from 'sequelize';
import { reformingDueOn, type SpareData, type SpareListQuery, type SpareUpdate } from '../../../shared/schemas/spare';
import { AppError } from '../errors';
import { BankDesign } from '../models/bank-design';
import { Site } from '../models/site';
import { Spare } from '../models/spare';
import { recordCreation, saveChange } from './audited-change';
import { SPARE_TRAIL } from './audited-fields';
import { changedFields, containsPattern, duplicateValue, fieldProblem, lockForChange, pageWindow, sameTextAs } from './register-records';
import { checkSpareDates } from './register-checks';
import type { UnitOfWork } from './unit-of-work';

const spareIncludes: Includeable[] = [
  { model: Site, as: 'site', required: true },
  { model: BankDesign, as: 'bankDesign', attributes: ['id', 'code'] },
];

/** The calendar date of `now` in UTC, `YYYY-MM-DD`. */
export function todayUtc(now: Date): string {
  return now.toISOString().slice(0, 10);
}

/**
 * One page of spares matching the query, soonest reforming first by default, with the total.
 * @param asOf - today (`YYYY-MM-DD`), for the `overdue` filter
 */
export async function listSpares(query: SpareListQuery, asOf: string): Promise<{ rows: Spare[]; count: number }> {
  const where: WhereOptions<Spare> = {};
  if (!query.includeRetired) Object.assign(where, { retiredAt: null });
  if (query.siteId) Object.assign(where, { siteId: query.siteId });
  if (query.kind) Object.assign(where, { kind: query.kind });
  if (query.status) Object.assign(where, { status: query.status });
  if (query.overdue !== undefined) {
    Object.assign(where, { reformingDueOn: query.overdue ? { [Op.lt]: asOf } : { [Op.gte]: asOf } });
  }
  if (query.q) {
    const pattern = containsPattern(query.q);
    Object.assign(where, { [Op.or]: [{ code: { [Op.iLike]: pattern } }, { description: { [Op.iLike]: pattern } }] });
  }
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const order: Order =
    query.sort.field === 'site'
      ? [[{ model: Site, as: 'site' }, 'name', dir], ['code', 'ASC']]
      : [[query.sort.field, dir], ['code', 'ASC'], ['id', 'ASC']];
  const [rows, count] = await Promise.all([
    Spare.findAll({ where, include: spareIncludes, order, ...pageWindow(query) }),
    Spare.count({ where }),
  ]);
  return { rows, count };
}

/** A spare with its site and design. @throws AppError 404 */
export async function getSpare(id: string, transaction?: Transaction): Promise<Spare> {
  const spare = await Spare.findByPk(id, { include: spareIncludes, transaction });
  if (!spare) throw AppError.notFound('Spare');
  return spare;
}

async function assertReferences(data: { siteId?: string; bankDesignId?: string | null }, transaction: Transaction) {
  if (data.siteId !== undefined) {
    const site = await Site.findByPk(data.siteId, { transaction });
    if (!site || site.retiredAt) throw fieldProblem('siteId', 'This site does not exist or is retired.');
  }
  if (data.bankDesignId) {
    const design = await BankDesign.findByPk(data.bankDesignId, { transaction });
    if (!design || design.retiredAt) throw fieldProblem('bankDesignId', 'This bank design does not exist or is retired.');
  }
}

async function assertCodeFree(code: string, exceptId: string | null, transaction: Transaction) {
  const clash = await Spare.findOne({
    attributes: ['id'],
    where: { retiredAt: null, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}), [Op.and]: [sameTextAs('code', code)] },
    transaction,
  });
  if (clash) throw duplicateValue('code', `Another spare already has the code ${code}.`);
}

/** Adds a spare and works out its reforming due date. @throws AppError `validation-failed`, `duplicate` */
export async function createSpare(uow: UnitOfWork, input: SpareData): Promise<Spare> {
  const { transaction } = uow;
  await assertReferences(input, transaction);
  await assertCodeFree(input.code, null, transaction);
  checkSpareDates(uow, input);
  const spare = await Spare.create(
    { ...input, reformingDueOn: reformingDueOn(input.storageStartedOn, input.lastReformedOn, input.reformingIntervalDays) },
    { transaction },
  );
  await recordCreation(uow, SPARE_TRAIL, spare, `Added spare ${spare.code}`);
  return getSpare(spare.id, transaction);
}

/**
 * Changes a spare (recording a reforming moves its due date on).
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `retired`, `duplicate`
 */
export async function updateSpare(uow: UnitOfWork, id: string, input: SpareUpdate): Promise<Spare> {
  const { transaction } = uow;
  const { version, confirmed, ...fields } = input;
  const spare = await lockForChange(Spare, id, version, 'spare', transaction);
  const changes = changedFields(spare, fields);
  if (Object.keys(changes).length === 0) return getSpare(id, transaction);
  await assertReferences(changes, transaction);
  if (changes.code !== undefined) await assertCodeFree(changes.code, id, transaction);
  const storageStartedOn = changes.storageStartedOn ?? spare.storageStartedOn;
  const lastReformedOn = changes.lastReformedOn !== undefined ? changes.lastReformedOn : spare.lastReformedOn;
  if (lastReformedOn && lastReformedOn < storageStartedOn) {
    throw fieldProblem('lastReformedOn', 'The last reforming cannot be before the spare went into store.');
  }
  checkSpareDates(uow, { storageStartedOn: changes.storageStartedOn, lastReformedOn: changes.lastReformedOn, confirmed });
  await saveChange(
    uow,
    SPARE_TRAIL,
    spare,
    {
      ...changes,
      reformingDueOn: reformingDueOn(storageStartedOn, lastReformedOn, changes.reformingIntervalDays ?? spare.reformingIntervalDays),
    },
    { action: 'update', summary: (s) => `Changed spare ${s.code}` },
  );
  return getSpare(id, transaction);
}

/** Retires a spare (used up or scrapped; soft delete). @throws AppError `not-found`, `stale-version`, `retired` */
export async function retireSpare(uow: UnitOfWork, id: string, version: number): Promise<Spare> {
  const spare = await lockForChange(Spare, id, version, 'spare', uow.transaction);
  await saveChange(uow, SPARE_TRAIL, spare, { retiredAt: uow.now }, { action: 'retire', summary: (s) => `Retired spare ${s.code}` });
  return getSpare(id, uow.transaction);
}
