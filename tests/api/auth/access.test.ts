import crypto from 'node:crypto';
import express from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import {
  allowPublic,
  requireRole,
  requireSignedIn,
} from '../../../api/src/middleware/require-role';
import {
  assertEveryRouteDeclaresAccess,
  listRoutes,
  type DeclaredRoute,
} from '../../../api/src/middleware/route-access';
import { ROLES, type Role } from '../../../shared/constants/roles';
import { createCaller, type TestCaller } from '../../support/auth';

const app = createApp();
const routes = app.locals.apiRoutes as DeclaredRoute[];

/** A path of the route with every :param filled by a made-up id. */
function concrete(path: string): string {
  return path.replace(/:(\w+)/g, () => crypto.randomUUID());
}

function call(route: DeclaredRoute, path: string) {
  const agent = request(app);
  switch (route.method) {
    case 'GET':
      return agent.get(path);
    case 'POST':
      return agent.post(path).send({});
    case 'PUT':
      return agent.put(path).send({});
    case 'PATCH':
      return agent.patch(path).send({});
    case 'DELETE':
      return agent.delete(path);
    default:
      throw new Error(`no test call for ${route.method}`);
  }
}

const guarded = routes.filter((r) => r.access?.kind !== 'public');

describe('the API’s routes', () => {
  it('when the app is built, then every route declares who may use it', () => {
    expect(routes.length).toBeGreaterThan(5);
    expect(routes.filter((r) => !r.access)).toEqual([]);
    expect(
      routes.filter((r) => r.access?.kind === 'public').map((r) => `${r.method} ${r.path}`),
    ).toEqual(['GET /api/health']);
  });

  it('when a router has a route without roles, then building the app fails and names the route', () => {
    const api = express.Router();
    const people = express.Router();
    people.get('/', requireRole('admin'), (_req, res) => res.end());
    people.post('/:userId/notes', (_req, res) => res.end());
    api.use(
      '/health',
      express.Router().get('/', allowPublic, (_req, res) => res.end()),
    );
    api.use('/people', people);
    expect(() => assertEveryRouteDeclaresAccess(api, '/api')).toThrow(
      /POST \/api\/people\/:userId\/notes/,
    );
  });

  it('when a guard comes after the handler, then it does not count', () => {
    const router = express.Router();
    router.get('/late', (_req, res) => res.end(), requireSignedIn);
    expect(listRoutes(router)).toEqual([{ method: 'GET', path: '/late', access: null }]);
  });

  it('when a router declares roles for all its routes with use(), then its routes inherit them', () => {
    const router = express.Router();
    router.use(requireRole('planner'));
    router.get('/plans', (_req, res) => res.end());
    expect(listRoutes(router, '/api/x')).toEqual([
      { method: 'GET', path: '/api/x/plans', access: { kind: 'roles', roles: ['planner'] } },
    ]);
  });
});

describe.each(guarded.map((r) => [`${r.method} ${r.path}`, r] as const))('%s', (_name, route) => {
  it('when nobody is signed in, then 401 in the standard error shape', async () => {
    const res = await call(route, concrete(route.path));
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
  });

  it('when the token is unknown, then 401', async () => {
    const res = await call(route, concrete(route.path)).set(
      'Authorization',
      'Bearer ebl_not-a-real-token',
    );
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('invalid-token');
  });

  const access = route.access!;
  const denied: Role[] | null =
    access.kind === 'roles'
      ? ROLES.filter((r) => !access.roles.includes(r))
      : access.kind === 'any-role'
        ? []
        : null;
  if (denied) {
    let caller: TestCaller;
    beforeAll(async () => {
      caller = await createCaller(denied, denied.join('+') || 'no-role');
    });
    it(`when the caller holds only ${denied.length ? denied.join(', ') : 'no role'}, then 403 in the standard error shape`, async () => {
      const res = await call(route, concrete(route.path)).set('Authorization', caller.auth);
      expect(res.status).toBe(403);
      expect(res.body).toEqual({ error: { code: 'forbidden', message: expect.any(String) } });
    });
  }
});
