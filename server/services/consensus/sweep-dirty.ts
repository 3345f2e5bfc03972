import { enqueue, type Queues } from '../../../worker/queues';
import { campaignsWithDirtySnippets, campaignsWithVerdicts } from '../../db/consensus';
import type { Db } from '../../db/knex';
import { rescoreJobId } from './request-rescore';

const LIVE_STATES = new Set(['waiting', 'active', 'delayed', 'paused']);

/**
 * Makes sure every campaign with snippets marked for rescoring has a rescore job: a request can be
 * dropped (the verdict's process stopped, Redis lost its queue), and a verdict can arrive just as its
 * campaign's job finishes. Answers the campaigns it queued a job for. Safe to run any number of times.
 */
export async function sweepDirtySnippets(db: Db, queues: Queues): Promise<number[]> {
  const queued: number[] = [];
  for (const campaignId of await campaignsWithDirtySnippets(db)) {
    const jobId = rescoreJobId(campaignId);
    const job = await queues.byKey.consensus.getJob(jobId);
    if (job && LIVE_STATES.has(await job.getState())) continue;
    if (job) await job.remove(); // finished or failed but still kept: its id would block a new job
    await enqueue(
      queues,
      'consensus',
      'rescore',
      { campaignId },
      { jobId, removeOnComplete: true, removeOnFail: true },
    );
    queued.push(campaignId);
  }
  return queued;
}

/** The nightly re-estimate: one job per campaign with verdicts, so each shows and retries on its own. */
export async function queueReestimates(db: Db, queues: Queues): Promise<number[]> {
  const campaigns = await campaignsWithVerdicts(db);
  for (const campaignId of campaigns) {
    await enqueue(
      queues,
      'consensus',
      'reestimate',
      { campaignId },
      { jobId: `reestimate-${campaignId}`, removeOnComplete: true, removeOnFail: { count: 20 } },
    );
  }
  return campaigns;
}
