import type { EventEmitter } from 'node:events';
import { ConnectionError } from 'sequelize';
import { logger } from '../logger';

/**
 * SQLSTATEs that mean "the server is going away or not taking connections", not "your query
 * is wrong" (PostgreSQL's appendix A, errcodes): 57P01 admin_shutdown, 57P02 crash_shutdown,
 * 57P03 cannot_connect_now; class 08 is connection_exception.
 */
const UNAVAILABLE_SQLSTATE = /^(57P0[123]|08[0-9A-Z]{3})$/;

/** Socket-level failures (Node's errno codes) on the way to the database. */
const UNAVAILABLE_ERRNO = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  'ETIMEDOUT',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
]);

/**
 * What node-postgres and pg-pool say, without a code, when the connection is gone or cannot be
 * made in time (the texts of pg/lib/client.js and pg-pool/index.js), and what Sequelize says when
 * its pool has been closed (the process is stopping).
 */
const UNAVAILABLE_MESSAGE =
  /^(Connection terminated( unexpectedly| due to connection timeout)?|Client has encountered a connection error and is not queryable|Client was closed and is not queryable|timeout exceeded when trying to connect|Cannot use a pool after calling end on the pool|Query read timeout|ConnectionManager\.getConnection was called after the connection manager was closed!?)$/;

interface ErrorLike {
  code?: unknown;
  message?: unknown;
  parent?: unknown;
  original?: unknown;
  cause?: unknown;
  errors?: unknown;
}

/**
 * True when `err` means the database cannot be reached right now (refused, reset, shutting down,
 * starting up, connection lost or timed out), as opposed to a fault of the request or the code.
 * Looks through Sequelize's wrappers (`parent`, `original`), `cause` and AggregateError's
 * `errors`, so the session store's raw pg errors and Sequelize's wrapped ones both count.
 *
 * @example isDatabaseUnavailable(new ConnectionRefusedError(err)) // true
 * @example isDatabaseUnavailable(Object.assign(new Error('x'), { code: '23505' })) // false
 */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 5) return false;
  if (err instanceof ConnectionError) return true;
  const e = err as ErrorLike;
  if (
    typeof e.code === 'string' &&
    (UNAVAILABLE_SQLSTATE.test(e.code) || UNAVAILABLE_ERRNO.has(e.code))
  ) {
    return true;
  }
  if (typeof e.message === 'string' && UNAVAILABLE_MESSAGE.test(e.message)) return true;
  const inner = [e.parent, e.original, e.cause, ...(Array.isArray(e.errors) ? e.errors : [])];
  return inner.some((cause) => cause !== err && isDatabaseUnavailable(cause, depth + 1));
}

/**
 * How many seconds a client should wait before asking again while the database is away (or the
 * server restarts). Short, so a page that asks again by itself is back within a few seconds of
 * PostgreSQL; a refused request costs the server almost nothing.
 */
export const DATABASE_RETRY_AFTER_SECONDS = 2;

/**
 * node-postgres pools emit 'error' when an idle client's connection drops (PostgreSQL stopped or
 * restarted); without a listener that event ends the process. The pool has already thrown the
 * broken client away and connects afresh on the next query, so noting it is all there is to do.
 */
export function survivePoolErrors(pool: EventEmitter, name: string): void {
  pool.on('error', (err: unknown) =>
    logger.warn({ pool: name, err }, 'an idle database connection was lost'),
  );
}
