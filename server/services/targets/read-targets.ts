import { dipsOfTarget, findCandidateForTarget } from '../../db/candidates';
import type { Db } from '../../db/knex';
import { fromJson } from '../../db/rows';
import { unpackLightCurve } from '../../db/series-codec';
import { findTargetById, type TargetRow, toTarget } from '../../db/targets';
import { notFound } from '../../errors';
import { displaySeries } from '../../science/snippets';

export interface TargetListItem extends TargetRow {
  lightCurveCount: number;
  snippetCount: number;
}

export async function listTargets(
  db: Db,
  campaignId: number,
  query: { q?: string | undefined; page: number; pageSize: number },
): Promise<{ targets: TargetListItem[]; total: number; page: number; pageSize: number }> {
  const base = db('targets').where({ campaign_id: campaignId });
  if (query.q)
    base.andWhereRaw("lower(designation) like ? escape '\\'", [
      `%${query.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
    ]);
  const [count] = await base.clone().count<{ n: number }[]>({ n: '*' });
  const rows = await base
    .clone()
    .select('targets.*')
    .select(
      db.raw(
        '(select count(*) from light_curves where light_curves.target_id = targets.id) as light_curve_count',
      ),
    )
    .select(db.raw('(select count(*) from snippets where snippets.target_id = targets.id) as snippet_count'))
    .orderBy('designation')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return {
    targets: rows.map((row: Record<string, unknown>) => ({
      ...toTarget(row),
      lightCurveCount: Number(row.light_curve_count),
      snippetCount: Number(row.snippet_count),
    })),
    total: Number(count?.n ?? 0),
    page: query.page,
    pageSize: query.pageSize,
  };
}

// The target page draws whole light curves; beyond this many points it shows each bin's lowest point.
const MAX_PAGE_POINTS = 5000;

export async function getTarget(db: Db, targetId: number) {
  const target = await findTargetById(db, targetId);
  if (!target) throw notFound('Target');
  const lightCurveRows = await db('light_curves')
    .where({ target_id: targetId })
    .orderBy(['time_start', 'id']);
  const lightCurves = lightCurveRows.map((row: Record<string, unknown>) => {
    const series = unpackLightCurve(row.series as Buffer);
    const n = series.timeDays.length;
    const shown =
      n > MAX_PAGE_POINTS
        ? displaySeries(
            series.timeDays,
            series.flux,
            { startDays: series.timeDays[0]!, endDays: series.timeDays[n - 1]! + 1e-9, first: 0, end: n },
            MAX_PAGE_POINTS,
          )
        : { timeDays: series.timeDays, flux: series.flux };
    return {
      id: Number(row.id),
      timeStart: Number(row.time_start),
      timeEnd: Number(row.time_end),
      pointCount: Number(row.point_count),
      cadenceDays: row.cadence_days === null ? null : Number(row.cadence_days),
      noisePpm: row.noise_ppm === null ? null : Number(row.noise_ppm),
      noise1hPpm: row.noise_1h_ppm === null ? null : Number(row.noise_1h_ppm),
      isQuietReference: Boolean(Number(row.is_quiet_reference)) || row.is_quiet_reference === true,
      timeSystem: fromJson(row.time_system, null),
      series: { timeDays: Array.from(shown.timeDays), flux: Array.from(shown.flux) },
    };
  });
  const snippets = await db('snippets')
    .where({ target_id: targetId })
    .orderBy(['time_start', 'id']) // a planted snippet starts where its source does
    .select('id', 'kind', 'state', 'time_start', 'time_end', 'consensus_score', 'planted_truth');
  const [counts] = await db('snippets').where({ target_id: targetId }).count<{ n: number }[]>({ n: '*' });
  const dips = await dipsOfTarget(db, target.campaignId, targetId);
  const candidate = await findCandidateForTarget(db, target.campaignId, targetId);
  return {
    /** The settled dips volunteers found, and the candidate this target became, if it did. */
    dips,
    candidateId: candidate ? Number(candidate.id) : null,
    target: { ...target, lightCurveCount: lightCurves.length, snippetCount: Number(counts?.n ?? 0) },
    lightCurves,
    snippets: snippets.map((row: Record<string, unknown>) => ({
      id: Number(row.id),
      kind: row.kind,
      state: row.state,
      timeStart: Number(row.time_start),
      timeEnd: Number(row.time_end),
      consensusScore: row.consensus_score === null ? null : Number(row.consensus_score),
      plantedTruth: fromJson(row.planted_truth, null),
    })),
  };
}
