import type { Db } from './knex';
import { fromJson } from './rows';
import type { PlantedTruth, SnippetState } from './snippets';

/** A control snippet as the completeness table reads it: no series, no verdicts. */
export interface ControlSnippetRow {
  kind: 'planted' | 'quiet';
  state: SnippetState;
  /** The consensus outcome, 'dip' or 'flat', once the snippet was settled or ruled; null before. */
  outcome: 'dip' | 'flat' | null;
  /** What was planted, for a planted control; null for a quiet one (or a planted one without it). */
  plantedTruth: Partial<PlantedTruth> | null;
}

const toOutcome = (value: unknown): ControlSnippetRow['outcome'] =>
  value === 'dip' || value === 'flat' ? value : null;

/** The campaign's planted and quiet controls, in id order. */
export async function listControlSnippets(db: Db, campaignId: number): Promise<ControlSnippetRow[]> {
  const rows: Record<string, unknown>[] = await db('snippets')
    .where({ campaign_id: campaignId })
    .whereIn('kind', ['planted', 'quiet'])
    .select('kind', 'state', 'outcome', 'planted_truth')
    .orderBy('id', 'asc');
  return rows.map((row) => ({
    kind: row.kind as ControlSnippetRow['kind'],
    state: row.state as SnippetState,
    outcome: toOutcome(row.outcome),
    plantedTruth: fromJson<Partial<PlantedTruth> | null>(row.planted_truth, null),
  }));
}
