import type Bull from 'bull';
import { runPeriodSearch } from '../../server/services/period-search/period-search';
import { JOB_DATA, reportProgress } from '../queues';
import type { ProcessorContext } from './context';

export function periodSearchProcessor(ctx: ProcessorContext) {
  return async (job: Bull.Job) => {
    if (job.name !== 'search') throw new Error(`period-search has no job named ${job.name}`);
    const { periodSearchId } = JOB_DATA.periodSearch.search.parse(job.data);
    return runPeriodSearch(ctx.db, periodSearchId, (percent, stage) => reportProgress(job, percent, stage));
  };
}
