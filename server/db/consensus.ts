import type { Knex } from 'knex';
import {
  ANSWER_DIP,
  ANSWER_FLAT,
  ANSWER_UNSURE,
  type BetaPrior,
  type ConsensusData,
  TRUTH_DIP,
  TRUTH_FLAT,
  TRUTH_UNKNOWN,
} from '../science/consensus/types';
import type { Db } from './knex';
import { nowIso } from './rows';
import { unpackDisplay, unpackLightCurve } from './series-codec';
import type { SnippetKind, SnippetState } from './snippets';

// What the consensus jobs read and write: verdicts that count, volunteers' reliability, snippets'
// scores and states, dips and who found them.

type Q = Db | Knex.Transaction;
type Raw = Record<string, unknown>;
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

/** Verdicts count when they are signed-in, not withdrawn, and their author is neither suspended nor deleted. */
function countingVerdicts(db: Q) {
  return db('verdicts')
    .join('people', 'people.id', 'verdicts.person_id')
    .whereNotNull('verdicts.person_id')
    .whereNull('verdicts.withdrawn_at')
    .whereNull('people.suspended_at')
    .whereNull('people.deleted_at');
}

export interface CampaignConsensusSettings {
  id: number;
  upper: number;
  lower: number;
  minVerdicts: number;
  maxVerdicts: number;
  longestTransitHours: number;
  plantedShare: number;
  priorDipRate: number | null;
  typicalSensitivity: BetaPrior | null;
  typicalSpecificity: BetaPrior | null;
}

export async function findCampaignConsensusSettings(
  db: Q,
  campaignId: number,
): Promise<CampaignConsensusSettings | undefined> {
  const row = await db('campaigns').where({ id: campaignId }).first();
  if (!row) return undefined;
  const beta = (alpha: unknown, b: unknown): BetaPrior | null =>
    alpha === null || alpha === undefined || b === null || b === undefined
      ? null
      : { alpha: Number(alpha), beta: Number(b) };
  return {
    id: Number(row.id),
    upper: Number(row.settle_upper),
    lower: Number(row.settle_lower),
    minVerdicts: Number(row.verdicts_to_settle),
    maxVerdicts: Number(row.verdicts_max),
    longestTransitHours: Number(row.longest_transit_hours),
    plantedShare: Number(row.planted_share),
    priorDipRate: numOrNull(row.prior_dip_rate),
    typicalSensitivity: beta(row.typical_sensitivity_alpha, row.typical_sensitivity_beta),
    typicalSpecificity: beta(row.typical_specificity_alpha, row.typical_specificity_beta),
  };
}

/** Campaigns with snippets waiting to be rescored, oldest dirty first. */
export async function campaignsWithDirtySnippets(db: Q): Promise<number[]> {
  const rows = await db('snippets').where({ needs_rescore: true }).distinct('campaign_id');
  return rows.map((row) => Number(row.campaign_id)).sort((a, b) => a - b);
}

/** Campaigns that have counting verdicts: the ones a full re-estimate has something to learn from. */
export async function campaignsWithVerdicts(db: Q): Promise<number[]> {
  const rows = await db('snippets')
    .join('verdicts', 'verdicts.snippet_id', 'snippets.id')
    .whereNotNull('verdicts.person_id')
    .distinct('snippets.campaign_id');
  return rows.map((row) => Number(row.campaign_id)).sort((a, b) => a - b);
}

/**
 * Up to `limit` snippets waiting for a rescore. On PostgreSQL their rows stay locked until the
 * transaction ends, so a verdict arriving meanwhile waits and marks its snippet dirty again after;
 * SQLite's write-first transaction already holds the whole database.
 */
export async function dirtySnippetIds(db: Q, campaignId: number, limit: number): Promise<number[]> {
  const query = db('snippets')
    .where({ campaign_id: campaignId, needs_rescore: true })
    .orderBy('id')
    .limit(limit);
  if (db.client.dialect !== 'sqlite3') query.forUpdate();
  return (await query.pluck('id')).map(Number);
}

/** Marks every open and settled snippet of the campaign for rescoring (after a re-estimate). */
export async function markCampaignForRescore(db: Q, campaignId: number): Promise<number> {
  return db('snippets')
    .where({ campaign_id: campaignId })
    .whereIn('state', ['open', 'settled'])
    .update({ needs_rescore: true });
}

export interface ScoringSnippet {
  id: number;
  campaignId: number;
  targetId: number;
  lightCurveId: number;
  kind: SnippetKind;
  state: SnippetState;
  outcome: 'dip' | 'flat' | null;
  splitReason: string | null;
  timeStart: number;
  timeEnd: number;
}

export interface CountingVerdict {
  snippetId: number;
  personId: number;
  answer: 'dip' | 'flat' | 'unsure';
  markTime: number | null;
}

