import type { Db } from '../../db/knex';
import { deleteExpiredSessions } from '../../db/sessions';

export interface SweepResult {
  expiredSessionsDeleted: number;
}

/**
 * Periodic tidying and recovery. Work that must not be lost is recorded in the database before it is
 * queued; later issues add here the re-enqueueing of such work whose job went missing (Bull drops a
 * job whose id already exists, and a Redis restart can lose queued jobs). Safe to run any number of times.
 */
export async function sweep(db: Db): Promise<SweepResult> {
  return { expiredSessionsDeleted: await deleteExpiredSessions(db) };
}
