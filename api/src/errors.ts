import { DATABASE_UNAVAILABLE_MESSAGE } from '../../shared/constants/availability';

/** One field's problem, as shown beside that field in a form. */
export interface FieldIssue {
  /** Dotted path of the field, e.g. "banks.0.bleederOhms". */
  path: string;
  message: string;
  /** What kind of problem, where a field can have several (a planning warning's kind). */
  kind?: string;
}

/**
 * The stable codes an `AppError` carries. Services and middleware pick a code, never an HTTP
 * status: the error middleware (middleware/error-handler.ts) maps each code to its status, so
 * a job or a script calling the same service gets the same code and no HTTP.
 */
export const ERROR_CODES = [
  'validation-failed',
  'bad-request',
  'import-rejected',
  'unauthenticated',
  'invalid-token',
  'forbidden',
  'csrf-failed',
  'origin-refused',
  'session-required',
  'not-found',
  'conflict',
  'stale-version',
  'duplicate',
  'retired',
  'in-use',
  'replaced',
  'payload-too-large',
  'file-too-large',
  'unsupported-file',
  'unsupported-media-type',
  'not-a-text-file',
  'columns-ambiguous',
  'unreadable-file',
  'not-an-image',
  'image-too-large',
  'identity-provider-unreachable',
  'database-unavailable',
  'confirmation-needed',
  'override-needed',
  'visit-state',
  'superseded',
  'baseline-refused',
  'client-id-reused',
  'visit-not-open',
  'already-corrected',
  'bank-not-on-visit',
] as const;

export type ErrorCode = (typeof ERROR_CODES)[number];

/**
 * The one error type of the API: a stable kebab-case code, a message a person can act on, and
 * optionally the fields at fault. The error middleware turns it into
 * `{ "error": { "code", "message", "issues"? } }` with the status of its code.
 */
export class AppError extends Error {
  override name = 'AppError';
  constructor(
    /** Stable kebab-case code, e.g. "not-found". */
    readonly code: ErrorCode,
    message: string,
    readonly issues?: FieldIssue[],
    /** More for the client beside the message, answered as fields of the error (e.g. `candidates`). */
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
  }

  static badRequest(message: string, issues?: FieldIssue[]): AppError {
    return new AppError('validation-failed', message, issues);
  }
  static unauthenticated(message = 'Sign in to use Ebbline.'): AppError {
    return new AppError('unauthenticated', message);
  }
  static forbidden(message = 'Your role does not allow this.'): AppError {
    return new AppError('forbidden', message);
  }
  static notFound(what: string): AppError {
    return new AppError('not-found', `${what} was not found.`);
  }
  /** PostgreSQL cannot be reached right now (stopped, restarting, connection lost): ask again soon. */
  static databaseUnavailable(): AppError {
    return new AppError('database-unavailable', DATABASE_UNAVAILABLE_MESSAGE);
  }
  static conflict(message: string): AppError {
    return new AppError('conflict', message);
  }
  /** Someone else saved the record after `sentVersion` was read. */
  static staleVersion(message: string): AppError {
    return new AppError('stale-version', message);
  }
  /** Another record already holds the value of `path`. */
  static duplicate(path: string, message: string): AppError {
    return new AppError('duplicate', message, [{ path, message }]);
  }
}
