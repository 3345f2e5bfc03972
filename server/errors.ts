/**
 * What went wrong, in terms of the domain. Services throw these; only server/http/error-handler.ts
 * turns a kind into an HTTP status.
 */
export type ErrorKind =
  | 'invalid'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unsupported_type'
  | 'rate_limited'
  | 'unavailable';

export type FieldErrors = Record<string, string>;

export class AppError extends Error {
  override name = 'AppError';

  constructor(
    readonly code: string,
    message: string,
    readonly kind: ErrorKind,
    readonly fields?: FieldErrors,
  ) {
    super(message);
  }
}

export const notFound = (what: string, code = 'not_found') =>
  new AppError(code, `${what} was not found`, 'not_found');
