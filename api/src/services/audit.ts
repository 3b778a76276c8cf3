import type { Transaction } from 'sequelize';
import type { AuditAction, RegisterEntityType } from '../../../shared/constants/register';
import { AuditEntry } from '../models/audit-entry';
import type { AuthUser } from '../types/express';

/** What one audit entry records. */
export interface AuditRecordInput {
  entityType: RegisterEntityType;
  entityId: string;
  action: AuditAction;
  /** Null for the system (the demo seed). */
  actor: Pick<AuthUser, 'id' | 'name'> | null;
  summary: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

/**
 * Appends an entry to the register's audit trail, inside the caller's transaction, so the
 * entry exists exactly when the change does.
 */
export async function recordAudit(entry: AuditRecordInput, transaction: Transaction): Promise<void> {
  await AuditEntry.create(toRow(entry), { transaction });
}

/** Appends many entries in one statement (imports, seeds). */
export async function recordAuditBatch(entries: AuditRecordInput[], transaction: Transaction): Promise<void> {
  if (entries.length === 0) return;
  await AuditEntry.bulkCreate(entries.map(toRow), { transaction });
}

function toRow(entry: AuditRecordInput) {
  return {
    entityType: entry.entityType,
    entityId: entry.entityId,
    action: entry.action,
    actorId: entry.actor?.id ?? null,
    actorName: entry.actor?.name ?? null,
    summary: entry.summary,
    before: entry.before,
    after: entry.after,
  };
}

/**
 * A record's audit trail, newest first.
 *
 * @param limit - most entries returned
 */
export async function listAuditEntries(
  entityType: RegisterEntityType,
  entityId: string,
  limit = 200,
): Promise<AuditEntry[]> {
  return AuditEntry.findAll({
    where: { entityType, entityId },
    order: [
      ['at', 'DESC'],
      ['id', 'DESC'],
    ],
    limit,
  });
}
