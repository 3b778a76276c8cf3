/**
 * The one audit writer: every create, change, retirement and import of a register record,
 * whoever makes it (a route, the CSV import, the demo seed, a later job), is appended here in
 * the unit of work's transaction, at the unit of work's instant.
 */
import type { AuditAction, RegisterEntityType } from '../../../shared/constants/register';
import { sequelize } from '../db/sequelize';
import { AuditEntry } from '../models/audit-entry';
import type { AuthUser } from '../types/express';
import type { Actor, UnitOfWork } from './unit-of-work';

/** What one audit entry records. */
export interface AuditRecordInput {
  entityType: RegisterEntityType;
  entityId: string;
  action: AuditAction;
  /**
   * Who the trail names, when not the unit of work's actor: the demo seed, acting as Ebbline,
   * names the demo person each record is made as. Null names Ebbline itself.
   */
  actor?: Pick<AuthUser, 'id' | 'name'> | null;
  summary: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  /**
   * When it happened, when not the unit of work's instant: only the demo seed's history, whose
   * steps are written at the instants they happened in the story (never after `uow.now`).
   */
  at?: Date;
}

/**
 * Appends an entry to the register's audit trail in the unit of work's transaction, so the
 * entry exists exactly when the change does, stamped with the unit of work's instant.
 */
export async function recordAudit(uow: UnitOfWork<Actor>, entry: AuditRecordInput): Promise<void> {
  await recordAuditBatch(uow, [entry]);
}

// one statement per chunk keeps a large import or seed to a few round trips
const AUDIT_CHUNK_ROWS = 5000;

/**
 * Appends many entries (an import, the seed, a cabinet retired with its banks) with one
 * `INSERT … SELECT unnest(…)` per 5,000 entries, in the unit of work's transaction.
 */
export async function recordAuditBatch(
  uow: UnitOfWork<Actor>,
  entries: readonly AuditRecordInput[],
): Promise<void> {
  for (let start = 0; start < entries.length; start += AUDIT_CHUNK_ROWS) {
    const chunk = entries.slice(start, start + AUDIT_CHUNK_ROWS);
    const actors = chunk.map((entry) => (entry.actor === undefined ? uow.actor : entry.actor));
    await sequelize.query(
      `INSERT INTO audit_entries (entity_type, entity_id, action, actor_id, actor_name, summary, before, after, at)
       SELECT t.entity_type, t.entity_id, t.action, t.actor_id, t.actor_name, t.summary, t.before, t.after, coalesce(t.at, $9::timestamptz)
         FROM unnest($1::text[], $2::uuid[], $3::text[], $4::uuid[], $5::text[], $6::text[], $7::jsonb[], $8::jsonb[], $10::timestamptz[])
           AS t(entity_type, entity_id, action, actor_id, actor_name, summary, before, after, at)`,
      {
        bind: [
          chunk.map((e) => e.entityType),
          chunk.map((e) => e.entityId),
          chunk.map((e) => e.action),
          actors.map((a) => a?.id ?? null),
          actors.map((a) => a?.name ?? null),
          chunk.map((e) => e.summary),
          chunk.map((e) => (e.before === null ? null : JSON.stringify(e.before))),
          chunk.map((e) => (e.after === null ? null : JSON.stringify(e.after))),
          uow.now.toISOString(),
          chunk.map((e) => (e.at && e.at.getTime() < uow.now.getTime() ? e.at.toISOString() : null)),
        ],
        transaction: uow.transaction,
      },
    );
  }
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