export async function loadScoringSnippets(
  db: Q,
  snippetIds: number[],
): Promise<{ snippets: ScoringSnippet[]; verdicts: CountingVerdict[] }> {
  if (snippetIds.length === 0) return { snippets: [], verdicts: [] };
  const rows: Raw[] = await db('snippets')
    .whereIn('id', snippetIds)
    .orderBy('id')
    .select(
      'id',
      'campaign_id',
      'target_id',
      'light_curve_id',
      'kind',
      'state',
      'outcome',
      'split_reason',
      'time_start',
      'time_end',
    );
  const verdictRows: Raw[] = await countingVerdicts(db)
    .whereIn('verdicts.snippet_id', snippetIds)
    .orderBy(['verdicts.snippet_id', 'verdicts.id'])
    .select('verdicts.snippet_id', 'verdicts.person_id', 'verdicts.answer', 'verdicts.mark_time');
  return {
    snippets: rows.map((row) => ({
      id: Number(row.id),
      campaignId: Number(row.campaign_id),
      targetId: Number(row.target_id),
      lightCurveId: Number(row.light_curve_id),
      kind: row.kind as SnippetKind,
      state: row.state as SnippetState,
      outcome: (row.outcome as 'dip' | 'flat' | null) ?? null,
      splitReason: (row.split_reason as string | null) ?? null,
      timeStart: Number(row.time_start),
      timeEnd: Number(row.time_end),
    })),
    verdicts: verdictRows.map((row) => ({
      snippetId: Number(row.snippet_id),
      personId: Number(row.person_id),
      answer: row.answer as CountingVerdict['answer'],
      markTime: numOrNull(row.mark_time),
    })),
  };
}

export interface ReliabilityRow {
  personId: number;
  campaignId: number;
  sensitivity: number;
  specificity: number;
  weightDip: number;
  weightFlat: number;
  plantedSeen: number;
  plantedFound: number;
  quietSeen: number;
  quietCorrect: number;
  /** Expected counts from snippets that are not controls, as of the last full re-estimate. */
  dipSeen: number;
  dipSaid: number;
  flatSeen: number;
  flatSaid: number;
  verdictCount: number;
}

function toReliability(row: Raw): ReliabilityRow {
  return {
    personId: Number(row.person_id),
    campaignId: Number(row.campaign_id),
    sensitivity: Number(row.sensitivity),
    specificity: Number(row.specificity),
    weightDip: Number(row.weight_dip),
    weightFlat: Number(row.weight_flat),
    plantedSeen: Number(row.planted_seen),
    plantedFound: Number(row.planted_found),
    quietSeen: Number(row.quiet_seen),
    quietCorrect: Number(row.quiet_correct),
    dipSeen: Number(row.dip_seen),
    dipSaid: Number(row.dip_said),
    flatSeen: Number(row.flat_seen),
    flatSaid: Number(row.flat_said),
    verdictCount: Number(row.verdict_count),
  };
}

export async function loadReliability(
  db: Q,
  campaignId: number,
  personIds: number[],
): Promise<Map<number, ReliabilityRow>> {
  const result = new Map<number, ReliabilityRow>();
  const unique = [...new Set(personIds)];
  for (let i = 0; i < unique.length; i += 500) {
    const rows: Raw[] = await db('reliability')
      .where({ campaign_id: campaignId })
      .whereIn('person_id', unique.slice(i, i + 500));
    for (const row of rows) result.set(Number(row.person_id), toReliability(row));
  }
  return result;
}

export async function listReliability(db: Q, campaignId: number): Promise<ReliabilityRow[]> {
  return (await db('reliability').where({ campaign_id: campaignId }).orderBy('person_id')).map(toReliability);
}

/** The exact control counts of some volunteers in a campaign, recounted from their verdicts. */
export async function controlCounts(
  db: Q,
  campaignId: number,
  personIds: number[],
): Promise<Map<number, Pick<ReliabilityRow, 'plantedSeen' | 'plantedFound' | 'quietSeen' | 'quietCorrect'>>> {
  const result = new Map<
    number,
    Pick<ReliabilityRow, 'plantedSeen' | 'plantedFound' | 'quietSeen' | 'quietCorrect'>
  >();
  const unique = [...new Set(personIds)];
  for (const personId of unique)
    result.set(personId, { plantedSeen: 0, plantedFound: 0, quietSeen: 0, quietCorrect: 0 });
  for (let i = 0; i < unique.length; i += 500) {
    const rows: Raw[] = await countingVerdicts(db)
      .join('snippets', 'snippets.id', 'verdicts.snippet_id')
      .where('snippets.campaign_id', campaignId)
      .whereIn('snippets.kind', ['planted', 'quiet'])
      .whereIn('verdicts.answer', ['dip', 'flat'])
      .whereIn('verdicts.person_id', unique.slice(i, i + 500))
      .groupBy('verdicts.person_id', 'snippets.kind', 'verdicts.answer')
      .select('verdicts.person_id', 'snippets.kind', 'verdicts.answer')
      .count({ n: '*' });
    for (const row of rows) {
      const counts = result.get(Number(row.person_id))!;
      const n = Number(row.n);
      if (row.kind === 'planted') {
        counts.plantedSeen += n;
        if (row.answer === 'dip') counts.plantedFound += n;
      } else {
        counts.quietSeen += n;
        if (row.answer === 'flat') counts.quietCorrect += n;
      }
    }
  }
  return result;
}

