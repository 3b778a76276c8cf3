import type { Router } from 'express';
import { accessRuleOf, type AccessRule } from './require-role';

/** One route of a router tree with the access it declares (null: none, which is refused). */
export interface DeclaredRoute {
  method: string;
  /** Full path as mounted, e.g. /api/people/:userId. */
  path: string;
  access: AccessRule | null;
}

// The parts of Express 5's router layers that this walk reads.
interface WalkLayer {
  handle: unknown;
  rawPath?: unknown;
  route?: { path: unknown; methods: Record<string, boolean>; stack: WalkLayer[] };
}

function pathText(raw: unknown): string {
  if (typeof raw === 'string') return raw === '/' ? '' : raw;
  if (Array.isArray(raw)) return `{${raw.map(pathText).join('|')}}`;
  return raw instanceof RegExp ? raw.toString() : '';
}

/**
 * Every route of a router tree, with the access rule it declares: an access guard in the
 * route's own chain before its handler, or one that the router (or a parent router) runs with
 * `use()` before the route.
 */
export function listRoutes(router: Router, prefix = ''): DeclaredRoute[] {
  const found: DeclaredRoute[] = [];
  walk((router as unknown as { stack: WalkLayer[] }).stack, prefix, null, found);
  return found;
}

function walk(
  stack: WalkLayer[],
  prefix: string,
  inherited: AccessRule | null,
  found: DeclaredRoute[],
): void {
  let routerRule = inherited;
  for (const layer of stack) {
    if (layer.route) {
      const handlers = layer.route.stack;
      // a guard counts only before the last handler: the last one does the work
      const guardIndex = handlers.findIndex((h) => accessRuleOf(h.handle));
      const own =
        guardIndex >= 0 && guardIndex < handlers.length - 1
          ? accessRuleOf(handlers[guardIndex]?.handle)
          : undefined;
      const access = own ?? routerRule;
      const methods = Object.keys(layer.route.methods).filter((m) => m !== '_all');
      for (const method of methods.length ? methods : ['all']) {
        found.push({
          method: method.toUpperCase(),
          path: prefix + pathText(layer.route.path) || '/',
          access,
        });
      }
      continue;
    }
    const nested = (layer.handle as { stack?: WalkLayer[] } | null)?.stack;
    if (Array.isArray(nested)) {
      walk(nested, prefix + pathText(layer.rawPath), routerRule, found);
      continue;
    }
    const rule = accessRuleOf(layer.handle);
    // only a guard for the whole router covers the routes after it; one for a sub-path does not
    if (rule && (layer.rawPath === undefined || layer.rawPath === '/')) routerRule = rule;
  }
}

/**
 * Deny by default, at boot: throws when any route of the tree declares no access, naming
 * each one, so an undeclared route can never be served.
 */
export function assertEveryRouteDeclaresAccess(router: Router, prefix = ''): DeclaredRoute[] {
  const routes = listRoutes(router, prefix);
  const undeclared = routes.filter((r) => !r.access);
  if (undeclared.length > 0) {
    throw new Error(
      `These API routes declare no roles (add requireRole(...), requireAnyRole, requireSignedIn or allowPublic before the handler):\n${undeclared
        .map((r) => `  ${r.method} ${r.path}`)
        .join('\n')}`,
    );
  }
  return routes;
}
