import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError } from '../errors';
import { logger } from '../logger';

/** Unknown /api paths answer in the standard error shape rather than Express's HTML. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not-found', 404, `No API route ${req.method} ${req.path}.`));
};

function toAppError(err: unknown): AppError | null {
  if (err instanceof AppError) return err;
  if (err instanceof ZodError) {
    const issues = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    const first = issues[0];
    const message = first ? `${first.path || 'body'}: ${first.message}` : 'Invalid input.';
    return AppError.badRequest(message, issues);
  }
  // body-parser's errors carry a status and `expose`
  const e = err as { status?: number; expose?: boolean; type?: string; message?: string };
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500 && e.expose) {
    const code = e.type === 'entity.too.large' ? 'payload-too-large' : 'bad-request';
    return new AppError(code, e.status, e.message ?? 'Bad request.');
  }
  return null;
}

/** The one error middleware: `{ error: { code, message, issues? } }`; unknown errors are a plain 500. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const known = toAppError(err);
  if (!known) {
    logger.error({ err, requestId: req.id }, 'unhandled error');
    res.status(500).json({
      error: { code: 'internal', message: `Something went wrong on our side (request ${String(req.id)}).` },
    });
    return;
  }
  if (known.status >= 500) logger.error({ err, requestId: req.id }, known.message);
  res.status(known.status).json({
    error: { code: known.code, message: known.message, ...(known.issues ? { issues: known.issues } : {}) },
  });
};
