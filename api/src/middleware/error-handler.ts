import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { DATABASE_RETRY_AFTER_SECONDS, isDatabaseUnavailable } from '../db/connection-errors';
import { duplicateFromUniqueViolation } from '../db/unique-violations';
import { AppError, type ErrorCode } from '../errors';
import { logger } from '../logger';

/**
 * The HTTP status of each error code: the one place where an error becomes a status. Services
 * throw codes (a job or the seed calling them has no HTTP); adding a code means adding its row.
 */
export const HTTP_STATUS_OF_CODE: Record<ErrorCode, number> = {
  'validation-failed': 400,
  'bad-request': 400,
  'import-rejected': 400,
  unauthenticated: 401,
  'invalid-token': 401,
  forbidden: 403,
  'csrf-failed': 403,
  'origin-refused': 403,
  'session-required': 403,
  'not-found': 404,
  conflict: 409,
  'stale-version': 409,
  duplicate: 409,
  retired: 409,
  'in-use': 409,
  replaced: 409,
  'payload-too-large': 413,
  'file-too-large': 413,
  'unsupported-file': 415,
  'unsupported-media-type': 415,
  // a logger file whose content is not text (an image, a workbook, a zero byte), whatever its name
  'not-a-text-file': 415,
  // a logger file whose column names leave the time or the voltage open: the person chooses
  'columns-ambiguous': 422,
  // a text file that cannot be read as a decay run (the reader's reason names row and column)
  'unreadable-file': 422,
  // a photo upload whose content is no image of the accepted types (whatever its name says)
  'not-an-image': 415,
  // a photo of more pixels than PHOTO_MAX_MEGAPIXELS
  'image-too-large': 413,
  'identity-provider-unreachable': 503,
  'database-unavailable': 503,
  // the value may be right: the client asks the person and sends it again with `confirmed: true`
  'confirmation-needed': 422,
  // a visit's planning warnings: saved when the body overrides each with a reason
  'override-needed': 422,
  // the visit's state does not allow the action ("A logged visit can't be started.")
  'visit-state': 409,
  // a decay run corrected since: a review applies to its newest version
  'superseded': 409,
  // the run cannot be a bank's baseline (no trustworthy τ, or something seen wrong at the cabinet)
  'baseline-refused': 422,
  // a decay run's clientId sent again with a different body (a retry sends the same body)
  'client-id-reused': 422,
  // a decay run recorded on a visit that is not planned or under way
  'visit-not-open': 409,
  // a decay run's version corrected already: correct the newest version
  'already-corrected': 409,
  // a decay run on a bank the visit does not cover
  'bank-not-on-visit': 422,
};

/** The status an AppError answers with: its code's. */
export function httpStatusOf(error: AppError): number {
  return HTTP_STATUS_OF_CODE[error.code];
}

/** Unknown /api paths answer in the standard error shape rather than Express's HTML. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not-found', `No API route ${req.method} ${req.path}.`));
};

function toAppError(err: unknown): AppError | null {
  if (err instanceof AppError) return err;
  // PostgreSQL away (pools, session store, a query cut short): the request may be asked again
  if (isDatabaseUnavailable(err)) return AppError.databaseUnavailable();
  // two writes raced past a service's uniqueness check: the unique index refused the second
  const clash = duplicateFromUniqueViolation(err);
  if (clash) return clash;
  if (err instanceof ZodError) {
    const issues = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    const first = issues[0];
    const message = first ? `${first.path || 'body'}: ${first.message}` : 'Invalid input.';
    return AppError.badRequest(message, issues);
  }
  // a path parameter with a broken %-escape (the router could not decode it)
  if (err instanceof URIError) return new AppError('bad-request', 'The address holds a broken %-escape.');
  // body-parser's errors carry a status and `expose`
  const e = err as { status?: number; expose?: boolean; type?: string; message?: string };
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500 && e.expose) {
    const code: ErrorCode =
      e.type === 'entity.too.large' || e.type === 'parameters.too.many'
        ? 'payload-too-large'
        : e.type === 'charset.unsupported' || e.type === 'encoding.unsupported'
          ? 'unsupported-media-type'
          : 'bad-request';
    return new AppError(code, e.message ?? 'Bad request.');
  }
  return null;
}

/** The one error middleware: `{ error: { code, message, issues? } }`; unknown errors are a plain 500. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) {
    // e.g. the session store failed to save after the answer went out: the answer stands
    logger.warn({ err, requestId: req.id }, 'error after the answer was sent');
    if (!res.writableEnded) res.destroy();
    return;
  }
  const known = toAppError(err);
  if (!known) {
    logger.error({ err, requestId: req.id }, 'unhandled error');
    res.status(500).json({
      error: { code: 'internal', message: `Something went wrong on our side (request ${String(req.id)}).` },
    });
    return;
  }
  const status = httpStatusOf(known);
  if (known.code === 'database-unavailable') {
    // one line per refused request, not a stack each: an outage would flood the log
    logger.warn({ requestId: req.id, cause: err instanceof Error ? err.message : String(err) }, known.message);
  } else if (status >= 500) logger.error({ err, requestId: req.id }, known.message);
  // 503s are passing: tell clients when to ask again (RFC 9110, 10.2.3)
  if (status === 503) res.setHeader('Retry-After', String(DATABASE_RETRY_AFTER_SECONDS));
  res.status(status).json({
    error: { ...known.details, code: known.code, message: known.message, ...(known.issues ? { issues: known.issues } : {}) },
  });
};
