import { csrfSync } from 'csrf-sync';
import type { Request } from 'express';

// Synchronizer tokens kept in the session, sent back in X-CSRF-Token. API tokens are not sent by
// browsers on their own, so requests that carry `Authorization: Bearer` need no CSRF token.
export const usesBearerToken = (req: Request): boolean => /^Bearer\s/i.test(req.headers.authorization ?? '');

export const csrf = csrfSync({
  getTokenFromRequest: (req) => req.get('x-csrf-token'),
  size: 32,
  skipCsrfProtection: usesBearerToken,
  errorConfig: { statusCode: 403, code: 'EBADCSRFTOKEN', message: 'invalid csrf token' },
});
