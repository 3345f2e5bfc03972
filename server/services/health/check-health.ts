import type { Queues } from '../../../worker/queues';
import type { Db } from '../../db/knex';
import type { ComponentStatus } from '../../http/app-deps';

export interface Health {
  status: 'ok' | 'degraded';
  database: ComponentStatus;
  queue: ComponentStatus;
}

async function queueStatus(queues: Queues | undefined): Promise<ComponentStatus> {
  if (!queues) return { status: 'not_configured' };
  await queues.ping();
  return { status: 'ok', detail: queues.backend };
}

export async function checkHealth(db: Db, queues: Queues | undefined): Promise<Health> {
  const database: ComponentStatus = await db
    .raw('select 1')
    .then(() => ({ status: 'ok' as const }))
    .catch((error: Error) => ({ status: 'down' as const, detail: error.message }));
  const queue = await queueStatus(queues).catch((error: Error) => ({
    status: 'down' as const,
    detail: error.message,
  }));
  const healthy = database.status === 'ok' && queue.status !== 'down';
  return { status: healthy ? 'ok' : 'degraded', database, queue };
}
