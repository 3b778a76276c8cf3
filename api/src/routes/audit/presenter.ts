import type { AuditChange, AuditEntry as AuditEntryJson } from '../../../../shared/schemas/audit';
import type { AuditEntry } from '../../models/audit-entry';

// bookkeeping fields that change with every write and say nothing to a reader
const QUIET_FIELDS = new Set(['version']);

/** The fields that differ between before and after, in the order the record lists them. */
export function auditChanges(before: Record<string, unknown> | null, after: Record<string, unknown> | null): AuditChange[] {
  const fields = [...new Set([...Object.keys(after ?? {}), ...Object.keys(before ?? {})])];
  return fields
    .filter((field) => !QUIET_FIELDS.has(field))
    .filter((field) => JSON.stringify(before?.[field] ?? null) !== JSON.stringify(after?.[field] ?? null))
    .map((field) => ({ field, before: before?.[field] ?? null, after: after?.[field] ?? null }));
}

/** An audit entry as the API returns it. */
export function presentAuditEntry(entry: AuditEntry): AuditEntryJson {
  return {
    id: entry.id,
    entityType: entry.entityType,
    entityId: entry.entityId,
    action: entry.action,
    at: entry.at.toISOString(),
    actor: entry.actorId || entry.actorName ? { id: entry.actorId ?? '', name: entry.actorName ?? 'someone' } : null,
    summary: entry.summary,
    before: entry.before,
    after: entry.after,
    changes: auditChanges(entry.before, entry.after),
  };
}
