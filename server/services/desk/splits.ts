import { findCampaignConsensusSettings, loadReliability, loadSnippetSeries } from '../../db/consensus';
import { findReviewSnippet, listSplits, neighbourSnippets, reviewVerdicts, rulingsFor } from '../../db/desk';
import type { Db } from '../../db/knex';
import { notFound } from '../../errors';
import { scoreSnippet } from '../../science/consensus/posterior';
import type { WeightedVerdict } from '../../science/consensus/types';
import { median } from '../../science/statistics';
import { campaignDipRate, campaignPriors, currentReliability } from '../consensus/reliability-priors';

export interface SplitsQuery {
  campaign?: number | undefined;
  order: 'oldest' | 'needed';
  limit: number;
  offset: number;
}

/** The Desk's queue: split snippets, oldest first, or those on a candidate's target first. */
export function deskSplits(db: Db, query: SplitsQuery) {
  return listSplits(db, {
    campaignId: query.campaign,
    order: query.order,
    limit: query.limit,
    offset: query.offset,
  });
}

const HOURS_PER_DAY = 24;

/**
 * Everything a moderator needs to rule on one snippet: the data at full resolution, each verdict with
 * its author, reliability and the weight it carried, how the score moved verdict by verdict, the
 * neighbouring snippets of the same light curve, and earlier rulings.
 */
export async function splitReview(db: Db, snippetId: number) {
  const snippet = await findReviewSnippet(db, snippetId);
  if (!snippet) throw notFound('Snippet');
  const settings = await findCampaignConsensusSettings(db, snippet.campaign.id);
  if (!settings) throw notFound('Campaign');
  const priors = campaignPriors(settings);
  const dipRate = campaignDipRate(settings);
  const verdicts = await reviewVerdicts(db, snippetId);
  const reliability = await loadReliability(
    db,
    snippet.campaign.id,
    verdicts.map((verdict) => verdict.personId),
  );

  const weighted: WeightedVerdict[] = [];
  const scoreHistory: { at: string; verdictCount: number; score: number }[] = [];
  const rows = verdicts.map((verdict) => {
    const current = currentReliability(reliability.get(verdict.personId), priors);
    // A suspended volunteer's verdict is shown but carries nothing, as in the consensus.
    const weight = verdict.suspended
      ? 0
      : verdict.answer === 'dip'
        ? current.weightDip
        : verdict.answer === 'flat'
          ? current.weightFlat
          : 0;
    if (!verdict.suspended) {
      weighted.push({ answer: verdict.answer, reliability: current });
      scoreHistory.push({
        at: verdict.createdAt,
        verdictCount: weighted.length,
        score: scoreSnippet(dipRate, weighted).score,
      });
    }
    return {
      personId: verdict.personId,
      displayName: verdict.displayName,
      suspended: verdict.suspended,
      answer: verdict.answer,
      markHours: verdict.markTime === null ? null : (verdict.markTime - snippet.timeStart) * HOURS_PER_DAY,
      createdAt: verdict.createdAt,
      sensitivity: current.sensitivity,
      specificity: current.specificity,
      weight,
    };
  });

  const series = await loadSnippetSeries(db, snippet);
  const hours: number[] = [];
  const flux: number[] = [];
  if (series) {
    for (let i = 0; i < series.timeDays.length; i += 1) {
      const time = series.timeDays[i]!;
      if (time < snippet.timeStart || time > snippet.timeEnd || !Number.isFinite(series.flux[i]!)) continue;
      hours.push((time - snippet.timeStart) * HOURS_PER_DAY);
      flux.push(series.flux[i]!);
    }
  }
  // The level the ppm are relative to; 1 for a snippet without points (nothing to draw anyway).
  const level = flux.length > 0 ? median(flux) : 1;
  const neighbours = await neighbourSnippets(db, snippet);
  return {
    review: {
      snippet: {
        id: snippet.id,
        campaign: snippet.campaign,
        target: snippet.target,
        kind: snippet.kind,
        state: snippet.state,
        outcome: snippet.outcome,
        splitReason: snippet.splitReason,
        timeStart: snippet.timeStart,
        timeEnd: snippet.timeEnd,
        durationHours: (snippet.timeEnd - snippet.timeStart) * HOURS_PER_DAY,
        consensusScore: snippet.consensusScore,
        dipShare: snippet.dipShare,
        effectiveVotes: snippet.effectiveVotes,
        verdictCount: snippet.verdictCount,
      },
      series: { hours, ppm: flux.map((value) => (value / level - 1) * 1e6) },
      verdicts: rows,
      scoreHistory,
      neighbours: neighbours.map((neighbour) => ({
        snippetId: neighbour.snippetId,
        offsetHours: (neighbour.timeStart - snippet.timeStart) * HOURS_PER_DAY,
        durationHours: (neighbour.timeEnd - neighbour.timeStart) * HOURS_PER_DAY,
        state: neighbour.state,
        outcome: neighbour.outcome,
        consensusScore: neighbour.consensusScore,
      })),
      rulings: await rulingsFor(db, snippetId),
    },
  };
}
