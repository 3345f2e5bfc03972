import type { Db } from '../../db/knex';
import type { ComponentStatus } from '../../http/app-deps';

export interface Health {
  status: 'ok' | 'degraded';
  database: ComponentStatus;
  queue: ComponentStatus;
}

export async function checkHealth(db: Db, queueStatus: () => Promise<ComponentStatus>): Promise<Health> {
  const database: ComponentStatus = await db
    .raw('select 1')
    .then(() => ({ status: 'ok' as const }))
    .catch((error: Error) => ({ status: 'down' as const, detail: error.message }));
  const queue = await queueStatus().catch((error: Error) => ({
    status: 'down' as const,
    detail: error.message,
  }));
  const healthy = database.status === 'ok' && queue.status !== 'down';
  return { status: healthy ? 'ok' : 'degraded', database, queue };
}