export async function saveReliability(db: Q, rows: ReliabilityRow[]): Promise<void> {
  const now = nowIso();
  for (let i = 0; i < rows.length; i += 200) {
    await db('reliability')
      .insert(
        rows.slice(i, i + 200).map((row) => ({
          person_id: row.personId,
          campaign_id: row.campaignId,
          sensitivity: row.sensitivity,
          specificity: row.specificity,
          weight_dip: row.weightDip,
          weight_flat: row.weightFlat,
          planted_seen: row.plantedSeen,
          planted_found: row.plantedFound,
          quiet_seen: row.quietSeen,
          quiet_correct: row.quietCorrect,
          dip_seen: row.dipSeen,
          dip_said: row.dipSaid,
          flat_seen: row.flatSeen,
          flat_said: row.flatSaid,
          verdict_count: row.verdictCount,
          updated_at: now,
        })),
      )
      .onConflict(['person_id', 'campaign_id'])
      .merge();
  }
}

export async function saveCampaignEstimate(
  db: Q,
  campaignId: number,
  estimate: { dipRate: number; sensitivity: BetaPrior; specificity: BetaPrior },
): Promise<void> {
  const now = nowIso();
  await db('campaigns').where({ id: campaignId }).update({
    prior_dip_rate: estimate.dipRate,
    typical_sensitivity_alpha: estimate.sensitivity.alpha,
    typical_sensitivity_beta: estimate.sensitivity.beta,
    typical_specificity_alpha: estimate.specificity.alpha,
    typical_specificity_beta: estimate.specificity.beta,
    reliability_estimated_at: now,
    updated_at: now,
  });
}

export interface SnippetScoreUpdate {
  score: number;
  dipShare: number | null;
  effectiveVotes: number;
  state: SnippetState;
  outcome: 'dip' | 'flat' | null;
  splitReason: string | null;
  /** Set when the snippet settles or splits now; kept otherwise. */
  settledNow: boolean;
}

export async function saveSnippetScore(db: Q, snippetId: number, update: SnippetScoreUpdate): Promise<void> {
  const now = nowIso();
  await db('snippets')
    .where({ id: snippetId })
    .update({
      consensus_score: update.score,
      dip_share: update.dipShare,
      effective_votes: update.effectiveVotes,
      state: update.state,
      outcome: update.outcome,
      split_reason: update.splitReason,
      needs_rescore: false,
      scored_at: now,
      ...(update.settledNow ? { settled_at: now } : {}),
      updated_at: now,
    });
}

export interface DipToSave {
  clusterIndex: number;
  timeCenter: number;
  timeSigma: number | null;
  depthPpm: number | null;
  durationHours: number | null;
  snr: number | null;
  markCount: number;
  finders: number[];
}

/** Makes the snippet's dips exactly these (by cluster), with their finders; answers the dips' ids. */
export async function replaceDips(
  db: Q,
  snippet: Pick<ScoringSnippet, 'id' | 'targetId' | 'campaignId'>,
  score: number,
  dips: DipToSave[],
): Promise<number[]> {
  const now = nowIso();
  await db('dips').where({ snippet_id: snippet.id }).where('cluster_index', '>=', dips.length).delete();
  const ids: number[] = [];
  for (const dip of dips) {
    const [row] = await db('dips')
      .insert({
        snippet_id: snippet.id,
        target_id: snippet.targetId,
        campaign_id: snippet.campaignId,
        cluster_index: dip.clusterIndex,
        time_center: dip.timeCenter,
        time_sigma: dip.timeSigma,
        depth_ppm: dip.depthPpm,
        duration_hours: dip.durationHours,
        snr: dip.snr,
        consensus_score: score,
        mark_count: dip.markCount,
        created_at: now,
        updated_at: now,
      })
      .onConflict(['snippet_id', 'cluster_index'])
      .merge([
        'time_center',
        'time_sigma',
        'depth_ppm',
        'duration_hours',
        'snr',
        'consensus_score',
        'mark_count',
        'updated_at',
      ])
      .returning('id');
    const id = Number(typeof row === 'object' ? row.id : row);
    ids.push(id);
    await db('dip_finders').where({ dip_id: id }).delete();
    const finders = [...new Set(dip.finders)].sort((a, b) => a - b);
    if (finders.length > 0)
      await db('dip_finders').insert(finders.map((personId) => ({ dip_id: id, person_id: personId })));
  }
  return ids;
}

