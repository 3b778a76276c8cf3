/**
 * Use cases of bank designs. A design's technical fields live in immutable revisions: a change
 * to any of them adds a revision and makes it current, so verdicts judged with an older revision
 * keep the limits they were made with.
 */
import { literal, Op, type Order, type Transaction, type WhereOptions } from 'sequelize';
import {
  BANK_DESIGN_REVISION_FIELDS,
  defaultDesignLimits,
  type BankDesignData,
  type BankDesignListQuery,
  type BankDesignRevisionFields,
  type BankDesignUpdate,
} from '../../../shared/schemas/bank-design';
import { AppError } from '../errors';
import { Bank } from '../models/bank';
import { BankDesign } from '../models/bank-design';
import { BankDesignVersion } from '../models/bank-design-version';
import { User } from '../models/user';
import { recordCreation, saveChange, type AuditedKind } from './audited-change';
import { BANK_DESIGN_AUDITED } from './audited-fields';
import { containsPattern, duplicateValue, fieldProblem, lockForChange, pageWindow, sameTextAs, snapshotOf } from './register-records';
import { refuseDesignBelowBuses } from './register-checks';
import type { UnitOfWork } from './unit-of-work';

const BANK_COUNT = [
  literal(`(SELECT count(*)::int FROM banks b WHERE b.bank_design_id = "BankDesign"."id" AND b.status = 'in-service')`),
  'bankCount',
] as const;

const withCurrent = { model: BankDesignVersion, as: 'currentVersion', required: true } as const;

/** The technical fields of a revision. */
export function revisionFieldsOf(version: BankDesignVersion): BankDesignRevisionFields {
  const out = {} as Record<string, unknown>;
  for (const field of BANK_DESIGN_REVISION_FIELDS) out[field] = version.get(field);
  return out as unknown as BankDesignRevisionFields;
}

/**
 * Designs as the audit trail keeps them: identity and current revision together. The current
 * revision is the one of `revisions` that the design's `currentVersionId` names, so a change
 * that makes a new revision current shows the old one before and the new one after.
 */
function designTrail(...revisions: BankDesignVersion[]): AuditedKind<BankDesign> {
  return {
    entityType: 'bank-design',
    snapshot: (design) => {
      const version = revisions.find((r) => r.id === design.currentVersionId);
      if (!version) throw new Error(`bank design ${design.id}: revision ${design.currentVersionId} not loaded`);
      return { ...snapshotOf(design, BANK_DESIGN_AUDITED), revision: version.revision, ...revisionFieldsOf(version) };
    },
  };
}

/** One page of designs matching the query, with the total. */
export async function listBankDesigns(query: BankDesignListQuery): Promise<{ rows: BankDesign[]; count: number }> {
  const where: WhereOptions<BankDesign> = {};
  if (!query.includeRetired) Object.assign(where, { retiredAt: null });
  if (query.q) {
    const pattern = containsPattern(query.q);
    Object.assign(where, { [Op.or]: [{ code: { [Op.iLike]: pattern } }, { name: { [Op.iLike]: pattern } }] });
  }
  const current = { ...withCurrent, where: query.technology ? { technology: query.technology } : undefined };
  const dir = query.sort.direction === 'desc' ? 'DESC' : 'ASC';
  const order: Order =
    query.sort.field === 'technology'
      ? [[{ model: BankDesignVersion, as: 'currentVersion' }, 'technology', dir], ['code', 'ASC']]
      : [[query.sort.field, dir], ['id', 'ASC']];
  const [rows, count] = await Promise.all([
    BankDesign.findAll({ where, include: [current], attributes: { include: [BANK_COUNT] as never }, order, ...pageWindow(query) }),
    BankDesign.count({ where, include: [{ ...current, attributes: [] }] }),
  ]);
  return { rows, count };
}

/** A design with its current revision and bank count. @throws AppError `not-found` */
export async function getBankDesign(id: string, transaction?: Transaction): Promise<BankDesign> {
  const design = await BankDesign.findByPk(id, {
    include: [withCurrent],
    attributes: { include: [BANK_COUNT] as never },
    transaction,
  });
  if (!design) throw AppError.notFound('Bank design');
  return design;
}

/** Every revision of a design, newest first, with who made it. @throws AppError `not-found` */
export async function listBankDesignRevisions(id: string): Promise<BankDesignVersion[]> {
  await getBankDesign(id);
  return BankDesignVersion.findAll({
    where: { bankDesignId: id },
    include: [{ model: User, as: 'createdBy', attributes: ['id', 'name'] }],
    order: [['revision', 'DESC']],
  });
}

async function assertCodeFree(code: string, exceptId: string | null, transaction: Transaction): Promise<void> {
  const clash = await BankDesign.findOne({
    attributes: ['id'],
    where: { retiredAt: null, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}), [Op.and]: [sameTextAs('code', code)] },
    transaction,
  });
  if (clash) throw duplicateValue('code', `Another bank design already uses the code ${code}.`);
}

