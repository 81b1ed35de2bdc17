import type { Request, RequestHandler, Response } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import { z, ZodError, type ZodType } from 'zod';
import { UNITS_HEADER, unitSystemSchema } from '../../shared/schemas/cellars';
import { memberActor, type Actor, type MemberActor } from '../core/actor';
import { inTransaction } from '../core/unit-of-work';
import { UnauthorizedError } from './errors';
import { guardInput } from './input-guard';

type Schemas = { params?: ZodType; query?: ZodType; body?: ZodType };
type Parsed<S extends Schemas> = {
  params: S['params'] extends ZodType ? z.output<S['params']> : Record<string, never>;
  query: S['query'] extends ZodType ? z.output<S['query']> : Record<string, never>;
  body: S['body'] extends ZodType ? z.output<S['body']> : undefined;
};

function parsePart(schema: ZodType | undefined, value: unknown, source: string): unknown {
  if (!schema) return source === 'body' ? undefined : {};
  const result = schema.safeParse(value ?? (source === 'body' ? undefined : {}));
  if (!result.success) {
    // The error handler prefixes each issue path with where it came from.
    throw Object.assign(new ZodError(result.error.issues), { source });
  }
  return result.data;
}

/**
 * Wraps a route: validates params, query and body with zod (400 on failure), then calls
 * `fn` with typed input. A returned value is sent as JSON; `undefined` answers 204 unless
 * `fn` already answered.
 * @param schemas - zod schemas for the parts of the request the route reads
 * @param fn - the route's work; usually one service call
 */
export function handle<S extends Schemas>(
  schemas: S,
  fn: (input: Parsed<S>, req: Request, res: Response) => Promise<unknown> | unknown,
): RequestHandler {
  const handler: RequestHandler = async (req: Request, res: Response) => {
    guardInput({ params: req.params, query: req.query, body: req.body });
    const input = {
      params: parsePart(schemas.params, req.params, 'params'),
      query: parsePart(schemas.query, req.query, 'query'),
      body: parsePart(schemas.body, req.body, 'body'),
    } as Parsed<S>;
    const result = await fn(input, req, res);
    if (result !== undefined && !res.headersSent) res.json(result);
    else if (!res.headersSent) res.status(204).end();
  };
  // The route's schemas stay readable on its handler, for the test sweeps that walk the routes.
  return Object.assign(handler, { [ROUTE_SCHEMAS]: schemas });
}

/** Where `handle` leaves a route's schemas on its handler. */
export const ROUTE_SCHEMAS = Symbol('routeSchemas');

const READ_METHODS = new Set(['GET', 'HEAD']);

/** The member and cellar that cellarAccess checked and put on the request, as the services' actor, in the units the request names. */
export function actorFrom(req: Request): MemberActor {
  if (!req.user || !req.cellar) throw new UnauthorizedError();
  const units = unitSystemSchema.safeParse(req.get(UNITS_HEADER)).data ?? 'metric';
  return memberActor(req.cellar.id, req.user.id, req.cellar.role, units);
}

/**
 * `handle` for routes under a cellar: the request's actor and one transaction for the whole
 * request (a read snapshot for GET, a write transaction otherwise), handed to `fn`. The
 * answer is sent after the transaction commits.
 */
export function cellarHandler(ds: DataSource) {
  return <S extends Schemas>(
    schemas: S,
    fn: (input: Parsed<S>, actor: Actor, tx: EntityManager, req: Request, res: Response) => Promise<unknown> | unknown,
  ): RequestHandler =>
    handle(schemas, (input, req, res) =>
      inTransaction(ds, READ_METHODS.has(req.method) ? 'read' : 'write', async (tx) => fn(input, actorFrom(req), tx, req, res)),
    );
}
