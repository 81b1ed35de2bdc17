import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { CalcInputError } from '../../shared/calc';
import type { ApiErrorBody } from '../../shared/schemas/common';
import { databaseErrorAnswer } from './database-errors';
import { AppError } from './errors';

/** Plain words for the body parser's refusals (it names its own internals otherwise). */
function bodyParserAnswer(type: string, status: number): ApiErrorBody {
  if (type === 'charset.unsupported') {
    return { error: 'unsupported_charset', message: 'Send the request body as UTF-8 (charset=utf-8).' };
  }
  if (type === 'encoding.unsupported') {
    return { error: 'unsupported_encoding', message: 'The request body is compressed in a way we do not accept; send it uncompressed or as gzip.' };
  }
  if (status === 415) return { error: 'unsupported_media_type', message: 'The request body is of a type we do not accept.' };
  return { error: 'bad_request', message: 'The request body could not be read (it is cut off or not what its headers say).' };
}

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
  // A shared/calc function refused what it was given (services call them directly).
  if (err instanceof CalcInputError) {
    return send(400, { error: 'bad_request', message: err.message, field: err.field });
  }
  // body-parser's own errors carry a `type`.
  const type = (err as { type?: string }).type;
  if (type === 'entity.parse.failed') {
    return send(400, { error: 'invalid_json', message: 'The request body is not valid JSON.' });
  }
  if (type === 'entity.too.large') {
    return send(413, { error: 'too_large', message: 'The request body is too large.' });
  }
  // Other request-body errors (charset, content encoding, a broken gzip stream) carry their
  // 4xx status and are marked safe to answer (`expose`), even when they have no `type`.
  const { status, expose } = err as { status?: unknown; expose?: unknown };
  if ((typeof type === 'string' || expose === true) && typeof status === 'number' && status >= 400 && status < 500) {
    return send(status, bodyParserAnswer(type ?? '', status));
  }
  // The router could not decode a path parameter (say %ED%A0%80, bytes that are not UTF-8).
  if (err instanceof URIError) {
    return send(400, { error: 'bad_request', message: 'The address contains characters that cannot be read.' });
  }
  const database = databaseErrorAnswer(err);
  if (database) return send(database.status, { error: database.code, message: database.message, ...database.details });
  console.error(`[error] ${req.method} ${req.originalUrl}`, err);
  return send(500, { error: 'internal', message: 'Something went wrong on our side. Please try again.' });
};

/** JSON 404 for unknown API routes. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: 'not_found', message: `No API route ${req.method} ${req.path}.` });
};
