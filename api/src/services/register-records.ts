/**
 * What every register write shares: loading a record for change under a row lock with its
 * version checked (optimistic concurrency), the snapshot kept in the audit trail, and paging.
 */
import { col, fn, where, type Model, type ModelStatic, type Transaction, type WhereOptions } from 'sequelize';
import { AppError } from '../errors';

/** A register record: it has a concurrency version and may be retired. */
export interface VersionedRecord extends Model {
  id: string;
  version: number;
  retiredAt: Date | null;
}

/** `stale-version`: a write based on an old version. */
export function staleVersion(what: string, sentVersion: number, currentVersion: number): AppError {
  return AppError.staleVersion(
    `Someone else saved this ${what} after you opened it (you edited version ${sentVersion}, it is now version ${currentVersion}). ` +
      'Reload to see their changes, then make yours again.',
  );
}

/** `retired`: a change to a retired record. */
export function retiredRecord(what: string): AppError {
  return new AppError('retired', `This ${what} is retired; retired records stay for history and cannot be changed.`);
}

/**
 * Loads a record for change: locks its row for the transaction, then checks that it exists,
 * is not retired, and is still at the version the editor read.
 *
 * @throws AppError `not-found` when missing, `stale-version` or `retired`
 */
export async function lockForChange<M extends VersionedRecord>(
  model: ModelStatic<M>,
  id: string,
  sentVersion: number,
  what: string,
  transaction: Transaction,
): Promise<M> {
  const record = await model.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!record) throw AppError.notFound(capitalise(what));
  if (record.version !== sentVersion) throw staleVersion(what, sentVersion, record.version);
  if (record.retiredAt) throw retiredRecord(what);
  return record;
}

/** The record's own columns as plain JSON for the audit trail (no timestamps, no associations). */
export function snapshotOf(record: Model, attributes: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const name of attributes) {
    const value = record.get(name);
    out[name] = value instanceof Date ? value.toISOString() : (value ?? null);
  }
  return out;
}

/** The fields of `changes` whose value differs from the record's (only those are written). */
export function changedFields<T extends object>(record: Model, changes: T): Partial<T> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(changes)) {
    if (value === undefined) continue;
    if (!Object.is(record.get(key), value)) out[key] = value;
  }
  return out as Partial<T>;
}

/** `ILIKE` pattern matching `text` anywhere, with the wildcards in `text` taken literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** LIMIT and OFFSET of a page. */
export function pageWindow(query: { page: number; pageSize: number }): { limit: number; offset: number } {
  return { limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
}

/** `validation-failed` naming one field, for references that do not resolve (e.g. an unknown area). */
export function fieldProblem(path: string, message: string): AppError {
  return AppError.badRequest(`${path}: ${message}`, [{ path, message }]);
}

/** `duplicate` naming the field whose value another record already holds. */
export function duplicateValue(path: string, message: string): AppError {
  return AppError.duplicate(path, message);
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** A where-clause for "column equals value, ignoring case" (the unique indexes use lower()). */
export function sameTextAs(column: string, value: string): WhereOptions {
  return where(fn('lower', col(column)), value.toLowerCase());
}
