import type Bull from 'bull';
import { sweep } from '../../server/services/housekeeping/sweep';
import { JOB_DATA } from '../queues';
import type { ProcessorContext } from './context';

export function housekeepingProcessor(ctx: ProcessorContext) {
  return async (job: Bull.Job) => {
    if (job.name !== 'sweep') throw new Error(`housekeeping has no job named ${job.name}`);
    JOB_DATA.housekeeping.sweep.parse(job.data);
    return sweep(ctx.db, ctx.queues);
  };
}
