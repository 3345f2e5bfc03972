import type { CampaignRow } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import { insertLightCurve } from '../../db/light-curves';
import { packDisplay } from '../../db/series-codec';
import { insertSnippet, type PlantedTruth } from '../../db/snippets';
import type { TargetRow } from '../../db/targets';
import { writeTransaction } from '../../db/transaction';
import { type CleanReport, cleanLightCurve, noiseFigures } from '../../science/clean';
import { defaultDetrendWindowDays, detrendBiweight } from '../../science/detrend';
import { drawPlantedTransit, type PlantedTransit, plantTransit } from '../../science/planting';
import { createRandom, type Random } from '../../science/random';
import { cutWindows, displaySeries, type SnippetWindow } from '../../science/snippets';
import { approximateLimbDarkening } from '../../science/synthetic-survey';
import { type LightCurve, ScienceInputError } from '../../science/types';

// Defaults for targets whose catalogue row lacks them: a Sun-like star.
const ASSUMED_STAR = { stellarRadiusRsun: 1, stellarMassMsun: 1, teffK: 5772 };

export interface IngestRequest {
  campaign: CampaignRow;
  target: TargetRow;
  lightCurve: LightCurve;
  /** SHA-256 of the uploaded file: the same file is never ingested twice into a campaign. */
  contentHash: string;
  uploadId: number | null;
  /** Known to hold no transit: every snippet becomes a quiet control. */
  isQuietReference: boolean;
  onProgress?: (percent: number, stage: string) => Promise<void> | void;
}

export interface IngestResult {
  lightCurveId: number;
  snippetCount: number;
  plantedCount: number;
  /** True when this file had been ingested before: nothing new was written. */
  alreadyIngested: boolean;
  report: CleanReport | null;
}

interface PreparedSnippet {
  window: SnippetWindow;
  display: Buffer;
  planted?: { truth: PlantedTruth; display: Buffer };
}

/**
 * The story of one light curve: clean → detrend → cut snippets → plant controls → save. Everything is
 * computed first and written in one transaction, so a failure leaves nothing half-made, and a file
 * already ingested into the campaign is recognised by its hash and not ingested again (idempotent).
 * Settings are read from the campaign now and copied onto the light curve, so later changes to a
 * campaign affect only snippets cut afterwards.
 */
export async function ingestLightCurve(db: Db, request: IngestRequest): Promise<IngestResult> {
  const { campaign, target, contentHash } = request;
  const existing = await findIngested(db, campaign.id, contentHash);
  if (existing) return existing;
  const progress = request.onProgress ?? (() => {});

  await progress(10, 'cleaning');
  const { lightCurve: clean, report } = cleanLightCurve(request.lightCurve);

  await progress(30, 'detrending');
  const detrendWindowDays =
    campaign.detrendWindowDays ?? defaultDetrendWindowDays(campaign.longestTransitHours);
  const { detrended } = detrendBiweight(clean.timeDays, clean.flux, { windowDays: detrendWindowDays });
  const noise = noiseFigures(clean.timeDays, detrended);

  await progress(55, 'cutting snippets');
  const windows = cutWindows(clean.timeDays, {
    lengthDays: campaign.snippetLengthDays,
    overlap: campaign.snippetOverlap,
  });
  if (windows.length === 0) {
    throw new ScienceInputError(
      `The light curve spans too little time for one ${campaign.snippetLengthDays}-day snippet with 60% coverage`,
    );
  }

  await progress(70, 'planting controls');
  const prepared: PreparedSnippet[] = windows.map((window) => ({
    window,
    display: packDisplay(window.startDays, ...displayOf(clean.timeDays, detrended, window)),
  }));
  if (!request.isQuietReference) {
    plantControls(createRandom(`plant:${contentHash}`), prepared, clean.timeDays, detrended, {
      campaign,
      target,
      noisePpm: noise.pointToPointPpm,
      cadenceDays: noise.cadenceDays,
    });
  }

  await progress(85, 'saving');
  const ingestSettings = {
    snippetLengthDays: campaign.snippetLengthDays,
    snippetOverlap: campaign.snippetOverlap,
    detrendWindowDays,
    plantedShare: campaign.plantedShare,
    plantedSnrMin: campaign.plantedSnrMin,
    plantedSnrMax: campaign.plantedSnrMax,
  };
  const result = await writeTransaction(db, async (trx) => {
    const lightCurveId = await insertLightCurve(trx, {
      campaignId: campaign.id,
      targetId: target.id,
      uploadId: request.uploadId,
      contentHash,
      isQuietReference: request.isQuietReference,
      timeSystem: clean.timeSystem,
      ingestSettings,
      cadenceDays: Number.isFinite(noise.cadenceDays) ? noise.cadenceDays : null,
      noisePpm: Number.isFinite(noise.pointToPointPpm) ? noise.pointToPointPpm : null,
      noise1hPpm: Number.isFinite(noise.oneHourPpm) ? noise.oneHourPpm : null,
      series: { timeDays: clean.timeDays, flux: detrended, fluxErr: clean.fluxErr },
    });
    let plantedCount = 0;
    for (const snippet of prepared) {
      const base = {
        campaignId: campaign.id,
        lightCurveId,
        targetId: target.id,
        timeStart: snippet.window.startDays,
        timeEnd: snippet.window.endDays,
        pointCount: snippet.window.pointCount,
      };
      const realId = await insertSnippet(trx, {
        ...base,
        kind: request.isQuietReference ? 'quiet' : 'real',
        display: snippet.display,
      });
      if (snippet.planted) {
        plantedCount += 1;
        await insertSnippet(trx, {
          ...base,
          kind: 'planted',
          sourceSnippetId: realId,
          display: snippet.planted.display,
          plantedTruth: snippet.planted.truth,
        });
      }
    }
    return { lightCurveId, snippetCount: prepared.length + plantedCount, plantedCount };
  });
  await progress(100, 'done');
  return { ...result, alreadyIngested: false, report };
}

