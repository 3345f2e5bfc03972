import type { RequestHandler } from 'express';
import { findLiveTokenByHash, touchApiToken } from '../db/api-tokens';
import type { Db } from '../db/knex';
import { findPersonById } from '../db/people';
import { AppError } from '../errors';
import type { Logger } from '../logger';
import { hashApiToken } from './api-tokens';

/**
 * `Authorization: Bearer <token>` signs a request in as the token's owner, with that person's current
 * role, for this request only (no session). A wrong, revoked or orphaned token is a 401, never a
 * fallback to the cookie. Each use is logged and stamps the token's last use.
 */
export function bearerAuthentication(db: Db, logger: Logger): RequestHandler {
  return (req, _res, next) => {
    const header = req.headers.authorization;
    if (!header || !/^Bearer\s/i.test(header)) return next();
    const secret = header.replace(/^Bearer\s+/i, '').trim();
    (async () => {
      const token = secret ? await findLiveTokenByHash(db, hashApiToken(secret)) : undefined;
      const person = token ? await findPersonById(db, token.personId) : undefined;
      if (!token || !person || person.deletedAt) {
        logger.warn({ event: 'token_rejected', ip: req.ip }, 'api token rejected');
        throw new AppError(
          'invalid_token',
          'The API token is not valid (revoked, mistyped or unknown)',
          'unauthenticated',
        );
      }
      await touchApiToken(db, token.id);
      logger.info(
        { event: 'token_used', tokenId: token.id, personId: person.id, method: req.method, path: req.path },
        'api token used',
      );
      req.user = person;
    })().then(() => next(), next);
  };
}
