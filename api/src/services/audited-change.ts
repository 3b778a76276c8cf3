/**
 * The audited write every register record shares: a new record and its `create` entry, or a
 * change that bumps the record's version, saves it and records its before/after snapshots,
 * all in the unit of work. Callers lock the record and make their own checks first (see
 * `lockForChange`).
 */
import type { Model } from 'sequelize';
import type { AuditAction, RegisterEntityType } from '../../../shared/constants/register';
import { recordAudit, type AuditRecordInput } from './audit';
import { snapshotOf, type VersionedRecord } from './register-records';
import type { UnitOfWork } from './unit-of-work';

/** How one kind of register record is kept in the audit trail. */
export interface AuditedKind<M extends Model> {
  entityType: RegisterEntityType;
  /** The record as its before/after snapshot keeps it. */
  snapshot: (record: M) => Record<string, unknown>;
}

/** A kind whose snapshot is its own columns `attributes` (see audited-fields). */
export function auditedColumns<M extends Model>(
  entityType: RegisterEntityType,
  attributes: readonly string[],
): AuditedKind<M> {
  return { entityType, snapshot: (record) => snapshotOf(record, attributes) };
}

/** What an audited change records besides the snapshots. */
export interface ChangeEntry<M extends Model> {
  action: AuditAction;
  /** The entry's summary, read from the record once changed (so a new name shows). */
  summary: (changed: M) => string;
}

/**
 * Records the `create` entry of a record just added, in the unit of work, as its actor.
 *
 * @param summary - what the trail says, e.g. "Added site Brookfield"
 */
export async function recordCreation<M extends Model & { id: string }>(
  uow: UnitOfWork,
  kind: AuditedKind<M>,
  record: M,
  summary: string,
): Promise<void> {
  await recordAudit(uow, {
    entityType: kind.entityType,
    entityId: record.id,
    action: 'create',
    summary,
    before: null,
    after: kind.snapshot(record),
  });
}

/**
 * Applies `changes` to a record with its version bumped by one and saves it, returning the
 * audit entry (before and after snapshots) for the caller to record, alone or in a batch.
 *
 * @param changes - the fields to write (only those differing, see `changedFields`)
 */
export async function applyChange<M extends VersionedRecord>(
  uow: UnitOfWork,
  kind: AuditedKind<M>,
  record: M,
  changes: object,
  entry: ChangeEntry<M>,
): Promise<AuditRecordInput> {
  const before = kind.snapshot(record);
  record.set({ ...changes, version: record.version + 1 } as Partial<M['_attributes']>);
  await record.save({ transaction: uow.transaction });
  return {
    entityType: kind.entityType,
    entityId: record.id,
    action: entry.action,
    summary: entry.summary(record),
    before,
    after: kind.snapshot(record),
  };
}

/**
 * Applies `changes` with the version bumped, saves the record and records the entry, all in
 * the unit of work. A retirement is the change `{ retiredAt: uow.now }` with the action `retire`.
 */
export async function saveChange<M extends VersionedRecord>(
  uow: UnitOfWork,
  kind: AuditedKind<M>,
  record: M,
  changes: object,
  entry: ChangeEntry<M>,
): Promise<void> {
  await recordAudit(uow, await applyChange(uow, kind, record, changes, entry));
}
