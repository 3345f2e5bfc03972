import type { Knex } from 'knex';
import type { Db } from './knex';
import { toIso, toIsoOrNull } from './rows';

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
