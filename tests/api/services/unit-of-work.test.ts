/**
 * The unit of work: one transaction and one instant per write, given by the edge to one
 * service call; errors that carry codes, mapped to statuses by the error middleware alone.
 */
import express from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { sequelize } from '../../../api/src/db/sequelize';
import { AppError, ERROR_CODES } from '../../../api/src/errors';
import { errorHandler, HTTP_STATUS_OF_CODE } from '../../../api/src/middleware/error-handler';
import { createBank } from '../../../api/src/services/banks';
import { retireCabinet } from '../../../api/src/services/cabinets';
import { updatePerson } from '../../../api/src/services/people';
import { createSite, updateSite } from '../../../api/src/services/sites';
import { withUnitOfWork } from '../../../api/src/services/unit-of-work';
import {
  countRows,
  createActor,
  makeArea,
  makeCabinet,
  makeDesign,
  makeSite,
} from '../../support/register';

let planner: Awaited<ReturnType<typeof createActor>>;

beforeAll(async () => {
  planner = await createActor(['planner']);
});

/** Rows of a query, as plain objects. */
async function rows<T>(sql: string, replacements: Record<string, unknown>): Promise<T[]> {
  const [found] = await sequelize.query(sql, { replacements });
  return found as T[];
}

describe('withUnitOfWork', () => {
  it('when a write commits, then every instant it stores (the change and its audit entries) is the one the edge read', async () => {
    const site = await makeSite(planner.actor);
    const area = await makeArea(planner.actor, site.id);
    const cabinet = await makeCabinet(planner.actor, area.id);
    const design = await makeDesign(planner.actor);
    const at = new Date('2031-05-06T07:08:09.123Z');
    const bank = await withUnitOfWork(
      planner.actor,
      (uow) =>
        createBank(uow, {
          cabinetId: cabinet.id,
          bankDesignId: design.id,
          position: 'DC1',
          serialNumber: '',
          installedOn: '2020-01-15',
          notes: '',
        }),
      { now: at },
    );
    expect(bank.baselineSetAt.toISOString()).toBe(at.toISOString());

    const retiredAt = new Date('2031-05-07T10:00:00.000Z');
    const retired = await withUnitOfWork(
      planner.actor,
      (uow) => retireCabinet(uow, cabinet.id, cabinet.version),
      { now: retiredAt },
    );
    expect(retired.retiredAt?.toISOString()).toBe(retiredAt.toISOString());
    const entries = await rows<{ entity_type: string; action: string; at: Date; actor_id: string }>(
      `SELECT entity_type, action, at, actor_id FROM audit_entries WHERE entity_id IN (:ids) ORDER BY at, entity_type`,
      { ids: [cabinet.id, bank.id] },
    );
    const written = entries.filter((e) => !(e.entity_type === 'cabinet' && e.action === 'create'));
    expect(written.map((e) => `${e.entity_type} ${e.action} ${e.at.toISOString()}`)).toEqual([
      `bank create ${at.toISOString()}`,
      `bank retire ${retiredAt.toISOString()}`,
      `cabinet retire ${retiredAt.toISOString()}`,
    ]);
    expect(new Set(entries.map((e) => e.actor_id))).toEqual(new Set([planner.actor.id]));
    const [bankRow] = await rows<{ retired_at: Date }>(
      `SELECT retired_at FROM banks WHERE id = :id`,
      { id: bank.id },
    );
    expect(bankRow!.retired_at.toISOString()).toBe(retiredAt.toISOString());
  });

  it('when the work throws after writing, then nothing of it is stored and the error passes on unchanged', async () => {
    const sitesBefore = await countRows('sites');
    const auditBefore = await countRows('audit_entries');
    const thrown = new AppError('conflict', 'stopped on purpose');
    const outcome = withUnitOfWork(planner.actor, async (uow) => {
      await createSite(uow, {
        name: 'Rolled Back Works',
        code: 'RBW',
        address: '',
        timeZone: 'UTC',
      });
      throw thrown;
    });
    await expect(outcome).rejects.toBe(thrown);
    expect(await countRows('sites')).toBe(sitesBefore);
    expect(await countRows('audit_entries')).toBe(auditBefore);
  });

  it('when a service refuses, then its error carries a code and the fields, never an HTTP status', async () => {
    const site = await makeSite(planner.actor);
    const refusal = await withUnitOfWork(planner.actor, (uow) =>
      updateSite(uow, site.id, { version: site.version + 5, name: 'Later' }),
    ).catch((err: unknown) => err);
    expect(refusal).toBeInstanceOf(AppError);
    expect(refusal).toMatchObject({ code: 'stale-version' });
    expect(refusal).not.toHaveProperty('status');
    const clash = await withUnitOfWork(planner.actor, (uow) =>
      createSite(uow, {
        name: `${site.name} again`,
        code: site.code,
        address: '',
        timeZone: 'UTC',
      }),
    ).catch((err: unknown) => err);
    expect(clash).toMatchObject({ code: 'duplicate', issues: [{ path: 'code' }] });
  });
});

