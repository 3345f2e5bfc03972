import { enqueue, type Queues } from '../../../worker/queues';
import type { Db } from '../../db/knex';
import { deleteExpiredSessions } from '../../db/sessions';
import { listStaleUploads } from '../../db/uploads';

export interface SweepResult {
  expiredSessionsDeleted: number;
  uploadsRequeued: number;
}

// An upload whose row has not moved for this long while queued or processing has probably lost its job.
const STALE_UPLOAD_MS = 10 * 60_000;

/**
 * Periodic tidying and recovery. Work that must not be lost is recorded in the database before it is
 * queued; this re-queues such work whose job went missing (Bull silently drops a job whose id already
 * exists, and a Redis restart can lose queued jobs). Safe to run any number of times.
 */
export async function sweep(db: Db, queues: Queues): Promise<SweepResult> {
  const expiredSessionsDeleted = await deleteExpiredSessions(db);
  let uploadsRequeued = 0;
  const stale = await listStaleUploads(db, new Date(Date.now() - STALE_UPLOAD_MS).toISOString());
  for (const upload of stale) {
    const jobId = `upload-${upload.id}`;
    const job = await queues.byKey.ingest.getJob(jobId);
    const state = job ? await job.getState() : 'missing';
    if (state === 'waiting' || state === 'active' || state === 'delayed' || state === 'paused') continue;
    if (job) await job.remove(); // finished or failed without its row following: start it afresh
    await enqueue(queues, 'ingest', 'upload', { uploadId: upload.id }, { jobId });
    uploadsRequeued += 1;
  }
  return { expiredSessionsDeleted, uploadsRequeued };
}
