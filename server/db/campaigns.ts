import type { Knex } from 'knex';
import type { Db } from './knex';
import { nowIso, toIso, toIsoOrNull } from './rows';

export type CampaignStatus = 'draft' | 'live' | 'paused' | 'closed';

/** A campaign with its settings; the ones snippets are cut with are copied onto each light curve. */
export interface CampaignRow {
  id: number;
  surveyTeamId: number | null;
  name: string;
  description: string;
  status: CampaignStatus;
  snippetLengthDays: number;
  snippetOverlap: number;
  longestTransitHours: number;
  detrendWindowDays: number | null;
  plantedShare: number;
  quietShare: number;
  plantedSnrMin: number;
  plantedSnrMax: number;
  verdictsToSettle: number;
  verdictsMax: number;
  settleUpper: number;
  settleLower: number;
  feedbackRate: number;
  snrThreshold: number;
  priorDipRate: number | null;
  createdBy: number | null;
  statusChangedAt: string | null;
  createdAt: string;
  updatedAt: string;
}

type Raw = Record<string, unknown>;
const num = (value: unknown) => Number(value);
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export function toCampaign(row: Raw): CampaignRow {
  return {
    id: num(row.id),
    surveyTeamId: numOrNull(row.survey_team_id),
    name: String(row.name),
    description: String(row.description ?? ''),
    status: row.status as CampaignStatus,
    snippetLengthDays: num(row.snippet_length_days),
    snippetOverlap: num(row.snippet_overlap),
    longestTransitHours: num(row.longest_transit_hours),
    detrendWindowDays: numOrNull(row.detrend_window_days),
    plantedShare: num(row.planted_share),
    quietShare: num(row.quiet_share),
    plantedSnrMin: num(row.planted_snr_min),
    plantedSnrMax: num(row.planted_snr_max),
    verdictsToSettle: num(row.verdicts_to_settle),
    verdictsMax: num(row.verdicts_max),
    settleUpper: num(row.settle_upper),
    settleLower: num(row.settle_lower),
    feedbackRate: num(row.feedback_rate),
    snrThreshold: num(row.snr_threshold),
    priorDipRate: numOrNull(row.prior_dip_rate),
    createdBy: numOrNull(row.created_by),
    statusChangedAt: toIsoOrNull(row.status_changed_at),
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

export async function findCampaignById(
  db: Db | Knex.Transaction,
  id: number,
): Promise<CampaignRow | undefined> {
  const row = await db('campaigns').where({ id }).first();
  return row ? toCampaign(row) : undefined;
}

const snake = (key: string) => key.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`);

/** Writes the given campaign fields (camelCase names of CampaignRow) and answers the new row. */
export async function insertCampaign(
  db: Db | Knex.Transaction,
  fields: Record<string, unknown> & { name: string; createdBy: number | null },
): Promise<CampaignRow> {
  const now = nowIso();
  const columns = Object.fromEntries(Object.entries(fields).map(([key, value]) => [snake(key), value]));
  const [row] = await db('campaigns')
    .insert({ ...columns, status: 'draft', status_changed_at: now, created_at: now, updated_at: now })
    .returning('*');
  return toCampaign(row);
}

export async function updateCampaign(
  db: Db | Knex.Transaction,
  id: number,
  fields: Record<string, unknown>,
): Promise<CampaignRow> {
  const columns = Object.fromEntries(Object.entries(fields).map(([key, value]) => [snake(key), value]));
  const [row] = await db('campaigns')
    .where({ id })
    .update({ ...columns, updated_at: nowIso() })
    .returning('*');
  return toCampaign(row);
}

export async function listCampaigns(db: Db): Promise<CampaignRow[]> {
  const rows = await db('campaigns').orderBy('id', 'desc');
  return rows.map(toCampaign);
}

export interface CampaignCounts {
  targets: number;
  lightCurves: number;
  snippets: Record<'open' | 'settled' | 'split' | 'ruled', number>;
  controls: Record<'planted' | 'quiet', number>;
}

export async function campaignCounts(db: Db, campaignId: number): Promise<CampaignCounts> {
  const [targets] = await db('targets').where({ campaign_id: campaignId }).count<{ n: number }[]>({ n: '*' });
  const [lightCurves] = await db('light_curves')
    .where({ campaign_id: campaignId })
    .count<{ n: number }[]>({ n: '*' });
  const byState: { state: string; n: number | string }[] = await db('snippets')
    .where({ campaign_id: campaignId })
    .select('state')
    .count({ n: '*' })
    .groupBy('state');
  const byKind: { kind: string; n: number | string }[] = await db('snippets')
    .where({ campaign_id: campaignId })
    .select('kind')
    .count({ n: '*' })
    .groupBy('kind');
  const state = (name: string) => Number(byState.find((row) => row.state === name)?.n ?? 0);
  const kind = (name: string) => Number(byKind.find((row) => row.kind === name)?.n ?? 0);
  return {
    targets: Number(targets?.n ?? 0),
    lightCurves: Number(lightCurves?.n ?? 0),
    snippets: {
      open: state('open'),
      settled: state('settled'),
      split: state('split'),
      ruled: state('ruled'),
    },
    controls: { planted: kind('planted'), quiet: kind('quiet') },
  };
}
