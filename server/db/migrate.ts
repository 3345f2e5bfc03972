import type { Db } from './knex';

export async function migrateLatest(db: Db): Promise<string[]> {
  const [, applied] = (await db.migrate.latest()) as [number, string[]];
  return applied;
}

export async function rollbackAll(db: Db): Promise<string[]> {
  const [, reverted] = (await db.migrate.rollback(undefined, true)) as [number, string[]];
  return reverted;
}
