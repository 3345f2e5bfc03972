import type { Db } from './knex';

/**
 * Brings the schema up to date. When several processes start on a new database at once (the server and
 * workers), two of them can race to create Knex's own bookkeeping tables; the loser retries and then
 * finds the work done or waits on Knex's migration lock.
 */
export async function migrateLatest(db: Db): Promise<string[]> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      const [, applied] = (await db.migrate.latest()) as [number, string[]];
      return applied;
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const raced = /already exists|Migration table is already locked|duplicate key/i.test(message);
      if (!raced || attempt >= 5) throw error;
      await new Promise((resolve) => setTimeout(resolve, 200 * attempt));
    }
  }
}

export async function rollbackAll(db: Db): Promise<string[]> {
  const [, reverted] = (await db.migrate.rollback(undefined, true)) as [number, string[]];
  return reverted;
}
