import { enqueue, type JobProgress, parseJobRef, type Queues } from '../../../worker/queues';
import { findCampaignById } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import {
  findPeriodSearch,
  insertPeriodSearch,
  latestPeriodSearch,
  type PeriodSearchRow,
  targetSeries,
  updatePeriodSearch,
} from '../../db/period-searches';
import { AppError, notFound } from '../../errors';
import { blsStatistics, boxLeastSquares, periodGrid } from '../../science/bls';
import { ScienceInputError } from '../../science/types';

export interface PeriodSearchSettings {
  minPeriodDays: number;
  /** Null: half the light curve's span, so that at least two transits fit. */
  maxPeriodDays: number | null;
  oversample: number;
}

export const DEFAULT_SETTINGS: PeriodSearchSettings = {
  minPeriodDays: 0.5,
  maxPeriodDays: null,
  oversample: 1,
};

// Trial durations: from an hour to the campaign's longest transit (common practice for BLS grids).
const DURATIONS_HOURS = [1, 1.5, 2, 3, 4, 5, 6, 8, 10, 12, 15, 18, 24];
/** The periodogram is kept at most this many points (its maxima), enough to draw it. */
const PERIODOGRAM_POINTS = 2_000;

async function findTarget(db: Db, targetId: number) {
  const target = await db('targets').where({ id: targetId }).first('id', 'campaign_id', 'designation');
  if (!target) throw notFound('Target');
  return {
    id: Number(target.id),
    campaignId: Number(target.campaign_id),
    designation: String(target.designation),
  };
}

export function periodSearchView(row: PeriodSearchRow) {
  return {
    id: row.id,
    targetId: row.targetId,
    status: row.status,
    job: row.jobRef,
    settings: row.settings,
    result: row.result,
    error: row.error,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
  };
}

/** A scientist asks for a period search of a target's light curves; it runs as a worker job. */
export async function requestPeriodSearch(
  db: Db,
  queues: Queues | undefined,
  person: PersonRow,
  targetId: number,
  settings: Partial<PeriodSearchSettings>,
) {
  const target = await findTarget(db, targetId);
  if (!queues) throw new AppError('queues_unavailable', 'Background jobs are not running', 'unavailable');
  const full = { ...DEFAULT_SETTINGS, ...settings };
  if (full.maxPeriodDays !== null && !(full.maxPeriodDays > full.minPeriodDays)) {
    throw new AppError(
      'validation_failed',
      'The longest period must be longer than the shortest',
      'invalid',
      {
        maxPeriodDays: `Must be more than minPeriodDays (${full.minPeriodDays})`,
      },
    );
  }
  const search = await insertPeriodSearch(db, {
    targetId: target.id,
    requestedBy: person.id,
    settings: { ...full },
  });
  const job = await enqueue(
    queues,
    'periodSearch',
    'search',
    { periodSearchId: search.id, requestedBy: person.id },
    { jobId: `period-search-${search.id}`, attempts: 2 },
  );
  await updatePeriodSearch(db, search.id, { jobRef: job });
  return { periodSearch: periodSearchView({ ...search, jobRef: job }) };
}

/**
 * The latest period search of a target (null before the first); while it waits or runs, with its job's progress, so that any
 * scientist looking at the target (not only the one who started it) can follow it.
 */
export async function latestPeriodSearchOf(db: Db, queues: Queues | undefined, targetId: number) {
  await findTarget(db, targetId);
  const row = await latestPeriodSearch(db, targetId);
  // None yet is an ordinary state of a target, not a missing resource: the page asks on every visit.
  if (!row) return { periodSearch: null };
  const progress =
    row.status === 'queued' || row.status === 'running' ? await jobProgress(queues, row) : null;
  return { periodSearch: { ...periodSearchView(row), progress } };
}

async function jobProgress(queues: Queues | undefined, row: PeriodSearchRow): Promise<JobProgress | null> {
  const parsed = row.jobRef ? parseJobRef(row.jobRef) : null;
  if (!queues || !parsed) return null;
  const job = await queues.byKey[parsed.queueKey].getJob(parsed.id);
  const progress: unknown = job ? await job.progress() : null;
  return progress && typeof progress === 'object' && 'percent' in progress ? (progress as JobProgress) : null;
}

/** Keeps the periodogram drawable: the maximum of each of `points` equal slices. */
function thin(periods: Float64Array, power: Float64Array, points: number) {
  const step = Math.max(1, Math.ceil(periods.length / points));
  const periodsDays: number[] = [];
  const powers: number[] = [];
  for (let start = 0; start < periods.length; start += step) {
    let best = start;
    for (let i = start; i < Math.min(periods.length, start + step); i += 1)
      if (power[i]! > power[best]!) best = i;
    periodsDays.push(periods[best]!);
    powers.push(power[best]!);
  }
  return { periodsDays, power: powers };
}

