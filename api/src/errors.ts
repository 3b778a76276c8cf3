/** One field's problem, as shown beside that field in a form. */
export interface FieldIssue {
  /** Dotted path of the field, e.g. "banks.0.bleederOhms". */
  path: string;
  message: string;
}

/**
 * The one error type of the API. The error middleware turns it into
 * `{ "error": { "code", "message", "issues"? } }` with its status.
 */
export class AppError extends Error {
  override name = 'AppError';
  constructor(
    /** Stable kebab-case code, e.g. "not-found". */
    readonly code: string,
    readonly status: number,
    message: string,
    readonly issues?: FieldIssue[],
  ) {
    super(message);
  }

  static badRequest(message: string, issues?: FieldIssue[]): AppError {
    return new AppError('validation-failed', 400, message, issues);
  }
  static unauthenticated(message = 'Sign in to use Ebbline.'): AppError {
    return new AppError('unauthenticated', 401, message);
  }
  static forbidden(message = 'Your role does not allow this.'): AppError {
    return new AppError('forbidden', 403, message);
  }
  static notFound(what: string): AppError {
    return new AppError('not-found', 404, `${what} was not found.`);
  }
  static conflict(message: string): AppError {
    return new AppError('conflict', 409, message);
  }
}
