import type Bull from 'bull';
import { reestimateCampaign } from '../../server/services/consensus/reestimate-campaign';
import { rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import { queueReestimates, sweepDirtySnippets } from '../../server/services/consensus/sweep-dirty';
import { JOB_DATA, reportProgress } from '../queues';
import type { ProcessorContext } from './context';

export function consensusProcessor(ctx: ProcessorContext) {
  return async (job: Bull.Job) => {
    switch (job.name) {
      case 'rescore': {
        const { campaignId } = JOB_DATA.consensus.rescore.parse(job.data);
        return rescoreDirtySnippets(ctx.db, campaignId);
      }
      case 'reestimate': {
        const { campaignId } = JOB_DATA.consensus.reestimate.parse(job.data);
        await reportProgress(job, 5, 'estimating reliability');
        const summary = await reestimateCampaign(ctx.db, campaignId);
        await reportProgress(job, 100, 'done');
        return summary;
      }
      case 'reestimate-all':
        JOB_DATA.consensus['reestimate-all'].parse(job.data);
        return { campaigns: await queueReestimates(ctx.db, ctx.queues) };
      case 'sweep':
        JOB_DATA.consensus.sweep.parse(job.data);
        return { queued: await sweepDirtySnippets(ctx.db, ctx.queues) };
      default:
        throw new Error(`consensus has no job named ${job.name}`);
    }
  };
}
