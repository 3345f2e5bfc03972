import type { Knex } from 'knex';
import {
  type CampaignConsensusSettings,
  type CountingVerdict,
  controlCounts,
  type DipToSave,
  dirtySnippetIds,
  findCampaignConsensusSettings,
  loadReliability,
  loadScoringSnippets,
  loadSnippetSeries,
  type ReliabilityRow,
  replaceDips,
  type ScoringSnippet,
  type SnippetScoreUpdate,
  saveReliability,
  saveSnippetScore,
} from '../../db/consensus';
import type { Db } from '../../db/knex';
import { writeTransaction } from '../../db/transaction';
import { dipTimeClusters } from '../../science/consensus/dip-time';
import { measureDip } from '../../science/consensus/measure-dip';
import { scoreSnippet } from '../../science/consensus/posterior';
import { decideSettlement, reliableDisagreement } from '../../science/consensus/settle';
import type {
  ConsensusPriors,
  Reliability,
  SnippetScore,
  WeightedVerdict,
} from '../../science/consensus/types';
import { campaignDipRate, campaignPriors, currentReliability } from './reliability-priors';

export interface RescoreSummary {
  rescored: number;
  settled: number;
  split: number;
  dips: number;
}

/** Snippets rescored per transaction: short enough not to hold up verdicts, long enough to batch. */
export const RESCORE_BATCH = 200;

// A mark's weight in the dip time: the volunteer's dip weight, never below a small floor so that a
// newcomer's mark still counts a little.
const MARK_WEIGHT_FLOOR = 0.05;
/** The shortest dip duration measured (hours): our own choice, about three 10-minute cadences. */
const SHORTEST_DIP_HOURS = 0.5;

/**
 * Rescores every snippet of the campaign marked `needs_rescore`, batch by batch, until none is left —
 * including the ones verdicts marked while this ran. Each batch is one write-first transaction, so a
 * verdict cannot land between reading a snippet and clearing its mark. Deterministic: the same database
 * gives the same result, so running it twice changes nothing.
 */
export async function rescoreDirtySnippets(
  db: Db,
  campaignId: number,
  options: { batchSize?: number } = {},
): Promise<RescoreSummary> {
  const summary: RescoreSummary = { rescored: 0, settled: 0, split: 0, dips: 0 };
  for (;;) {
    const done = await writeTransaction(db, (trx) =>
      rescoreBatch(trx, campaignId, options.batchSize ?? RESCORE_BATCH, summary),
    );
    if (done === 0) return summary;
  }
}

async function rescoreBatch(
  trx: Knex.Transaction,
  campaignId: number,
  batchSize: number,
  summary: RescoreSummary,
): Promise<number> {
  const ids = await dirtySnippetIds(trx, campaignId, batchSize);
  if (ids.length === 0) return 0;
  const settings = await findCampaignConsensusSettings(trx, campaignId);
  if (!settings) return 0;
  const priors = campaignPriors(settings);
  const { snippets, verdicts } = await loadScoringSnippets(trx, ids);
  const reliability = await refreshControlCounts(trx, settings, snippets, verdicts, priors);
  const bySnippet = new Map<number, CountingVerdict[]>();
  for (const verdict of verdicts) {
    const list = bySnippet.get(verdict.snippetId);
    if (list) list.push(verdict);
    else bySnippet.set(verdict.snippetId, [verdict]);
  }
  for (const snippet of snippets) {
    const weighted = (bySnippet.get(snippet.id) ?? []).map(
      (verdict): WeightedVerdict & { personId: number } => ({
        answer: verdict.answer,
        markTime: verdict.markTime,
        personId: verdict.personId,
        reliability: currentReliability(reliability.get(verdict.personId), priors),
      }),
    );
    const outcome = await rescoreOne(trx, settings, snippet, weighted);
    summary.rescored += 1;
    if (outcome.settledNow && outcome.update.state === 'settled') summary.settled += 1;
    if (outcome.settledNow && outcome.update.state === 'split') summary.split += 1;
    summary.dips += outcome.dips;
  }
  return ids.length;
}

/**
 * Volunteers who judged a control in this batch have new exact evidence: their control counts are
 * recounted from the verdicts (so a second run finds the same), and their weights follow at once.
 */
async function refreshControlCounts(
  trx: Knex.Transaction,
  settings: CampaignConsensusSettings,
  snippets: ScoringSnippet[],
  verdicts: CountingVerdict[],
  priors: ConsensusPriors,
): Promise<Map<number, ReliabilityRow>> {
  const reliability = await loadReliability(
    trx,
    settings.id,
    verdicts.map((verdict) => verdict.personId),
  );
  const controls = new Set(snippets.filter((s) => s.kind !== 'real').map((s) => s.id));
  const judges = verdicts.filter((verdict) => controls.has(verdict.snippetId)).map((v) => v.personId);
  if (judges.length === 0) return reliability;
  const counts = await controlCounts(trx, settings.id, judges);
  const changed: ReliabilityRow[] = [];
  for (const [personId, control] of counts) {
    const before = reliability.get(personId);
    const row: ReliabilityRow = {
      personId,
      campaignId: settings.id,
      dipSeen: before?.dipSeen ?? 0,
      dipSaid: before?.dipSaid ?? 0,
      flatSeen: before?.flatSeen ?? 0,
      flatSaid: before?.flatSaid ?? 0,
      verdictCount: before?.verdictCount ?? 0,
      ...control,
      sensitivity: 0,
      specificity: 0,
      weightDip: 0,
      weightFlat: 0,
    };
    const current = currentReliability(row, priors);
    Object.assign(row, current);
    reliability.set(personId, row);
    changed.push(row);
  }
  await saveReliability(trx, changed);
  return reliability;
}

type Scored = WeightedVerdict & { personId: number };