/** The series a dip is measured on: the light curve around the snippet, or what was shown for a planted one. */
export async function loadSnippetSeries(
  db: Q,
  snippet: Pick<ScoringSnippet, 'id' | 'kind' | 'lightCurveId' | 'timeStart'>,
): Promise<{ timeDays: Float64Array; flux: Float64Array; fluxErr?: Float64Array } | null> {
  if (snippet.kind === 'planted') {
    // The planted transit lives only in the snippet's own display series.
    const row = await db('snippets').where({ id: snippet.id }).first('display');
    if (!row?.display) return null;
    const display = unpackDisplay(row.display as Buffer);
    return {
      timeDays: Float64Array.from(display.offsetDays, (offset) => snippet.timeStart + offset),
      flux: Float64Array.from(display.flux),
    };
  }
  const row = await db('light_curves').where({ id: snippet.lightCurveId }).first('series');
  if (!row?.series) return null;
  return unpackLightCurve(row.series as Buffer);
}

/** The latest ruling of each ruled snippet of a campaign, as a known truth. */
async function rulingTruths(db: Q, campaignId: number): Promise<Map<number, number>> {
  const rows: Raw[] = await db('rulings')
    .join('snippets', 'snippets.id', 'rulings.snippet_id')
    .where('snippets.campaign_id', campaignId)
    .orderBy(['rulings.snippet_id', 'rulings.id'])
    .select('rulings.snippet_id', 'rulings.ruling');
  const truths = new Map<number, number>();
  for (const row of rows) truths.set(Number(row.snippet_id), row.ruling === 'dip' ? TRUTH_DIP : TRUTH_FLAT);
  return truths;
}

export interface CampaignConsensusData {
  data: ConsensusData;
  /** Dense index → database id. */
  snippetIds: number[];
  personIds: number[];
  /** Per snippet index: whether it is a control (its truth is exact, not a ruling). */
  isControl: Uint8Array;
}

/** Every counting verdict of a campaign, as the full re-estimate reads them. */
export async function loadCampaignConsensusData(db: Q, campaignId: number): Promise<CampaignConsensusData> {
  const snippetRows: Raw[] = await db('snippets')
    .where({ campaign_id: campaignId })
    .orderBy('id')
    .select('id', 'kind');
  const snippetIndex = new Map<number, number>();
  const snippetIds: number[] = [];
  const knownTruth = new Int8Array(snippetRows.length).fill(TRUTH_UNKNOWN);
  const isControl = new Uint8Array(snippetRows.length);
  const rulings = await rulingTruths(db, campaignId);
  snippetRows.forEach((row, index) => {
    const id = Number(row.id);
    snippetIndex.set(id, index);
    snippetIds.push(id);
    if (row.kind === 'planted' || row.kind === 'quiet') {
      knownTruth[index] = row.kind === 'planted' ? TRUTH_DIP : TRUTH_FLAT;
      isControl[index] = 1;
    } else if (rulings.has(id)) knownTruth[index] = rulings.get(id)!;
  });

  const verdictRows: Raw[] = await countingVerdicts(db)
    .join('snippets', 'snippets.id', 'verdicts.snippet_id')
    .where('snippets.campaign_id', campaignId)
    .orderBy('verdicts.id')
    .select('verdicts.snippet_id', 'verdicts.person_id', 'verdicts.answer');
  const personIndex = new Map<number, number>();
  const personIds: number[] = [];
  const n = verdictRows.length;
  const verdictSnippet = new Int32Array(n);
  const verdictJudge = new Int32Array(n);
  const verdictAnswer = new Uint8Array(n);
  verdictRows.forEach((row, i) => {
    const personId = Number(row.person_id);
    let judge = personIndex.get(personId);
    if (judge === undefined) {
      judge = personIds.length;
      personIndex.set(personId, judge);
      personIds.push(personId);
    }
    verdictSnippet[i] = snippetIndex.get(Number(row.snippet_id))!;
    verdictJudge[i] = judge;
    verdictAnswer[i] =
      row.answer === 'dip' ? ANSWER_DIP : row.answer === 'flat' ? ANSWER_FLAT : ANSWER_UNSURE;
  });
  return {
    data: {
      snippetCount: snippetIds.length,
      judgeCount: personIds.length,
      verdictSnippet,
      verdictJudge,
      verdictAnswer,
      knownTruth,
      isControl,
    },
    snippetIds,
    personIds,
    isControl,
  };
}