/**
 * Adds a design and its first revision. Limits and interval left out start from the
 * technology's defaults.
 * @throws AppError `validation-failed`; `duplicate` naming `code`
 */
export async function createBankDesign(uow: UnitOfWork, input: BankDesignData): Promise<BankDesign> {
  const { transaction, actor } = uow;
  const { code, name, notes, ...technical } = input;
  const defaults = defaultDesignLimits(technical.technology);
  const fields: BankDesignRevisionFields = {
    ...technical,
    watchRatio: technical.watchRatio ?? defaults.watchRatio,
    endOfLifeRatio: technical.endOfLifeRatio ?? defaults.endOfLifeRatio,
    inspectionIntervalDays: technical.inspectionIntervalDays ?? defaults.inspectionIntervalDays,
  };
  if (fields.endOfLifeRatio >= fields.watchRatio) {
    throw fieldProblem('endOfLifeRatio', 'The end-of-life limit must be below the watch limit.');
  }
  await assertCodeFree(code, null, transaction);
  const design = await BankDesign.create({ code, name, notes, currentVersionId: null }, { transaction });
  const revision = await BankDesignVersion.create(
    { ...fields, bankDesignId: design.id, revision: 1, changeNote: 'First revision', createdById: actor.id },
    { transaction },
  );
  design.set({ currentVersionId: revision.id });
  await design.save({ transaction });
  await recordCreation(uow, designTrail(revision), design, `Added bank design ${design.code}`);
  return getBankDesign(design.id, transaction);
}

/**
 * Changes a design. A change to any technical field adds a revision (with `changeNote`) and
 * makes it current; code, name and notes change in place.
 * @throws AppError `validation-failed`, `not-found`, `stale-version`, `retired`, `duplicate`
 */
export async function updateBankDesign(uow: UnitOfWork, id: string, input: BankDesignUpdate): Promise<BankDesign> {
  const { transaction, actor } = uow;
  const { version, changeNote, code, name, notes, ...technical } = input;
  const design = await lockForChange(BankDesign, id, version, 'bank design', transaction);
  const current = await BankDesignVersion.findByPk(design.currentVersionId ?? '', { transaction });
  if (!current) throw new Error(`bank design ${id} has no current revision`);

  const currentFields = revisionFieldsOf(current);
  const merged = { ...currentFields };
  let technicalChange = false;
  for (const field of BANK_DESIGN_REVISION_FIELDS) {
    const value = technical[field];
    if (value !== undefined && !Object.is(value, currentFields[field])) {
      (merged as Record<string, unknown>)[field] = value;
      technicalChange = true;
    }
  }
  if (merged.endOfLifeRatio >= merged.watchRatio) {
    throw fieldProblem('endOfLifeRatio', 'The end-of-life limit must be below the watch limit.');
  }
  const identity: Partial<Pick<BankDesign, 'code' | 'name' | 'notes'>> = {};
  if (code !== undefined && code !== design.code) identity.code = code;
  if (name !== undefined && name !== design.name) identity.name = name;
  if (notes !== undefined && notes !== design.notes) identity.notes = notes;
  if (!technicalChange && Object.keys(identity).length === 0) return getBankDesign(id, transaction);
  if (identity.code) await assertCodeFree(identity.code, id, transaction);
  if (merged.unitRatedVolts !== current.unitRatedVolts || merged.seriesCount !== current.seriesCount) {
    await refuseDesignBelowBuses(id, merged, transaction);
  }

  let revision = current;
  if (technicalChange) {
    revision = await BankDesignVersion.create(
      { ...merged, bankDesignId: id, revision: current.revision + 1, changeNote, createdById: actor.id },
      { transaction },
    );
  }
  await saveChange(uow, designTrail(current, revision), design, { ...identity, currentVersionId: revision.id }, {
    action: 'update',
    summary: (changed) =>
      technicalChange
        ? `Made revision ${revision.revision} of bank design ${changed.code}${changeNote ? `: ${changeNote}` : ''}`
        : `Changed bank design ${changed.code}`,
  });
  return getBankDesign(id, transaction);
}

/** Retires a design no bank in service uses. @throws AppError `not-found`, `stale-version`, `retired`, `in-use` */
export async function retireBankDesign(uow: UnitOfWork, id: string, version: number): Promise<BankDesign> {
  const { transaction } = uow;
  const design = await lockForChange(BankDesign, id, version, 'bank design', transaction);
  const inUse = await Bank.count({ where: { bankDesignId: id, status: 'in-service' }, transaction });
  if (inUse > 0) {
    throw new AppError('in-use', `${inUse} bank(s) in service are of design ${design.code}. Replace them first.`);
  }
  const current = await BankDesignVersion.findByPk(design.currentVersionId ?? '', { transaction });
  if (!current) throw new Error(`bank design ${id} has no current revision`);
  await saveChange(uow, designTrail(current), design, { retiredAt: uow.now }, {
    action: 'retire',
    summary: (changed) => `Retired bank design ${changed.code}`,
  });
  return getBankDesign(id, transaction);
}