async function rescoreOne(
  trx: Knex.Transaction,
  settings: CampaignConsensusSettings,
  snippet: ScoringSnippet,
  verdicts: Scored[],
): Promise<{ update: SnippetScoreUpdate; settledNow: boolean; dips: number }> {
  const score = scoreSnippet(campaignDipRate(settings), verdicts);
  const decision = decideSettlement({
    score: score.score,
    verdictCount: score.verdictCount,
    rules: {
      upper: settings.upper,
      lower: settings.lower,
      minVerdicts: settings.minVerdicts,
      maxVerdicts: settings.maxVerdicts,
    },
    reliableDisagreement: reliableDisagreement(verdicts),
  });
  const update = nextState(snippet, score, decision);
  await saveSnippetScore(trx, snippet.id, update);
  let dips = 0;
  // Dips are found on real snippets only: a planted dip is ours, and a quiet one has none to find.
  const positive = (update.state === 'settled' || update.state === 'ruled') && update.outcome === 'dip';
  if (positive && snippet.kind === 'real') {
    dips = (await saveDips(trx, settings, snippet, verdicts, score.score)).length;
  }
  return { update, settledNow: update.settledNow, dips };
}

/**
 * The snippet's next state. Open snippets follow the rules. A settled snippet whose outcome would
 * change goes to the Desk instead of flipping silently. Split and ruled snippets wait for a moderator:
 * only their numbers are refreshed.
 */
export function nextState(
  snippet: Pick<ScoringSnippet, 'state' | 'outcome' | 'splitReason'>,
  score: SnippetScore,
  decision: ReturnType<typeof decideSettlement>,
): SnippetScoreUpdate {
  const numbers = { score: score.score, dipShare: score.dipShare, effectiveVotes: score.effectiveVotes };
  const keep = {
    ...numbers,
    state: snippet.state,
    outcome: snippet.outcome,
    splitReason: snippet.splitReason,
    settledNow: false,
  };
  switch (snippet.state) {
    case 'ruled':
      return keep;
    case 'split':
      // Sent to the Desk because a rescore would have flipped it, and now back where it was (a
      // suspension lifted, say): it settles again as it was. Other splits wait for a moderator.
      if (
        snippet.splitReason === 'outcome_changed' &&
        decision.state === 'settled' &&
        decision.outcome === snippet.outcome
      )
        return { ...keep, state: 'settled', splitReason: null };
      return keep;
    case 'settled':
      if (decision.state === 'settled' && decision.outcome === snippet.outcome) return keep;
      return { ...keep, state: 'split', splitReason: 'outcome_changed', settledNow: true };
    case 'open':
      if (decision.state === 'settled')
        return {
          ...numbers,
          state: 'settled',
          outcome: decision.outcome,
          splitReason: null,
          settledNow: true,
        };
      if (decision.state === 'split')
        return { ...numbers, state: 'split', outcome: null, splitReason: decision.reason, settledNow: true };
      return { ...numbers, state: 'open', outcome: null, splitReason: null, settledNow: false };
  }
}

/** The dips of a settled positive snippet: one per cluster of marks, measured on the data around it. */
async function saveDips(
  trx: Knex.Transaction,
  settings: CampaignConsensusSettings,
  snippet: ScoringSnippet,
  verdicts: Scored[],
  score: number,
): Promise<number[]> {
  const dipVoters = verdicts.filter((verdict) => verdict.answer === 'dip');
  const marked = dipVoters.filter(
    (verdict): verdict is Scored & { markTime: number } =>
      typeof verdict.markTime === 'number' && Number.isFinite(verdict.markTime),
  );
  const weightOf = (reliability: Reliability) => Math.max(MARK_WEIGHT_FLOOR, reliability.weightDip);
  const clusters = dipTimeClusters(
    marked.map((verdict) => ({ timeDays: verdict.markTime, weight: weightOf(verdict.reliability) })),
    { separationDays: settings.longestTransitHours / 24 },
  );
  // Without marks the dip is somewhere in the snippet: look around its middle.
  const centres =
    clusters.length > 0
      ? clusters
      : [{ center: (snippet.timeStart + snippet.timeEnd) / 2, sigma: 0, count: 0, weight: 0 }];
  const series = await loadSnippetSeries(trx, snippet);
  const nearest = (time: number) =>
    centres.reduce(
      (best, cluster, index) =>
        Math.abs(cluster.center - time) < Math.abs(centres[best]!.center - time) ? index : best,
      0,
    );
  const finders: number[][] = centres.map(() => []);
  for (const voter of dipVoters) {
    finders[typeof voter.markTime === 'number' ? nearest(voter.markTime) : 0]!.push(voter.personId);
  }
  const dips: DipToSave[] = centres.map((cluster, index) => {
    const measured = series
      ? measureDip(series, cluster.center, {
          maxDurationHours: settings.longestTransitHours,
          // Down to half an hour: hot Jupiters around small stars transit for about an hour, and the
          // default (an eighth of the longest, 1.5 h for 12 h) would stretch them all to 1.5 h.
          minDurationHours: Math.min(SHORTEST_DIP_HOURS, settings.longestTransitHours),
          durationCount: 14,
        })
      : null;
    return {
      clusterIndex: index,
      // The time is the volunteers' (their marks); without marks, where the data put the dip.
      timeCenter: cluster.count > 0 ? cluster.center : (measured?.timeCenterDays ?? cluster.center),
      timeSigma: cluster.count > 0 ? cluster.sigma : null,
      depthPpm: measured?.depthPpm ?? null,
      durationHours: measured?.durationHours ?? null,
      snr: measured?.snr ?? null,
      markCount: cluster.count,
      finders: finders[index]!,
    };
  });
  return replaceDips(trx, snippet, score, dips);
}
