import type { Knex } from 'knex';
import type { TimeSystem } from '../science/types';
import type { Db } from './knex';
import { nowIso } from './rows';
import { type PackedLightCurve, packLightCurve } from './series-codec';

export interface NewLightCurve {
  campaignId: number;
  targetId: number;
  uploadId: number | null;
  contentHash: string;
  isQuietReference: boolean;
  timeSystem: TimeSystem;
  /** The campaign settings its snippets were cut with. */
  ingestSettings: Record<string, unknown>;
  cadenceDays: number | null;
  noisePpm: number | null;
  noise1hPpm: number | null;
  /** Cleaned and detrended series. */
  series: PackedLightCurve;
}

export async function insertLightCurve(
  db: Db | Knex.Transaction,
  lightCurve: NewLightCurve,
): Promise<number> {
  const { series } = lightCurve;
  const now = nowIso();
  const [row] = await db('light_curves')
    .insert({
      campaign_id: lightCurve.campaignId,
      target_id: lightCurve.targetId,
      upload_id: lightCurve.uploadId,
      content_hash: lightCurve.contentHash,
      is_quiet_reference: lightCurve.isQuietReference,
      time_system: JSON.stringify(lightCurve.timeSystem),
      ingest_settings: JSON.stringify(lightCurve.ingestSettings),
      point_count: series.timeDays.length,
      time_start: series.timeDays[0] ?? 0,
      time_end: series.timeDays[series.timeDays.length - 1] ?? 0,
      cadence_days: lightCurve.cadenceDays,
      noise_ppm: lightCurve.noisePpm,
      noise_1h_ppm: lightCurve.noise1hPpm,
      series: packLightCurve(series),
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}