/**
 * The job: BLS over the target's light curves (Kovács et al. 2002, as server/science/bls.ts), the best
 * box with its diagnostics at the best period and at its half and double, and a thinned periodogram.
 * Input the search cannot use (too short a light curve, say) ends the search as failed with the reason
 * instead of being retried. Running it again gives the same result.
 */
export async function runPeriodSearch(
  db: Db,
  periodSearchId: number,
  progress: (percent: number, stage: string) => Promise<void>,
) {
  const search = await findPeriodSearch(db, periodSearchId);
  if (!search) return { skipped: 'gone' };
  const target = await findTarget(db, search.targetId);
  const campaign = await findCampaignById(db, target.campaignId);
  await updatePeriodSearch(db, search.id, { status: 'running', error: null });
  await progress(5, 'reading light curves');
  const series = await targetSeries(db, target.id);
  const settings = { ...DEFAULT_SETTINGS, ...(search.settings as Partial<PeriodSearchSettings>) };
  try {
    if (!series || series.timeDays.length < 100) {
      throw new ScienceInputError('the target has fewer than 100 points of light curve to search');
    }
    const baselineDays = series.timeDays[series.timeDays.length - 1]! - series.timeDays[0]!;
    const maxPeriodDays = settings.maxPeriodDays ?? baselineDays / 2;
    const longestHours = Math.min(campaign?.longestTransitHours ?? 12, (settings.minPeriodDays * 24) / 3);
    const durationsDays = DURATIONS_HOURS.filter((hours) => hours <= longestHours).map((hours) => hours / 24);
    if (durationsDays.length === 0) durationsDays.push(longestHours / 24);
    const periodsDays = periodGrid({
      baselineDays,
      minPeriodDays: settings.minPeriodDays,
      maxPeriodDays,
      shortestDurationDays: durationsDays[0]!,
      oversample: settings.oversample,
    });
    await progress(20, `searching ${periodsDays.length} periods`);
    const bls = boxLeastSquares(series.timeDays, series.flux, series.fluxErr, {
      periodsDays,
      durationsDays,
      objective: 'likelihood',
    });
    await progress(85, 'diagnostics');
    const best = bls.best;
    const at = (periodDays: number) =>
      best && best.durationDays < periodDays
        ? blsStatistics(series.timeDays, series.flux, series.fluxErr, {
            periodDays,
            durationDays: best.durationDays,
            transitTimeDays: best.transitTimeDays,
          })
        : null;
    const summary = (stats: ReturnType<typeof at>) =>
      stats && {
        depthPpm: stats.depth?.depthPpm ?? null,
        depthErrPpm: stats.depth?.depthErrPpm ?? null,
        oddEvenDifferenceSigma: stats.oddEvenDifferenceSigma,
        depthSecondaryPpm: stats.depthSecondary?.depthPpm ?? null,
        depthSecondaryErrPpm: stats.depthSecondary?.depthErrPpm ?? null,
        harmonicDeltaLogLikelihood: stats.harmonicDeltaLogLikelihood,
        transitsWithData: Array.from(stats.transits.pointCount).filter((count) => count > 0).length,
      };
    const result = {
      pointCount: series.timeDays.length,
      baselineDays,
      /** Times are in the light curve's own days; add this for BJD_TDB (null when the file did not say). */
      bjdRefDays: series.bjdRefDays,
      grid: { periods: periodsDays.length, durationsHours: durationsDays.map((days) => days * 24) },
      best: best && {
        periodDays: best.periodDays,
        t0Days: best.transitTimeDays,
        durationHours: best.durationDays * 24,
        depthPpm: best.depthPpm,
        depthErrPpm: best.depthErrPpm,
        snr: best.depthSnr,
        logLikelihood: best.logLikelihood,
      },
      diagnostics: best && {
        atBest: summary(at(best.periodDays)),
        atHalf: summary(at(best.periodDays / 2)),
        atDouble: summary(at(best.periodDays * 2)),
      },
      periodogram: thin(bls.periodogram.periodsDays, bls.periodogram.power, PERIODOGRAM_POINTS),
    };
    await updatePeriodSearch(db, search.id, { status: 'done', result, error: null });
    await progress(100, 'done');
    return { periodSearchId: search.id, periodDays: best?.periodDays ?? null };
  } catch (error) {
    if (!(error instanceof ScienceInputError)) throw error;
    await updatePeriodSearch(db, search.id, { status: 'failed', error: error.message });
    return { periodSearchId: search.id, failed: error.message };
  }
}
