import { createHash, randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { Db } from './knex';
import { nowIso } from './rows';

type Q = Db | Knex.Transaction;

export type EmailTokenPurpose = 'confirm-address' | 'password-reset';

const hashOf = (secret: string) => createHash('sha256').update(secret).digest('hex');

/**
 * A new single-use token for a link in a mail; only its hash is stored, so a copy of the database
 * opens no account. Earlier unused tokens of the same purpose stop working: only the newest link does.
 */
export async function issueEmailToken(
  db: Q,
  personId: number,
  purpose: EmailTokenPurpose,
  validForMs: number,
  now = new Date(),
): Promise<string> {
  const secret = randomBytes(32).toString('base64url');
  await db('email_tokens')
    .where({ person_id: personId, purpose })
    .whereNull('used_at')
    .update({ used_at: now.toISOString() });
  await db('email_tokens').insert({
    person_id: personId,
    purpose,
    token_hash: hashOf(secret),
    expires_at: new Date(now.getTime() + validForMs).toISOString(),
    created_at: now.toISOString(),
  });
  return secret;
}

/**
 * Uses a token once: the person it belongs to, or null when it is unknown, of another purpose,
 * expired or already used. The update is the claim, so two requests with the same link cannot both win.
 */
export async function consumeEmailToken(
  db: Q,
  secret: string,
  purpose: EmailTokenPurpose,
  now = new Date(),
): Promise<number | null> {
  const row = await db('email_tokens')
    .where({ token_hash: hashOf(secret), purpose })
    .first('id', 'person_id');
  if (!row) return null;
  const claimed = await db('email_tokens')
    .where({ id: row.id })
    .whereNull('used_at')
    .where('expires_at', '>', now.toISOString())
    .update({ used_at: nowIso() });
  return claimed === 1 ? Number(row.person_id) : null;
}

/** Whose unused token this is (expired or not), without using it: to check a new password against. */
export async function unusedTokenHolder(
  db: Q,
  secret: string,
  purpose: EmailTokenPurpose,
): Promise<number | null> {
  const row = await db('email_tokens')
    .where({ token_hash: hashOf(secret), purpose })
    .whereNull('used_at')
    .first('person_id');
  return row ? Number(row.person_id) : null;
}
