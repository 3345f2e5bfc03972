import { createHash } from 'node:crypto';
import { findCampaignById } from '../server/db/campaigns';
import type { Db } from '../server/db/knex';
import { upsertTarget } from '../server/db/targets';
import { generateSurvey } from '../server/science/synthetic-survey';
import { ingestLightCurve } from '../server/services/ingest/ingest-light-curve';

// Fills the demo campaign with the invented Larkspur survey: targets, light curves, snippets and planted
// controls, through the same ingestion story as an upload. Deterministic: the same seed, the same demo.

export interface DemoSurveyOptions {
  campaignId: number;
  targetCount: number;
  seed?: string;
}

/** One in this many quiet stars is treated as a quiet reference: its snippets become quiet controls. */
const QUIET_REFERENCE_EVERY = 6;

export async function seedDemoSurvey(
  db: Db,
  options: DemoSurveyOptions,
): Promise<{ targets: number; snippets: number; survey: ReturnType<typeof generateSurvey> }> {
  const campaign = await findCampaignById(db, options.campaignId);
  if (!campaign) throw new Error(`campaign ${options.campaignId} does not exist`);
  const seed = options.seed ?? 'larkspur-field-a';
  const survey = generateSurvey({ seed, targetCount: options.targetCount, cadenceMinutes: 10 });
  let snippets = 0;
  let quietSeen = 0;
  for (const star of survey.targets) {
    const { target } = await upsertTarget(db, campaign.id, {
      designation: star.designation,
      raDeg: star.raDeg,
      decDeg: star.decDeg,
      magnitude: star.magnitude,
      stellarRadiusRsun: star.stellarRadiusRsun,
      stellarMassMsun: star.stellarMassMsun,
      teffK: star.effectiveTemperatureK,
      assumedFields: [],
    });
    const isQuiet = star.truth.kind === 'quiet';
    if (isQuiet) quietSeen += 1;
    const result = await ingestLightCurve(db, {
      campaign,
      target,
      lightCurve: {
        timeDays: star.lightCurve.timeDays,
        flux: star.lightCurve.flux,
        fluxErr: star.lightCurve.fluxErr,
        quality: null,
        timeSystem: { timesys: 'TDB', timeref: 'SOLARSYSTEM', timeunit: 'd', bjdRefDays: 2_457_000 },
        objectName: star.designation,
      },
      contentHash: createHash('sha256').update(`synthetic:${seed}:${star.designation}`).digest('hex'),
      uploadId: null,
      isQuietReference: isQuiet && quietSeen % QUIET_REFERENCE_EVERY === 0,
    });
    snippets += result.snippetCount;
  }
  return { targets: survey.targets.length, snippets, survey };
}
