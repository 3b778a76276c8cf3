/**
 * A unique clash (SQLSTATE 23505) as the field a person can correct. The services check
 * uniqueness first, but two writes at the same moment both pass that check; the unique index
 * then refuses the second, and this turns the refusal into the same 409 `duplicate` the check
 * gives, naming the field, instead of a 500.
 */
import { AppError } from '../errors';

/** The field each unique index or constraint of the schema guards, and what it is called. */
const FIELD_OF_CONSTRAINT: Record<string, { path: string; what: string }> = {
  sites_code_in_use: { path: 'code', what: 'site code' },
  sites_name_in_use: { path: 'name', what: 'site name' },
  areas_name_in_use: { path: 'name', what: 'area name' },
  cabinets_tag_in_use: { path: 'tag', what: 'cabinet tag' },
  bank_designs_code_in_use: { path: 'code', what: 'design code' },
  banks_position_in_service: { path: 'position', what: 'position' },
  spares_code_in_use: { path: 'code', what: 'spare code' },
  users_email_key: { path: 'email', what: 'email address' },
  decay_runs_client_id_unique: { path: 'clientId', what: 'clientId' },
  decay_runs_supersedes_unique: { path: 'runId', what: 'correction of this version' },
};

/** The parts of a driver or Sequelize error that tell a unique clash and its constraint. */
interface DatabaseErrorLike {
  code?: unknown;
  constraint?: unknown;
  parent?: { code?: unknown; constraint?: unknown };
  original?: { code?: unknown; constraint?: unknown };
}

/**
 * The 409 `duplicate` for a unique clash, naming the field its constraint guards; null when
 * `err` is not a unique clash.
 *
 * @example duplicateFromUniqueViolation({ parent: { code: '23505', constraint: 'cabinets_tag_in_use' } })
 *   // AppError duplicate, issues [{ path: 'tag', message: 'Another record in use already has this cabinet tag.' }]
 */
export function duplicateFromUniqueViolation(err: unknown): AppError | null {
  if (typeof err !== 'object' || err === null) return null;
  const e = err as DatabaseErrorLike;
  const source = [e.parent, e.original, e].find((s) => s?.code === '23505');
  if (!source) return null;
  const field = typeof source.constraint === 'string' ? FIELD_OF_CONSTRAINT[source.constraint] : undefined;
  const path = field?.path ?? 'body';
  const message = `Another record in use already has this ${field?.what ?? 'value'}.`;
  return AppError.duplicate(path, message);
}
