import type { Db } from './knex';
import { nowIso, toIso, toIsoOrNull } from './rows';

export interface ApiTokenRow {
  id: number;
  personId: number;
  name: string;
  tokenPrefix: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  createdAt: string;
}

type Raw = Record<string, unknown>;

function toToken(row: Raw): ApiTokenRow {
  return {
    id: Number(row.id),
    personId: Number(row.person_id),
    name: String(row.name),
    tokenPrefix: String(row.token_prefix),
    lastUsedAt: toIsoOrNull(row.last_used_at),
    revokedAt: toIsoOrNull(row.revoked_at),
    createdAt: toIso(row.created_at),
  };
}

export async function insertApiToken(
  db: Db,
  token: { personId: number; name: string; tokenHash: string; tokenPrefix: string },
): Promise<ApiTokenRow> {
  const now = nowIso();
  const [row] = await db('api_tokens')
    .insert({
      person_id: token.personId,
      name: token.name,
      token_hash: token.tokenHash,
      token_prefix: token.tokenPrefix,
      created_at: now,
      updated_at: now,
    })
    .returning('*');
  return toToken(row);
}

export async function listApiTokens(db: Db, personId: number): Promise<ApiTokenRow[]> {
  const rows = await db('api_tokens').where({ person_id: personId }).orderBy('id', 'desc');
  return rows.map(toToken);
}

/** The live token with this hash, if any. */
export async function findLiveTokenByHash(db: Db, tokenHash: string): Promise<ApiTokenRow | undefined> {
  const row = await db('api_tokens').where({ token_hash: tokenHash }).whereNull('revoked_at').first();
  return row ? toToken(row) : undefined;
}

/** Revokes one of the person's own tokens; answers false when they have no such live token. */
export async function revokeApiToken(db: Db, personId: number, tokenId: number): Promise<boolean> {
  const changed = await db('api_tokens')
    .where({ id: tokenId, person_id: personId })
    .whereNull('revoked_at')
    .update({ revoked_at: nowIso(), updated_at: nowIso() });
  return changed > 0;
}

export async function touchApiToken(db: Db, tokenId: number): Promise<void> {
  await db('api_tokens').where({ id: tokenId }).update({ last_used_at: nowIso() });
}
