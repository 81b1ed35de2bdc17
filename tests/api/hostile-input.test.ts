import fc from 'fast-check';
import zlib from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { routesOf, type RouteInfo } from '../helpers/route-table';
import { cellarFingerprint, fillPath, idForField, sweepWorld, type SweepWorld } from '../helpers/sweep-world';
import { leafPaths, sampleOf, withField } from '../helpers/zod-sample';

/**
 * Hostile input on every route that declares a schema, as the cellar's Keeper (so every gate
 * is passed and the input reaches the route): one field at a time spoiled with values
 * fast-check draws from hostile families, then whole bodies that are not what their headers
 * say. No answer may be ≥ 500, and a refused request must leave the cellar as it was.
 */

/** Field values worth throwing at a route. */
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  // Control characters, alone and inside ordinary text.
  fc.constantFrom('\u0000', 'a\u0000b', '\t', 'line\nbreak', '\u0007bell', '\u001b[31mred', '\u007f', '\u0085', '\u202eevil', '\ud800', '\uffff'),
  fc.string({ unit: 'binary', minLength: 1, maxLength: 24 }),
  // Long strings: 10 kB passes the parser; 2 MB is over its limit.
  fc.constantFrom('x'.repeat(10_000), 'é'.repeat(10_000), 'y'.repeat(2_000_000)),
  // Tiny, huge, negative and odd numbers.
  fc.constantFrom(0.0001, 0.0004, 1e-9, 5e-324, -0, -1, -0.001, 1e21, 1e308, -1e308, 2 ** 53 + 2, 0.1 + 0.2),
  fc.double({ noNaN: true }),
  fc.integer({ min: -2_147_483_649, max: 2_147_483_649 }),
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '0x1F', '', ' ', '12abc', '-0'),
  // Dates that are not dates, the year 0 and the far future.
  fc.constantFrom(
    '0000-01-01',
    '0000-00-00',
    '2026-02-30',
    '2026-13-01',
    '9999-12-31',
    '1899-12-31',
    '+275760-09-13',
    '0000-01-01T00:00:00Z',
    '2026-03-01T25:61:00Z',
    '2026-03-01T10:00:00+99:00',
  ),
  // Wrong shapes: arrays for objects, objects for scalars, prototype keys.
  fc.constantFrom<unknown>([], [1, 2], {}, { a: 1 }, null, true, false, [[[]]], JSON.parse('{"__proto__":{"polluted":true}}'), {
    constructor: { prototype: {} },
  }),
  fc.uuid(),
);

/** Whole requests that are wrong before any field is read. */
const BROKEN_BODIES: { contentType: string; encoding?: string; body: string | Buffer }[] = [
  { contentType: 'application/json', body: '{"name": ' },
  { contentType: 'application/json', body: '[' },
  { contentType: 'application/json', body: 'null' },
  { contentType: 'application/json', body: '[]' },
  { contentType: 'application/json', body: '"just a string"' },
  { contentType: 'application/json', body: '{"__proto__": {"admin": true}}' },
  { contentType: 'application/json', body: `{"a": ${'['.repeat(5000)}${']'.repeat(5000)}}` },
  { contentType: 'application/json; charset=latin1', body: '{"name": "caf\u00e9"}' },
  { contentType: 'application/json; charset=utf-16', body: '{}' },
  { contentType: 'text/plain', body: 'name=jug' },
  { contentType: 'application/x-www-form-urlencoded', body: 'name=jug&capacityL=4' },
  { contentType: 'application/xml', body: '<vessel/>' },
  { contentType: 'multipart/form-data; boundary=nope', body: '--nope\r\nbroken' },
  { contentType: 'application/json', encoding: 'foo', body: '{}' },
  { contentType: 'application/json', encoding: 'gzip', body: 'not gzip' },
  { contentType: 'application/json', encoding: 'deflate', body: zlib.gzipSync('{}') },
];

const RUNS_PER_ROUTE = 64;

let world: SweepWorld;
let routes: RouteInfo[];
const counts = { requests: 0, over499: 0, refusedWrites: 0 };
/** The cellar's fingerprint as the last request left it (unknown after an accepted one). */
let baseline: string | undefined;
const problems: string[] = [];

beforeAll(async () => {
  world = await sweepWorld();
  routes = routesOf(world.app).filter((r) => r.schemas.body || r.schemas.query || r.schemas.params);
}, 120_000);

type Part = 'params' | 'query' | 'body';
type Parts = Record<Part, Record<string, unknown>>;

