/**
 * The register's plausibility checks as the write services apply them, inside their
 * transaction: values that cannot be true are refused (`validation-failed` naming the field),
 * unlikely ones need the person's confirmation (`confirmation-needed` with the field issues,
 * unless the write carries `confirmed: true`). The rules themselves are pure functions in
 * shared/domain/register-plausibility.ts.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import {
  bankRatingProblem,
  baselineTauQuestion,
  collectIssues,
  dcBusQuestion,
  futureDateQuestion,
  type PlausibilityIssue,
} from '../../../shared/domain/register-plausibility';
import { bankRatedVolts } from '../../../shared/schemas/bank-design';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { fieldProblem } from './register-records';
import type { UnitOfWork } from './unit-of-work';

/** The calendar date (UTC, `YYYY-MM-DD`) of the instant a write happens at. */
export function dateOn(now: Date): string {
  return now.toISOString().slice(0, 10);
}

/**
 * Stops a write that holds unlikely values the person has not confirmed.
 * @throws AppError `confirmation-needed` (422) with one issue per questioned field
 */
export function confirmUnlikely(issues: PlausibilityIssue[], confirmed: boolean | undefined): void {
  if (issues.length === 0 || confirmed === true) return;
  const message = `Are you sure? ${issues.map((i) => i.message).join(' ')} Correct it, or save anyway to keep it.`;
  throw new AppError('confirmation-needed', message, issues);
}

/** @throws AppError `validation-failed` naming `path` when `problem` is not null */
export function refuseImpossible(path: string, problem: string | null): void {
  if (problem !== null) throw fieldProblem(path, problem);
}

/** A cabinet's fields the checks look at, as they will be stored. */
export interface CabinetFigures {
  supplyVolts: number;
  dcBusVolts: number | null;
  commissionedOn: string | null;
}

/**
 * The questions about a cabinet, for the fields a write sets (`changed`: the names of the
 * fields it changes, or every field for a new cabinet): a value confirmed once is not asked
 * about again when another field changes.
 */
export function cabinetQuestions(
  cabinet: CabinetFigures,
  changed: ReadonlySet<string> | 'all',
  asOfOn: string,
): PlausibilityIssue[] {
  const sets = (field: string) => changed === 'all' || changed.has(field);
  return collectIssues([
    [
      'dcBusVolts',
      sets('dcBusVolts') || sets('supplyVolts')
        ? dcBusQuestion(cabinet.supplyVolts, cabinet.dcBusVolts)
        : null,
    ],
    [
      'commissionedOn',
      sets('commissionedOn')
        ? futureDateQuestion(cabinet.commissionedOn, asOfOn, 'commissioning date')
        : null,
    ],
  ]);
}

/** The questions about dates a write sets, each `[field, date, what it is called]`. */
export function dateQuestions(
  dates: Array<[path: string, date: string | null | undefined, what: string]>,
  asOfOn: string,
): PlausibilityIssue[] {
  return collectIssues(
    dates.map(([path, date, what]) => [
      path,
      date === undefined ? null : futureDateQuestion(date, asOfOn, what),
    ]),
  );
}

/** The rating figures of a design revision. */
export interface DesignRating {
  unitRatedVolts: number;
  seriesCount: number;
}

/**
 * Refuses giving a bank a design rated below its cabinet's DC bus.
 * @throws AppError `validation-failed` naming `bankDesignId`
 */
export function refuseBankBelowBus(
  revision: DesignRating,
  dcBusVolts: number | null,
  path = 'bankDesignId',
): void {
  refuseImpossible(
    path,
    bankRatingProblem(
      bankRatedVolts(revision.unitRatedVolts, revision.seriesCount),
      dcBusVolts,
      'The bank of this design',
    ),
  );
}

interface BankOnBus {
  position: string;
  tag: string;
  code: string;
  ratedVolts: number;
  dcBusVolts: number | null;
}

const BANKS_IN_SERVICE = `
  SELECT b.position, c.tag, d.code, v.unit_rated_volts * v.series_count AS "ratedVolts", c.dc_bus_volts AS "dcBusVolts"
  FROM banks b
  JOIN cabinets c ON c.id = b.cabinet_id
  JOIN bank_designs d ON d.id = b.bank_design_id
  JOIN bank_design_versions v ON v.id = d.current_version_id
  WHERE b.status = 'in-service'`;

/**
 * Refuses a cabinet DC bus that a bank in service in it is rated below.
 * @throws AppError `validation-failed` naming `dcBusVolts`
 */
