import { generateApiToken } from '../../auth/api-tokens';
import { type ApiTokenRow, insertApiToken, listApiTokens, revokeApiToken } from '../../db/api-tokens';
import { appendAudit } from '../../db/audit-log';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { AppError, notFound } from '../../errors';

export interface TokenView {
  id: number;
  name: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

const toView = (token: ApiTokenRow): TokenView => ({
  id: token.id,
  name: token.name,
  prefix: token.tokenPrefix,
  createdAt: token.createdAt,
  lastUsedAt: token.lastUsedAt,
  revokedAt: token.revokedAt,
});

const MAX_LIVE_TOKENS = 20;

/** Creates a named token; its secret is answered once and never stored. */
export async function createToken(
  db: Db,
  person: PersonRow,
  name: string,
): Promise<{ token: TokenView; secret: string }> {
  const live = (await listApiTokens(db, person.id)).filter((token) => !token.revokedAt);
  if (live.length >= MAX_LIVE_TOKENS) {
    throw new AppError(
      'too_many_tokens',
      `You have ${MAX_LIVE_TOKENS} live tokens; revoke one first`,
      'conflict',
    );
  }
  const { secret, hash, displayPrefix } = generateApiToken();
  const token = await insertApiToken(db, {
    personId: person.id,
    name,
    tokenHash: hash,
    tokenPrefix: displayPrefix,
  });
  await appendAudit(db, {
    actorId: person.id,
    action: 'token.created',
    entityType: 'api_token',
    entityId: token.id,
    after: { name },
  });
  return { token: toView(token), secret };
}

export async function listTokens(db: Db, person: PersonRow): Promise<TokenView[]> {
  return (await listApiTokens(db, person.id)).map(toView);
}

/** Revokes one of the person's own tokens; someone else's token is "not found", not "forbidden". */
export async function revokeToken(db: Db, person: PersonRow, tokenId: number): Promise<void> {
  if (!(await revokeApiToken(db, person.id, tokenId))) throw notFound('Token');
  await appendAudit(db, {
    actorId: person.id,
    action: 'token.revoked',
    entityType: 'api_token',
    entityId: tokenId,
  });
}