function sampleParts(route: RouteInfo): Parts {
  const ctx = { idFor: (field: string) => idForField(world.ids, field), labelCode: world.ids.code };
  const params = Object.fromEntries(
    [...route.path.matchAll(/:(\w+)/g)].map(([, name]) => [name, name === 'code' ? world.ids.code : idForField(world.ids, name)]),
  );
  return {
    params,
    query: route.schemas.query ? ((sampleOf(route.schemas.query, ctx) ?? {}) as Record<string, unknown>) : {},
    body: route.schemas.body ? ((sampleOf(route.schemas.body, ctx) ?? {}) as Record<string, unknown>) : {},
  };
}

const asText = (value: unknown) => (typeof value === 'string' ? value : (JSON.stringify(value) ?? ''));

/** URL-encodes text; a lone surrogate (which has no UTF-8) goes out as the bytes of one, which is hostile too. */
function encode(text: string): string {
  try {
    return encodeURIComponent(text);
  } catch {
    return text
      .split('')
      .map((ch) => (/[\ud800-\udfff]/.test(ch) ? '%ED%A0%80' : encodeURIComponent(ch)))
      .join('');
  }
}

/** Sends one request of the route as the Keeper; the status, and whether a refusal wrote anything. */
async function attempt(route: RouteInfo, parts: Parts, raw?: (typeof BROKEN_BODIES)[number]): Promise<{ status: number; wrote: boolean }> {
  const before = (baseline ??= await cellarFingerprint(world.ds, world.ids.cellarId));
  const path = fillPath(route.path, world.ids, Object.fromEntries(Object.entries(parts.params).map(([k, v]) => [k, encode(asText(v))])));
  const query = Object.entries(parts.query)
    .flatMap(([k, v]) => (v === undefined ? [] : (Array.isArray(v) ? v : [v]).map((item) => `${encode(k)}=${encode(asText(item))}`)))
    .join('&');
  const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let req = world.crew.as.keeper[method](query ? `${path}?${query}` : path);
  if (raw) {
    req = req.set('Content-Type', raw.contentType);
    if (raw.encoding) req = req.set('Content-Encoding', raw.encoding);
    req = req.serialize(((body: unknown) => body) as unknown as (body: unknown) => string).send(raw.body as string);
  } else if (method !== 'get') {
    req = req.send(parts.body as object);
  }
  counts.requests++;
  const res = await req;
  if (res.status >= 500) {
    counts.over499++;
    problems.push(`${route.method} ${route.path} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 200)}`);
  }
  // An accepted request may write; the next comparison starts from what it left.
  if (res.status < 400) baseline = undefined;
  const wrote = res.status >= 400 && (await cellarFingerprint(world.ds, world.ids.cellarId)) !== before;
  if (wrote) {
    counts.refusedWrites++;
    problems.push(`${route.method} ${route.path} answered ${res.status} but changed the cellar`);
  }
  return { status: res.status, wrote };
}

describe('hostile input', () => {
  it('never answers ≥ 500 and never writes on a refusal, on every route with a schema', async () => {
    const started = Date.now();
    for (const [index, route] of routes.entries()) {
      const base = sampleParts(route);
      const fields = (['params', 'query', 'body'] as Part[]).flatMap((part) =>
        route.schemas[part] || (part === 'params' && Object.keys(base.params).length > 0)
          ? leafPaths(base[part]).map((path) => [part, path] as const)
          : [],
      );
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...fields), hostileValue, async ([part, path], value) => {
          const spoiled = { ...base, [part]: withField(base[part], path, value) } as Parts;
          // Path parameters must stay one path segment: a value is sent URL-encoded.
          const { status, wrote } = await attempt(route, spoiled);
          return status < 500 && !wrote;
        }),
        { numRuns: RUNS_PER_ROUTE, seed: 1796170500 + index, endOnFailure: true },
      );
      if (route.method !== 'GET') {
        for (const raw of BROKEN_BODIES) {
          const { status } = await attempt(route, base, raw);
          expect(status, `${route.method} ${route.path} with ${raw.contentType} ${raw.encoding ?? ''}`).toBeLessThan(500);
        }
      }
    }
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    console.log(
      `[hostile sweep] ${routes.length} routes with a schema, ${counts.requests} hostile requests in ${seconds} s: ${counts.over499} answers ≥ 500, ${counts.refusedWrites} refused requests that wrote`,
    );
    expect(problems).toEqual([]);
    expect(counts.requests).toBeGreaterThanOrEqual(5000);
  }, 600_000);
});
