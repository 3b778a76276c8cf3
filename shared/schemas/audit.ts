/** The audit trail of the register: who changed what, when, with the values before and after. */
import type { AuditAction, RegisterEntityType } from '../constants/register';
import type { PersonRef } from './common';

/** One field that changed, with its value before and after. */
export interface AuditChange {
  field: string;
  before: unknown;
  after: unknown;
}

/** One entry of a record's audit trail, newest first in lists. */
export interface AuditEntry {
  id: string;
  entityType: RegisterEntityType;
  entityId: string;
  action: AuditAction;
  at: string;
  /** Null for changes made by the system (e.g. the demo seed). */
  actor: PersonRef | null;
  summary: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  changes: AuditChange[];
}
