import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../../../../seeds/factories/campaigns';
import { type CampaignRow, findCampaignById } from '../../../../../server/db/campaigns';
import { createDb } from '../../../../../server/db/knex';
import { migrateLatest } from '../../../../../server/db/migrate';
import { unpackDisplay } from '../../../../../server/db/series-codec';
import { type TargetRow, upsertTarget } from '../../../../../server/db/targets';
import { generateSurvey } from '../../../../../server/science/synthetic-survey';
import { type LightCurve, ScienceInputError } from '../../../../../server/science/types';
import { ingestLightCurve } from '../../../../../server/services/ingest/ingest-light-curve';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-ingest-'));
const db = createDb({ databaseUrl: undefined, sqliteFile: path.join(dir, 'ingest.sqlite') });
let campaign: CampaignRow;
let target: TargetRow;
const survey = generateSurvey({ seed: 'ingest-test', targetCount: 3, cadenceMinutes: 10 });

function asRead(index: number): LightCurve {
  const star = survey.targets[index]!;
  return {
    ...star.lightCurve,
    quality: null,
    timeSystem: { timesys: 'TDB', timeref: 'SOLARSYSTEM', timeunit: 'd', bjdRefDays: 2_457_000 },
    objectName: star.designation,
  };
}

beforeAll(async () => {
  await migrateLatest(db);
  campaign = (await findCampaignById(db, await createCampaign(db, { status: 'live' })))!;
  const star = survey.targets[0]!;
  target = (
    await upsertTarget(db, campaign.id, {
      designation: star.designation,
      raDeg: star.raDeg,
      decDeg: star.decDeg,
      magnitude: star.magnitude,
      stellarRadiusRsun: star.stellarRadiusRsun,
      stellarMassMsun: star.stellarMassMsun,
      teffK: star.effectiveTemperatureK,
      assumedFields: [],
    })
  ).target;
});
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

const request = (index: number, contentHash: string, isQuietReference = false) => ({
  campaign,
  target,
  lightCurve: asRead(index),
  contentHash,
  uploadId: null,
  isQuietReference,
});

describe('ingestLightCurve', () => {
  it('stores the light curve, one snippet per window and planted copies of about a tenth of them', async () => {
    const stages: string[] = [];
    const result = await ingestLightCurve(db, {
      ...request(0, 'hash-a'),
      onProgress: (_percent, stage) => {
        stages.push(stage);
      },
    });
    expect(result.alreadyIngested).toBe(false);
    expect(stages).toEqual([
      'cleaning',
      'detrending',
      'cutting snippets',
      'planting controls',
      'saving',
      'done',
    ]);
    const snippets = await db('snippets').where({ light_curve_id: result.lightCurveId });
    const real = snippets.filter((s) => s.kind === 'real');
    const planted = snippets.filter((s) => s.kind === 'planted');
    // 27 days in 2-day windows stepping 1.5 days, less the windows across the downlink gap.
    expect(real.length).toBeGreaterThanOrEqual(12);
    expect(planted.length).toBe(result.plantedCount);
    expect(planted.length).toBeLessThanOrEqual(Math.ceil(real.length * campaign.plantedShare));
    for (const copy of planted) {
      const source = real.find((s) => s.id === copy.source_snippet_id)!;
      expect(copy.time_start).toBe(source.time_start);
      const truth = JSON.parse(copy.planted_truth);
      expect(truth.t0Days).toBeGreaterThan(copy.time_start);
      expect(truth.t0Days).toBeLessThan(copy.time_end);
      expect(truth.expectedSnr).toBeGreaterThanOrEqual(campaign.plantedSnrMin * 0.999);
      expect(truth.expectedSnr).toBeLessThanOrEqual(campaign.plantedSnrMax * 1.001);
    }
    for (const snippet of snippets) {
      const display = unpackDisplay(snippet.display);
      expect(display.flux.length).toBeGreaterThan(0);
      expect(display.flux.length).toBeLessThanOrEqual(600);
    }
    const row = await db('light_curves').where({ id: result.lightCurveId }).first();
    expect(JSON.parse(row.ingest_settings)).toMatchObject({ snippetLengthDays: 2, snippetOverlap: 0.25 });
    expect(row.noise_ppm).toBeGreaterThan(0);
  });

  it('recognises the same file and writes nothing the second time (idempotent)', async () => {
    const before = await db('snippets').count({ n: '*' });
    const again = await ingestLightCurve(db, request(0, 'hash-a'));
    expect(again.alreadyIngested).toBe(true);
    expect(await db('snippets').count({ n: '*' })).toEqual(before);
    expect(await db('light_curves').where({ content_hash: 'hash-a' })).toHaveLength(1);
  });

  it('makes every snippet of a quiet reference a quiet control, with nothing planted', async () => {
    const result = await ingestLightCurve(db, request(1, 'hash-quiet', true));
    const kinds = await db('snippets')
      .where({ light_curve_id: result.lightCurveId })
      .distinct()
      .pluck('kind');
    expect(kinds).toEqual(['quiet']);
    expect(result.plantedCount).toBe(0);
  });

  it('leaves nothing behind when the light curve cannot be cut into snippets', async () => {
    const short = asRead(2);
    const keep = 20; // 20 points at 10-minute cadence: far less than one 2-day window
    const tooShort = {
      ...short,
      timeDays: short.timeDays.slice(0, keep),
      flux: short.flux.slice(0, keep),
      fluxErr: short.fluxErr!.slice(0, keep),
    };
    const before = await db('light_curves').count({ n: '*' });
    await expect(ingestLightCurve(db, { ...request(2, 'hash-short'), lightCurve: tooShort })).rejects.toThrow(
      ScienceInputError,
    );
    expect(await db('light_curves').count({ n: '*' })).toEqual(before);
  });
});
