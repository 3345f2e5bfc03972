import type { Db } from './knex';
import { nowIso } from './rows';

/** Deletes sessions past their expiry; answers how many went. */
export async function deleteExpiredSessions(db: Db, now = nowIso()): Promise<number> {
  return db('sessions').where('expired', '<', now).delete();
}