export async function refuseBusAboveBanks(
  cabinetId: string,
  dcBusVolts: number | null,
  transaction: Transaction,
): Promise<void> {
  if (dcBusVolts === null) return;
  const banks = await sequelize.query<BankOnBus>(
    `${BANKS_IN_SERVICE} AND b.cabinet_id = :cabinetId ORDER BY "ratedVolts" LIMIT 1`,
    {
      replacements: { cabinetId },
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  const weakest = banks[0];
  if (weakest)
    refuseImpossible(
      'dcBusVolts',
      bankRatingProblem(
        weakest.ratedVolts,
        dcBusVolts,
        `Bank ${weakest.position} (design ${weakest.code})`,
      ),
    );
}

/**
 * Refuses a design revision whose rating would be below the DC bus of a cabinet holding a bank
 * of it in service.
 * @throws AppError `validation-failed` naming `unitRatedVolts`
 */
export async function refuseDesignBelowBuses(
  designId: string,
  revision: DesignRating,
  transaction: Transaction,
): Promise<void> {
  const rated = bankRatedVolts(revision.unitRatedVolts, revision.seriesCount);
  const banks = await sequelize.query<BankOnBus>(
    `${BANKS_IN_SERVICE} AND b.bank_design_id = :designId AND c.dc_bus_volts > :rated ORDER BY c.dc_bus_volts DESC LIMIT 1`,
    { replacements: { designId, rated }, type: QueryTypes.SELECT, transaction },
  );
  const highest = banks[0];
  if (highest) {
    refuseImpossible(
      'unitRatedVolts',
      bankRatingProblem(
        rated,
        highest.dcBusVolts,
        `Bank ${highest.position} of cabinet ${highest.tag}, of this design,`,
      ),
    );
  }
}

/** The question about a baseline entered by hand: τ against the design's bleeder × C. */
export function baselineQuestions(
  tauSeconds: number,
  capacitanceMicrofarads: number,
  bleederOhms: number,
): PlausibilityIssue[] {
  return collectIssues([
    ['tauSeconds', baselineTauQuestion(tauSeconds, capacitanceMicrofarads, bleederOhms)],
  ]);
}

/**
 * A new cabinet: questions an unlikely DC bus or a commissioning date years ahead.
 * @throws AppError `confirmation-needed` unless `confirmed`
 */
export function checkNewCabinet(uow: UnitOfWork, cabinet: CabinetFigures & { confirmed?: boolean }): void {
  confirmUnlikely(cabinetQuestions(cabinet, 'all', dateOn(uow.now)), cabinet.confirmed);
}

/**
 * A change to a cabinet: refuses a DC bus above the rating of a bank in service in it, then
 * questions the unlikely values among the fields it changes (checked as they will be stored).
 * @throws AppError `validation-failed` naming `dcBusVolts`; `confirmation-needed` unless `confirmed`
 */
export async function checkCabinetChange(
  uow: UnitOfWork,
  cabinetId: string,
  stored: CabinetFigures,
  changes: Partial<CabinetFigures> & object,
  confirmed: boolean | undefined,
): Promise<void> {
  // read field by field: `stored` may be a model, whose values are getters a spread would miss
  const merged: CabinetFigures = {
    supplyVolts: changes.supplyVolts ?? stored.supplyVolts,
    dcBusVolts: changes.dcBusVolts !== undefined ? changes.dcBusVolts : stored.dcBusVolts,
    commissionedOn: changes.commissionedOn !== undefined ? changes.commissionedOn : stored.commissionedOn,
  };
  if (changes.dcBusVolts !== undefined) await refuseBusAboveBanks(cabinetId, merged.dcBusVolts, uow.transaction);
  confirmUnlikely(cabinetQuestions(merged, new Set(Object.keys(changes)), dateOn(uow.now)), confirmed);
}

/**
 * A bank put on a cabinet's bus (added, given another design, or replaced): refuses a design
 * rated below the bus, then questions an install date years ahead.
 * @throws AppError `validation-failed` naming `bankDesignId`; `confirmation-needed` unless `confirmed`
 */
export function checkBankOnBus(
  uow: UnitOfWork,
  bank: { revision?: DesignRating; dcBusVolts: number | null; installedOn?: string | null; confirmed?: boolean },
): void {
  if (bank.revision) refuseBankBelowBus(bank.revision, bank.dcBusVolts);
  confirmUnlikely(dateQuestions([['installedOn', bank.installedOn, 'install date']], dateOn(uow.now)), bank.confirmed);
}

/**
 * A baseline entered by hand: questions a τ more than 30 % away from the design's bleeder × C.
 * @throws AppError `confirmation-needed` unless `confirmed`
 */
export function checkManualBaseline(baseline: { tauSeconds: number; capacitanceMicrofarads: number; bleederOhms: number; confirmed?: boolean }): void {
  confirmUnlikely(baselineQuestions(baseline.tauSeconds, baseline.capacitanceMicrofarads, baseline.bleederOhms), baseline.confirmed);
}

/**
 * A spare's dates as a write sets them: questions a storage or reforming date years ahead.
 * @throws AppError `confirmation-needed` unless `confirmed`
 */
export function checkSpareDates(uow: UnitOfWork, spare: { storageStartedOn?: string; lastReformedOn?: string | null; confirmed?: boolean }): void {
  const questions = dateQuestions(
    [
      ['storageStartedOn', spare.storageStartedOn, 'date it went into store'],
      ['lastReformedOn', spare.lastReformedOn, 'last reforming date'],
    ],
    dateOn(uow.now),
  );
  confirmUnlikely(questions, spare.confirmed);
}

