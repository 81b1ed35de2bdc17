import type { ErrorRequestHandler, RequestHandler } from 'express';
import { QueryFailedError } from 'typeorm';
import { ZodError } from 'zod';
import type { ApiErrorBody } from '../../shared/schemas/common';
import { AppError } from './errors';

type PgError = { code?: string; constraint?: string; detail?: string };

function zodIssues(error: ZodError, prefix: string) {
  return error.issues.map((issue) => ({
    path: [prefix, ...issue.path.map(String)].filter(Boolean).join('.'),
    message: issue.message,
  }));
}

/** The one place that turns errors into answers; never sends a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const send = (status: number, body: ApiErrorBody & Record<string, unknown>) => {
    if (res.headersSent) return;
    res.status(status).json(body);
  };

  if (err instanceof ZodError) {
    const issues = zodIssues(err, (err as ZodError & { source?: string }).source ?? '');
    const first = issues[0];
    return send(400, {
      error: 'invalid_input',
      message: first ? `${first.path || 'input'}: ${first.message}` : 'Invalid input.',
      issues,
    });
  }
  if (err instanceof AppError) {
    return send(err.status, { error: err.code, message: err.message, ...err.details });
  }
  // body-parser's own errors carry a `type`.
  const type = (err as { type?: string }).type;
  if (type === 'entity.parse.failed') {
    return send(400, { error: 'invalid_json', message: 'The request body is not valid JSON.' });
  }
  if (type === 'entity.too.large') {
    return send(413, { error: 'too_large', message: 'The request body is too large.' });
  }
  if (err instanceof QueryFailedError) {
    const pg = err.driverError as PgError;
    if (pg.code === '23505') {
      return send(409, { error: 'conflict', message: 'That already exists.', constraint: pg.constraint });
    }
    if (pg.code === '23503') {
      return send(409, { error: 'conflict', message: 'That refers to something that does not exist (any more).' });
    }
    if (pg.code === '22P02' || pg.code === '22003') {
      return send(400, { error: 'invalid_input', message: 'A value has the wrong form or is out of range.' });
    }
  }
  console.error(`[error] ${req.method} ${req.originalUrl}`, err);
  return send(500, { error: 'internal', message: 'Something went wrong on our side. Please try again.' });
};

/** JSON 404 for unknown API routes. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: 'not_found', message: `No API route ${req.method} ${req.path}.` });
};
