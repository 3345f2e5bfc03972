import type { Knex } from 'knex';
import type { Db } from './knex';
import { nowIso } from './rows';

export type SnippetKind = 'real' | 'planted' | 'quiet';
export type SnippetState = 'open' | 'settled' | 'split' | 'ruled';

export interface PlantedTruth {
  t0Days: number;
  depthPpm: number;
  durationHours: number;
  impact: number;
  expectedSnr: number;
  [more: string]: number;
}

export interface NewSnippet {
  campaignId: number;
  lightCurveId: number;
  targetId: number;
  kind: SnippetKind;
  sourceSnippetId?: number | null;
  timeStart: number;
  timeEnd: number;
  pointCount: number;
  /** Packed with packDisplay. */
  display: Buffer;
  plantedTruth?: PlantedTruth | null;
}

/** Inserts one snippet and answers its id. */
export async function insertSnippet(db: Db | Knex.Transaction, snippet: NewSnippet): Promise<number> {
  const now = nowIso();
  const [row] = await db('snippets')
    .insert({
      campaign_id: snippet.campaignId,
      light_curve_id: snippet.lightCurveId,
      target_id: snippet.targetId,
      kind: snippet.kind,
      state: 'open',
      source_snippet_id: snippet.sourceSnippetId ?? null,
      time_start: snippet.timeStart,
      time_end: snippet.timeEnd,
      point_count: snippet.pointCount,
      display: snippet.display,
      planted_truth: snippet.plantedTruth ? JSON.stringify(snippet.plantedTruth) : null,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}

export async function countSnippets(
  db: Db,
  filter: { campaignId?: number; kind?: SnippetKind } = {},
): Promise<number> {
  const query = db('snippets');
  if (filter.campaignId) query.where({ campaign_id: filter.campaignId });
  if (filter.kind) query.where({ kind: filter.kind });
  const [row] = await query.count<{ n: number | string }[]>({ n: '*' });
  return Number(row?.n ?? 0);
}
