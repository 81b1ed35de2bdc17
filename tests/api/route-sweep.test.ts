import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { neededRole } from '../../server/http/access';
import { roleAtLeast, type Role } from '../../shared/roles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { routesOf, type RouteInfo } from '../helpers/route-table';
import { cellarFingerprint, fillPath, idForField, sweepWorld, type CellarIds, type SweepWorld } from '../helpers/sweep-world';
import { sampleOf } from '../helpers/zod-sample';

/**
 * Every route of the app, found by walking its router stack, tried signed out, by a member of
 * another cellar carrying the victim's ids, and in each role. A route nobody has given a
 * policy (behind the cellar gate, or listed below) fails the sweep.
 */

/** Routes open to anyone by design; each decides for itself what a stranger may learn. */
const OPEN_ROUTES = new Set([
  'POST /api/auth/sign-in',
  'POST /api/auth/sign-out',
  'POST /api/auth/invitation/preview',
  'POST /api/auth/invitation/sign-up',
  'POST /api/auth/password-reset',
  'POST /api/auth/password-reset/complete',
  'GET /s/:code',
  'GET /api/cards/:code',
  'GET /api/health',
  // The one-click unsubscribe link of reminder mails: its HMAC signature is the permission.
  'GET /api/mail/unsubscribe',
  'POST /api/mail/unsubscribe',
  // The calendar feed: its file name carries a secret token, and only that token opens it.
  'GET /calendar/:file',
  // Digital hydrometers: a device token in the Authorization header is the permission (401 without).
  'POST /api/ingest/readings',
]);
/** Routes that need a session but no cellar: they answer only about the caller. */
const SIGNED_IN_ROUTES = new Set(['GET /api/auth/me', 'GET /api/cellars', 'POST /api/auth/invitation/accept', 'GET /api/scan/:code']);

let world: SweepWorld;
let outsider: Crew;
let routes: RouteInfo[];
const counts = { requests: 0, leaks: 0, roleEscapes: 0, over499: 0 };
const problems: string[] = [];

beforeAll(async () => {
  world = await sweepWorld();
  outsider = await crewWithAgents(world.app, world.ds);
  routes = routesOf(world.app);
}, 120_000);

const key = (r: RouteInfo) => `${r.method} ${r.path}`;

/** A request of a route, its ids from `ids` (path) and `bodyIds` (body and query). */
function send(
  agent: request.Agent | ReturnType<typeof request>,
  route: RouteInfo,
  pathIds: CellarIds,
  bodyIds: CellarIds,
  pathOverrides: Record<string, string> = {},
) {
  const ctx = { idFor: (field: string) => idForField(bodyIds, field), labelCode: bodyIds.code };
  const url = fillPath(route.path, pathIds, pathOverrides);
  const query = route.schemas.query ? flatQuery(sampleOf(route.schemas.query, ctx)) : {};
  const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  const req = (agent as unknown as Record<string, (url: string) => request.Test>)[method](url).query(query);
  counts.requests++;
  return route.schemas.body && method !== 'get' ? req.send(sampleOf(route.schemas.body, ctx) as object) : req;
}

function flatQuery(sample: unknown): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, value] of Object.entries((sample ?? {}) as Record<string, unknown>)) {
    if (value !== undefined && value !== null && typeof value !== 'object') out[name] = String(value);
  }
  return out;
}

const mentionsAny = (text: string, ids: Set<string>) => [...ids].find((id) => text.includes(id));

function note(problem: string) {
  problems.push(problem);
}