function displayOf(
  timeDays: Float64Array,
  flux: Float64Array,
  window: SnippetWindow,
): [Float64Array, Float64Array] {
  const display = displaySeries(timeDays, flux, window);
  return [display.timeDays, display.flux];
}

/**
 * Picks the campaign's share of windows (stochastic rounding, so the expected count is exact) and plants
 * a transit into a copy of each. A window the star's noise cannot hold a planted transit for (it would
 * need a planet larger than half the star) is left without one.
 */
function plantControls(
  rng: Random,
  prepared: PreparedSnippet[],
  timeDays: Float64Array,
  flux: Float64Array,
  context: { campaign: CampaignRow; target: TargetRow; noisePpm: number; cadenceDays: number },
): void {
  const { campaign, target } = context;
  if (!(context.noisePpm > 0) || !(context.cadenceDays > 0)) return;
  const wanted = campaign.plantedShare * prepared.length;
  const count = Math.floor(wanted) + (rng.next() < wanted - Math.floor(wanted) ? 1 : 0);
  const order = prepared.map((_, i) => i);
  for (let i = order.length - 1; i > 0; i -= 1) {
    const j = rng.int(0, i);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const { u1, u2 } = approximateLimbDarkening(target.teffK ?? ASSUMED_STAR.teffK);
  for (const index of order.slice(0, count)) {
    const snippet = prepared[index]!;
    const { window } = snippet;
    let truth: PlantedTransit;
    try {
      truth = drawPlantedTransit(rng, {
        snippetStartDays: window.startDays,
        snippetEndDays: window.endDays,
        noisePpm: context.noisePpm,
        cadenceDays: context.cadenceDays,
        snrMin: campaign.plantedSnrMin,
        snrMax: campaign.plantedSnrMax,
        stellarRadiusRsun: target.stellarRadiusRsun ?? ASSUMED_STAR.stellarRadiusRsun,
        stellarMassMsun: target.stellarMassMsun ?? ASSUMED_STAR.stellarMassMsun,
        u1,
        u2,
      });
    } catch (error) {
      if (error instanceof ScienceInputError) continue;
      throw error;
    }
    const times = timeDays.subarray(window.first, window.end);
    const planted = plantTransit(times, flux.subarray(window.first, window.end), truth);
    const local = { startDays: window.startDays, endDays: window.endDays, first: 0, end: times.length };
    const display = displaySeries(times, planted, local);
    snippet.planted = {
      truth: { ...truth },
      display: packDisplay(window.startDays, display.timeDays, display.flux),
    };
  }
}

async function findIngested(
  db: Db,
  campaignId: number,
  contentHash: string,
): Promise<IngestResult | undefined> {
  const row = await db('light_curves')
    .where({ campaign_id: campaignId, content_hash: contentHash })
    .first('id');
  if (!row) return undefined;
  const counts = await db('snippets')
    .where({ light_curve_id: row.id })
    .select(db.raw("count(*) as snippets, sum(case when kind = 'planted' then 1 else 0 end) as planted"));
  return {
    lightCurveId: Number(row.id),
    snippetCount: Number(counts[0]?.snippets ?? 0),
    plantedCount: Number(counts[0]?.planted ?? 0),
    alreadyIngested: true,
    report: null,
  };
}
