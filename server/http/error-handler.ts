import type { ErrorRequestHandler, RequestHandler } from 'express';
import { DatabaseUnavailableError, databaseUnavailable } from '../db/database-errors';
import { AppError, type ErrorKind } from '../errors';

const STATUS: Record<ErrorKind, number> = {
  invalid: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_type: 415,
  rate_limited: 429,
  unavailable: 503,
};

// Errors raised by Express's own body parser and by csrf-sync, by their `type`/`code`.
function fromFramework(error: { type?: string; code?: string; status?: number }): AppError | undefined {
  if (error.code === 'EBADCSRFTOKEN') {
    return new AppError(
      'csrf_invalid',
      'Missing or stale X-CSRF-Token header: fetch GET /api/auth/csrf',
      'forbidden',
    );
  }
  switch (error.type) {
    case 'entity.parse.failed':
      return new AppError('invalid_json', 'The body is not valid JSON', 'invalid');
    case 'entity.too.large':
      return new AppError('body_too_large', 'The body is too large', 'too_large');
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new AppError('unsupported_encoding', 'Send the body as UTF-8', 'unsupported_type');
    default:
      return undefined;
  }
}

export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route ${req.method} ${req.path}` } });
};

/** The one place that turns errors into `{"error": {code, message, fields}}`. Unknown errors stay private. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  const database = error instanceof AppError ? undefined : databaseUnavailable(error);
  const known = error instanceof AppError ? error : (database ?? fromFramework(error ?? {}));
  if (res.headersSent) {
    req.log?.error({ err: error }, 'error after the answer started');
    return;
  }
  if (database) {
    // Not a bug of ours, but the operator should know: a full disk needs them, a busy one may need tuning.
    if (database.retryAfterSeconds === undefined) req.log?.error({ err: error }, database.message);
    else req.log?.warn({ err: error }, database.message);
  }
  if (known instanceof DatabaseUnavailableError && known.retryAfterSeconds !== undefined) {
    res.set('Retry-After', String(known.retryAfterSeconds));
  }
  if (known) {
    const body: Record<string, unknown> = { code: known.code, message: known.message };
    if (known.fields) body.fields = known.fields;
    res.status(STATUS[known.kind]).json({ error: body });
    return;
  }
  req.log?.error({ err: error }, 'unexpected error');
  res
    .status(500)
    .json({ error: { code: 'internal', message: 'Something went wrong on our side; it has been logged' } });
};