describe('route sweep', () => {
  it('knows a policy for every route', () => {
    const unknown = routes.filter((r) => {
      if (r.path.startsWith('/api/cellars/:cellarId')) return r.gate.kind !== 'cellar';
      if (r.gate.kind === 'cellar') return false;
      if (r.gate.kind === 'signed-in') return !SIGNED_IN_ROUTES.has(key(r));
      return !OPEN_ROUTES.has(key(r)) && !SIGNED_IN_ROUTES.has(key(r));
    });
    expect(unknown.map(key), 'routes without a known policy: put them behind the cellar gate or list them here').toEqual([]);
    expect(routes.length).toBeGreaterThan(40);
  });

  it('answers 401 signed out on every route behind a session, and leaks nothing on the open ones', async () => {
    for (const route of routes) {
      const res = await send(request(world.app), route, world.ids, world.ids);
      if (res.status >= 500) counts.over499++;
      if (route.gate.kind === 'open') {
        const leaked = mentionsAny(JSON.stringify(res.body ?? '') + (res.text ?? '') + (res.headers.location ?? ''), world.ids.all);
        if (leaked) note(`${key(route)} signed out answered with a cellar id`);
      } else if (res.status !== 401) {
        note(`${key(route)} signed out answered ${res.status}, not 401`);
      }
    }
    expect(problems).toEqual([]);
  });

  it("treats another cellar's member with the victim's ids as a stranger: 404 like a missing cellar, no data, no change", async () => {
    const before = await cellarFingerprint(world.ds, world.ids.cellarId);
    const agent = outsider.as.keeper;
    const ownIds: CellarIds = { ...world.ids, cellarId: outsider.cellar.id, all: new Set() };
    for (const route of routes) {
      if (route.gate.kind === 'open') continue;
      // 1. The victim's cellar in the path (and its ids everywhere).
      const victimPath = await send(agent, route, world.ids, world.ids);
      if (victimPath.status >= 500) counts.over499++;
      if (route.gate.kind === 'cellar') {
        const missing = await send(agent, route, world.ids, world.ids, { cellarId: '00000000-0000-4000-8000-000000000000' });
        if (victimPath.status !== 404 || JSON.stringify(victimPath.body) !== JSON.stringify(missing.body)) {
          note(`${key(route)} with the victim's cellar answered ${victimPath.status}, unlike a missing cellar`);
        }
      }
      if (victimPath.status < 300 && mentionsAny(JSON.stringify(victimPath.body ?? ''), world.ids.all)) {
        counts.leaks++;
        note(`${key(route)} showed the victim's records to an outsider`);
      }
      // 2. The outsider's own cellar in the path, the victim's ids in the rest of the path and the body.
      if (route.gate.kind === 'cellar') {
        const ownPath = await send(agent, route, ownIds, world.ids);
        if (ownPath.status >= 500) counts.over499++;
        const leaked = mentionsAny(JSON.stringify(ownPath.body ?? '') + (ownPath.text ?? ''), world.ids.all);
        if (ownPath.status < 300 && leaked) {
          counts.leaks++;
          note(`${key(route)} in the outsider's own cellar answered ${ownPath.status} with the victim's id ${leaked}`);
        }
      }
    }
    expect(await cellarFingerprint(world.ds, world.ids.cellarId), "the victim's records changed").toBe(before);
    expect(problems).toEqual([]);
    expect(counts.leaks).toBe(0);
  });

  it('refuses every write above the role with 403 and changes nothing; lets every member through the gate to read', async () => {
    const roles: Role[] = ['guest', 'hand', 'keeper'];
    const cellarRoutes = routes.filter((r) => r.gate.kind === 'cellar');
    // Reads first: a first read may set up defaults (ageing plans), which is not a refused write.
    for (const route of cellarRoutes.filter((r) => r.method === 'GET')) {
      for (const role of roles) {
        const res = await send(world.crew.as[role], route, world.ids, world.ids);
        if (res.status >= 500) counts.over499++;
        // A service may ask more than the gate (Keeper-only mail, say) or find nothing: only the
        // gate's own refusals (401, "No such cellar") would mean a member was not let in.
        const gateRefused = res.status === 401 || (res.status === 404 && res.body?.message === 'No such cellar.');
        if (gateRefused) note(`${key(route)} did not let a ${role} of the cellar in: ${res.status}`);
      }
    }
    const before = await cellarFingerprint(world.ds, world.ids.cellarId);
    for (const route of cellarRoutes.filter((r) => r.method !== 'GET')) {
      const policy = route.gate.kind === 'cellar' ? route.gate.policy : { write: 'keeper' as Role };
      const needed = neededRole(route.method, policy);
      // Allowed writes are the functional tests' business; here they would spoil the victim.
      for (const role of roles.filter((r) => !roleAtLeast(r, needed))) {
        const res = await send(world.crew.as[role], route, world.ids, world.ids);
        if (res.status >= 500) counts.over499++;
        if (res.status !== 403) {
          if (res.status < 300) counts.roleEscapes++;
          note(`${key(route)} as ${role} answered ${res.status}, not 403`);
        }
      }
    }
    expect(await cellarFingerprint(world.ds, world.ids.cellarId), 'a refused write changed the cellar').toBe(before);
    console.log(
      `[route sweep] ${routes.length} routes, ${counts.requests} requests: ${counts.over499} answers ≥ 500, ${counts.leaks} leaks, ${counts.roleEscapes} role escapes`,
    );
    expect(problems).toEqual([]);
    expect(counts.roleEscapes).toBe(0);
    expect(counts.over499).toBe(0);
  });
});
