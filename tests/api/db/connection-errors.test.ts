import express from 'express';
import {
  ConnectionAcquireTimeoutError,
  ConnectionRefusedError,
  DatabaseError,
  UniqueConstraintError,
} from 'sequelize';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { DATABASE_UNAVAILABLE_MESSAGE } from '../../../shared/constants/availability';
import { isDatabaseUnavailable } from '../../../api/src/db/connection-errors';
import { AppError } from '../../../api/src/errors';
import { errorHandler } from '../../../api/src/middleware/error-handler';

/** A pg error as node-postgres makes it: a message and the server's SQLSTATE. */
const pgError = (code: string, message: string) => Object.assign(new Error(message), { code });
const socketError = (code: string) =>
  Object.assign(new Error(`connect ${code} 127.0.0.1:5433`), { code, syscall: 'connect' });

describe('isDatabaseUnavailable', () => {
  // SQLSTATEs from PostgreSQL's appendix A (errcodes); errno names from Node's net module
  it.each([
    ['Sequelize refused', new ConnectionRefusedError(socketError('ECONNREFUSED'))],
    ['Sequelize pool timeout', new ConnectionAcquireTimeoutError(new Error('timeout'))],
    [
      '57P01 admin_shutdown in a query',
      new DatabaseError(
        pgError('57P01', 'terminating connection due to administrator command') as never,
      ),
    ],
    [
      '57P03 cannot_connect_now (the session store)',
      pgError('57P03', 'the database system is starting up'),
    ],
    [
      '57P02 crash_shutdown',
      pgError('57P02', 'terminating connection because of crash of another server process'),
    ],
    ['08006 connection_failure', pgError('08006', 'connection failure')],
    ['ECONNRESET', socketError('ECONNRESET')],
    [
      'ECONNREFUSED inside an AggregateError',
      new AggregateError([socketError('ECONNREFUSED')], 'connect failed'),
    ],
    ['a lost connection without a code', new Error('Connection terminated unexpectedly')],
    [
      'a client broken by an earlier error',
      new Error('Client has encountered a connection error and is not queryable'),
    ],
    ['pg-pool giving up connecting', new Error('timeout exceeded when trying to connect')],
  ])('when %s, then the database is unavailable', (_name, err) => {
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each([
    [
      'a unique clash (23505)',
      new UniqueConstraintError({ parent: pgError('23505', 'duplicate key') as never }),
    ],
    ['a syntax error (42601)', new DatabaseError(pgError('42601', 'syntax error') as never)],
    ['a refused write (42501)', pgError('42501', 'permission denied for table audit_entries')],
    ['a plain bug', new TypeError("Cannot read properties of undefined (reading 'id')")],
    ['an AppError', AppError.notFound('Site')],
    ['nothing', undefined],
  ])('when %s, then it is not an outage', (_name, err) => {
    expect(isDatabaseUnavailable(err)).toBe(false);
  });
});

describe('the error middleware and an unreachable database', () => {
  const appThrowing = (err: unknown) => {
    const app = express();
    app.get('/api/thing', () => {
      throw err;
    });
    app.use(errorHandler);
    return app;
  };

  it('when a route meets a refused connection, then 503 database-unavailable with Retry-After and the plain message', async () => {
    const res = await request(
      appThrowing(new ConnectionRefusedError(socketError('ECONNREFUSED'))),
    ).get('/api/thing');
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toMatch(/^\d+$/);
    expect(res.body).toEqual({
      error: { code: 'database-unavailable', message: DATABASE_UNAVAILABLE_MESSAGE },
    });
  });

  it('when a route meets a bug, then still a plain 500 without Retry-After', async () => {
    const res = await request(appThrowing(new TypeError('boom'))).get('/api/thing');
    expect(res.status).toBe(500);
    expect(res.headers['retry-after']).toBeUndefined();
    expect(res.body.error.code).toBe('internal');
  });

  it('when a schema refuses the body, then still 400 (the outage check does not swallow other errors)', async () => {
    const parsed = z.object({ name: z.string() }).safeParse({});
    const res = await request(appThrowing(parsed.error)).get('/api/thing');
    expect(res.status).toBe(400);
  });

  it('when an error arrives after the answer went out (a session save failing), then the answer stands', async () => {
    const app = express();
    app.get('/api/thing', (_req, res, next) => {
      res.json({ ok: true });
      next(new ConnectionRefusedError(socketError('ECONNREFUSED')));
    });
    app.use(errorHandler);
    const res = await request(app).get('/api/thing');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
  });
});
