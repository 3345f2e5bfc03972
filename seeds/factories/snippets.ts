import type { Db } from '../../server/db/knex';
import { insertLightCurve } from '../../server/db/light-curves';
import { nowIso } from '../../server/db/rows';
import { packDisplay } from '../../server/db/series-codec';
import { upsertTarget } from '../../server/db/targets';

/**
 * Many small snippets quickly, for tests and benchmarks that need volume rather than realism: each
 * target gets one short flat light curve, and snippets of the asked kinds are spread over the targets.
 */
export async function createSnippetFixtures(
  db: Db,
  campaignId: number,
  counts: { targets: number; real: number; planted?: number; quiet?: number; pointsPerSnippet?: number },
): Promise<{ targetIds: number[]; snippetIds: Record<'real' | 'planted' | 'quiet', number[]> }> {
  const points = counts.pointsPerSnippet ?? 50;
  const timeDays = Float64Array.from({ length: points }, (_, i) => (i * 2) / points);
  const flux = Float64Array.from(timeDays, (_, i) => 1 + ((i * 7919) % 11) * 1e-5);
  const targetIds: number[] = [];
  const lightCurveIds: number[] = [];
  for (let i = 0; i < counts.targets; i += 1) {
    const { target } = await upsertTarget(db, campaignId, {
      designation: `FIX-${String(i).padStart(6, '0')}`,
      raDeg: null,
      decDeg: null,
      magnitude: 12,
      stellarRadiusRsun: 1,
      stellarMassMsun: 1,
      teffK: 5800,
      assumedFields: [],
    });
    targetIds.push(target.id);
    lightCurveIds.push(
      await insertLightCurve(db, {
        campaignId,
        targetId: target.id,
        uploadId: null,
        contentHash: `fixture-${campaignId}-${i}`,
        isQuietReference: false,
        timeSystem: { timesys: 'TDB', timeref: null, timeunit: 'd', bjdRefDays: null },
        ingestSettings: {},
        cadenceDays: 2 / points,
        noisePpm: 100,
        noise1hPpm: 30,
        series: { timeDays, flux, fluxErr: new Float64Array(points).fill(1e-4) },
      }),
    );
  }
  const display = packDisplay(0, timeDays, flux);
  const snippetIds: Record<'real' | 'planted' | 'quiet', number[]> = { real: [], planted: [], quiet: [] };
  const now = nowIso();
  for (const kind of ['real', 'planted', 'quiet'] as const) {
    const total = counts[kind] ?? 0;
    const rows = Array.from({ length: total }, (_, i) => {
      const index = i % counts.targets;
      const start = Math.floor(i / counts.targets) * 1.5;
      return {
        campaign_id: campaignId,
        light_curve_id: lightCurveIds[index],
        target_id: targetIds[index],
        kind,
        state: 'open',
        time_start: start,
        time_end: start + 2,
        point_count: points,
        display,
        planted_truth:
          kind === 'planted'
            ? JSON.stringify({
                t0Days: start + 1,
                depthPpm: 900,
                durationHours: 3,
                impact: 0.3,
                expectedSnr: 12,
              })
            : null,
        created_at: now,
        updated_at: now,
      };
    });
    for (let i = 0; i < rows.length; i += 400) {
      const inserted = await db('snippets')
        .insert(rows.slice(i, i + 400))
        .returning('id');
      snippetIds[kind].push(
        ...inserted.map((row: { id: number } | number) => Number(typeof row === 'object' ? row.id : row)),
      );
    }
  }
  return { targetIds, snippetIds };
}
