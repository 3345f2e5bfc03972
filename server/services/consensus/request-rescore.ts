import { enqueue, type Queues } from '../../../worker/queues';
import type { Logger } from '../../logger';

/** At most one rescore job is asked for per campaign in this window; the last request of a burst still gets one. */
export const RESCORE_REQUEST_WINDOW_MS = 1_000;

export interface RescoreRequests {
  /** A verdict changed a snippet of this campaign (the snippet is already marked in the database). */
  request(campaignId: number): void;
  /** Stops the pending timers (tests, shutdown). */
  close(): void;
}

export const rescoreJobId = (campaignId: number) => `rescore-${campaignId}`;

/**
 * Turns a stream of verdicts into few rescore jobs. The database is the record of what needs rescoring
 * (`snippets.needs_rescore`); a job only says "look now". So a request may be dropped or merged freely:
 * the job takes every marked snippet of its campaign, a second job for the same campaign while one
 * waits is the same job (its id), and the consensus sweep catches anything a lost job left behind.
 */
export function createRescoreRequests(queues: Queues | undefined, logger: Logger): RescoreRequests {
  const windows = new Map<number, { timer: NodeJS.Timeout; again: boolean }>();

  function add(campaignId: number): void {
    if (!queues) return;
    enqueue(
      queues,
      'consensus',
      'rescore',
      { campaignId },
      { jobId: rescoreJobId(campaignId), removeOnComplete: true, removeOnFail: true },
    ).catch((error: unknown) =>
      logger.warn(
        { err: error, campaignId },
        'rescore request not queued; the consensus sweep will catch it',
      ),
    );
  }

  function open(campaignId: number): void {
    const window = {
      again: false,
      timer: setTimeout(() => {
        windows.delete(campaignId);
        if (window.again) {
          add(campaignId);
          open(campaignId);
        }
      }, RESCORE_REQUEST_WINDOW_MS),
    };
    window.timer.unref();
    windows.set(campaignId, window);
  }

  return {
    request(campaignId) {
      const window = windows.get(campaignId);
      if (window) {
        window.again = true;
        return;
      }
      add(campaignId);
      open(campaignId);
    },
    close() {
      for (const window of windows.values()) clearTimeout(window.timer);
      windows.clear();
    },
  };
}
