import { describe, expect, it } from 'vitest';
import { createApp } from '../../../api/src/app';
import type { DeclaredRoute } from '../../../api/src/middleware/route-access';

const app = createApp();
// a cabinet's unplanned visits and a bank's decay runs hang off register paths but follow the
// rules of visits and runs (tests/api/planner, tests/api/decay-runs), not the register's
const routes = (app.locals.apiRoutes as DeclaredRoute[]).filter(
  (r) =>
    /^\/api\/(sites|areas|cabinets|banks|bank-designs|spares)(\/|$)/.test(r.path) &&
    !/\/(unplanned-visits|decay-runs)$/.test(r.path),
);

const READERS = ['admin', 'planner', 'technician', 'reliability'];
const EDITORS = ['admin', 'planner'];
const ENGINEERS = ['admin', 'reliability'];

/** Who each register route lets in: everyone reads; planners keep the register; engineers keep designs and baselines. */
function expectedRoles(route: DeclaredRoute): string[] {
  if (route.method === 'GET' && !route.path.startsWith('/api/cabinets/import')) return READERS;
  if (route.path.startsWith('/api/bank-designs')) return ENGINEERS;
  if (route.path.endsWith('/baseline')) return ENGINEERS;
  return EDITORS;
}

describe('the register’s role rules', () => {
  it('when the app is built, then every register route is mounted', () => {
    expect(routes.map((r) => `${r.method} ${r.path}`).sort()).toEqual(
      [
        'GET /api/sites',
        'POST /api/sites',
        'GET /api/sites/:siteId',
        'PATCH /api/sites/:siteId',
        'DELETE /api/sites/:siteId',
        'GET /api/sites/:siteId/areas',
        'POST /api/sites/:siteId/areas',
        'GET /api/sites/:siteId/audit',
        'GET /api/areas',
        'POST /api/areas',
        'GET /api/areas/:areaId',
        'PATCH /api/areas/:areaId',
        'DELETE /api/areas/:areaId',
        'GET /api/areas/:areaId/cabinets',
        'GET /api/areas/:areaId/audit',
        'GET /api/cabinets',
        'POST /api/cabinets',
        'GET /api/cabinets/import/template',
        'POST /api/cabinets/import/preview',
        'POST /api/cabinets/import',
        'GET /api/cabinets/:cabinetId',
        'PATCH /api/cabinets/:cabinetId',
        'DELETE /api/cabinets/:cabinetId',
        'GET /api/cabinets/:cabinetId/banks',
        'POST /api/cabinets/:cabinetId/banks',
        'GET /api/cabinets/:cabinetId/label',
        'GET /api/cabinets/:cabinetId/audit',
        'GET /api/banks',
        'POST /api/banks',
        'GET /api/banks/:bankId',
        'PATCH /api/banks/:bankId',
        'DELETE /api/banks/:bankId',
        'PUT /api/banks/:bankId/baseline',
        'POST /api/banks/:bankId/replacement',
        'GET /api/banks/:bankId/audit',
        'GET /api/bank-designs',
        'POST /api/bank-designs',
        'GET /api/bank-designs/:designId',
        'PATCH /api/bank-designs/:designId',
        'DELETE /api/bank-designs/:designId',
        'GET /api/bank-designs/:designId/versions',
        'GET /api/bank-designs/:designId/audit',
        'GET /api/spares',
        'POST /api/spares',
        'GET /api/spares/:spareId',
        'PATCH /api/spares/:spareId',
        'DELETE /api/spares/:spareId',
        'GET /api/spares/:spareId/audit',
      ].sort(),
    );
  });

  it.each(routes.map((r) => [`${r.method} ${r.path}`, r] as const))('%s declares the roles of its part of the register', (_name, route) => {
    expect(route.access?.kind).toBe('roles');
    const roles = route.access?.kind === 'roles' ? [...route.access.roles].sort() : [];
    expect(roles).toEqual([...expectedRoles(route)].sort());
  });
});
