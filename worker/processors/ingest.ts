import type Bull from 'bull';
import { failUpload, processUpload } from '../../server/services/uploads/process-upload';
import { JOB_DATA, reportProgress } from '../queues';
import type { ProcessorContext } from './context';

/** Turns an upload into a light curve and its snippets. Idempotent: a finished upload is skipped. */
export function ingestProcessor(ctx: ProcessorContext) {
  return async (job: Bull.Job) => {
    if (job.name !== 'upload') throw new Error(`ingest has no job named ${job.name}`);
    const { uploadId } = JOB_DATA.ingest.upload.parse(job.data);
    try {
      return {
        outcome: await processUpload(ctx.db, uploadId, (percent, stage) =>
          reportProgress(job, percent, stage),
        ),
      };
    } catch (error) {
      const lastAttempt = job.attemptsMade + 1 >= (job.opts.attempts ?? 1);
      if (lastAttempt) await failUpload(ctx.db, uploadId, `Ingestion failed: ${(error as Error).message}`);
      throw error;
    }
  };
}