describe('people changes in a unit of work', () => {
  const origin = { ip: '127.0.0.1', userAgent: 'unit-of-work test' };

  it('when an admin changes a person’s roles, then the sign-in log entry is written with the change, at its instant, naming the admin', async () => {
    const admin = await createActor(['admin']);
    const person = await createActor(['technician']);
    const at = new Date('2032-01-02T03:04:05.000Z');
    const changed = await withUnitOfWork(
      admin.actor,
      (uow) => updatePerson(uow, person.user.id, { roles: ['planner'] }, origin),
      { now: at },
    );
    expect(changed.roles).toEqual(['planner']);
    const entries = await rows<{ kind: string; created_at: Date; actor_id: string }>(
      `SELECT kind, created_at, actor_id FROM access_events WHERE user_id = :id`,
      { id: person.user.id },
    );
    expect(entries).toEqual([{ kind: 'roles-changed', created_at: at, actor_id: admin.actor.id }]);
  });

  it('when the change is refused, then neither the person nor the log changes', async () => {
    const admin = await createActor(['admin']);
    const logBefore = await countRows('access_events');
    const refusal = withUnitOfWork(admin.actor, (uow) =>
      updatePerson(uow, admin.user.id, { roles: ['planner'], active: false }, origin),
    );
    await expect(refusal).rejects.toMatchObject({ code: 'conflict' });
    expect(await countRows('access_events')).toBe(logBefore);
    const [me] = await rows<{ roles: string[]; active: boolean }>(
      `SELECT roles, active FROM users WHERE id = :id`,
      { id: admin.user.id },
    );
    expect(me).toEqual({ roles: ['admin'], active: true });
  });
});

describe('the error middleware', () => {
  /** An app whose one route throws `error`. */
  function throwing(error: unknown) {
    const app = express();
    app.get('/', () => {
      throw error;
    });
    app.use(errorHandler);
    return app;
  }

  it('when an error carries a code, then the answer has that code’s status and the shape { error: { code, message, issues } }', async () => {
    const expected: Record<string, number> = {
      'validation-failed': 400,
      unauthenticated: 401,
      forbidden: 403,
      'not-found': 404,
      'stale-version': 409,
      duplicate: 409,
    };
    for (const [code, status] of Object.entries(expected)) {
      const issues = [{ path: 'name', message: 'Enter a name.' }];
      const res = await request(
        throwing(new AppError(code as (typeof ERROR_CODES)[number], 'Said plainly.', issues)),
      ).get('/');
      expect(res.status, code).toBe(status);
      expect(res.body).toEqual({ error: { code, message: 'Said plainly.', issues } });
    }
  });

  it('when any known code is thrown, then it maps to a 4xx or 5xx status', () => {
    for (const code of ERROR_CODES) {
      expect(HTTP_STATUS_OF_CODE[code], code).toBeGreaterThanOrEqual(400);
      expect(HTTP_STATUS_OF_CODE[code], code).toBeLessThan(600);
    }
  });
});
