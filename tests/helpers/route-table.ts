import type { Express, RequestHandler } from 'express';
import type { ZodType } from 'zod';
import { CELLAR_POLICY, requireSignIn, type CellarAccessPolicy } from '../../server/http/access';
import { ROUTE_SCHEMAS } from '../../server/http/handle';

/** What guards a route, as found on the middleware in front of it. */
export type RouteGate =
  /** Under /api/cellars/:cellarId/…, behind the one access gate with this policy. */
  | { kind: 'cellar'; policy: CellarAccessPolicy }
  /** Behind requireSignIn only (the caller's own things: their cellars, their session). */
  | { kind: 'signed-in' }
  /** Nothing in front of it: the route's own code decides. */
  | { kind: 'open' };

export interface RouteInfo {
  method: string;
  /** Full path pattern, e.g. /api/cellars/:cellarId/batches/:batchId/readings. */
  path: string;
  gate: RouteGate;
  schemas: { params?: ZodType; query?: ZodType; body?: ZodType };
}

interface Layer {
  rawPath?: string | string[];
  handle: RequestHandler & { stack?: Layer[] };
  route?: { path: string; methods: Record<string, boolean>; stack: Layer[] };
}

const joinPaths = (prefix: string, path: string) => (prefix + (path === '/' ? '' : path)).replace(/\/{2,}/g, '/') || '/';

/**
 * Every route of the app, found by walking Express's router stack (so a new route is found
 * without touching the tests), with the gate in front of it and the schemas `handle` declared.
 */
export function routesOf(app: Express): RouteInfo[] {
  const routes: RouteInfo[] = [];
  const root = (app as unknown as { router: { stack: Layer[] } }).router;
  walk(root.stack, '', { kind: 'open' }, routes);
  return routes;
}

function gateOf(handler: RequestHandler, current: RouteGate): RouteGate {
  const policy = (handler as unknown as Record<symbol, CellarAccessPolicy | undefined>)[CELLAR_POLICY];
  if (policy) return { kind: 'cellar', policy };
  if (handler === requireSignIn && current.kind === 'open') return { kind: 'signed-in' };
  return current;
}

function walk(stack: Layer[], prefix: string, inherited: RouteGate, out: RouteInfo[]): void {
  // Middleware mounted on a path guards what follows it on that same path.
  const gates = new Map<string, RouteGate>();
  for (const layer of stack) {
    const raw = Array.isArray(layer.rawPath) ? layer.rawPath[0] : layer.rawPath;
    const path = joinPaths(prefix, raw ?? '/');
    const gate = [...gates.entries()]
      .filter(([at]) => path === at || path.startsWith(`${at}/`))
      .reduce<RouteGate>((g, [, found]) => strongest(g, found), inherited);
    if (layer.route) {
      const handlers = layer.route.stack.map((l) => l.handle);
      const routeGate = handlers.reduce(gateOfReducer, gate);
      const schemaHolder = handlers.find((h) => (h as unknown as Record<symbol, unknown>)[ROUTE_SCHEMAS]);
      const schemas = (schemaHolder as unknown as Record<symbol, RouteInfo['schemas']> | undefined)?.[ROUTE_SCHEMAS] ?? {};
      for (const method of Object.keys(layer.route.methods)) {
        if (method === '_all') continue;
        out.push({ method: method.toUpperCase(), path: joinPaths(prefix, layer.route.path), gate: routeGate, schemas });
      }
    } else if (layer.handle.stack) {
      walk(layer.handle.stack, path, gate, out);
    } else {
      const found = gateOf(layer.handle, { kind: 'open' });
      if (found.kind !== 'open') gates.set(path === '/' ? '' : path, strongest(gates.get(path) ?? { kind: 'open' }, found));
    }
  }
}

const gateOfReducer = (gate: RouteGate, handler: RequestHandler) => gateOf(handler, gate);
const RANK = { open: 0, 'signed-in': 1, cellar: 2 } as const;
const strongest = (a: RouteGate, b: RouteGate): RouteGate => (RANK[b.kind] >= RANK[a.kind] ? b : a);
