import {
  findCampaignConsensusSettings,
  loadCampaignConsensusData,
  markCampaignForRescore,
  type ReliabilityRow,
  saveCampaignEstimate,
  saveReliability,
} from '../../db/consensus';
import type { Db } from '../../db/knex';
import { writeTransaction } from '../../db/transaction';
import { notFound } from '../../errors';
import { DEFAULT_PRIORS, estimateConsensus } from '../../science/consensus/em';
import { ANSWER_DIP, ANSWER_FLAT, TRUTH_DIP, TRUTH_FLAT } from '../../science/consensus/types';
import { currentReliability } from './reliability-priors';
import { type RescoreSummary, rescoreDirtySnippets } from './rescore-snippets';

export interface ReestimateSummary extends RescoreSummary {
  volunteers: number;
  verdicts: number;
  iterations: number;
  converged: boolean;
  dipRate: number;
}

/**
 * The nightly full re-estimate of one campaign: every volunteer's reliability by EM over all counting
 * verdicts (controls and rulings as known truths), the campaign's dip rate and typical volunteer, then
 * a rescore of every open and settled snippet with the new weights — a settled snippet whose outcome
 * would change goes to the Desk. Deterministic, so a second run finds nothing to change.
 */
export async function reestimateCampaign(db: Db, campaignId: number): Promise<ReestimateSummary> {
  const settings = await findCampaignConsensusSettings(db, campaignId);
  if (!settings) throw notFound('Campaign');
  const { data, personIds, isControl } = await loadCampaignConsensusData(db, campaignId);
  const empty = { rescored: 0, settled: 0, split: 0, dips: 0 };
  if (data.judgeCount === 0) {
    return { ...empty, volunteers: 0, verdicts: 0, iterations: 0, converged: true, dipRate: Number.NaN };
  }
  // From the same starting priors every time, so that the result depends on the verdicts alone and a
  // second run finds the same; the fitted typical volunteer is for newcomers until the next run.
  const estimate = estimateConsensus(data, DEFAULT_PRIORS);

  // Each volunteer's exact control counts, so that the stored expected counts are the other snippets'.
  const controls = personIds.map(() => ({ plantedSeen: 0, plantedFound: 0, quietSeen: 0, quietCorrect: 0 }));
  const verdictCounts = new Int32Array(personIds.length);
  for (let i = 0; i < data.verdictAnswer.length; i += 1) {
    const judge = data.verdictJudge[i]!;
    verdictCounts[judge]! += 1;
    const snippet = data.verdictSnippet[i]!;
    const answer = data.verdictAnswer[i]!;
    if (!isControl[snippet] || (answer !== ANSWER_DIP && answer !== ANSWER_FLAT)) continue;
    const counts = controls[judge]!;
    if (data.knownTruth[snippet] === TRUTH_DIP) {
      counts.plantedSeen += 1;
      if (answer === ANSWER_DIP) counts.plantedFound += 1;
    } else if (data.knownTruth[snippet] === TRUTH_FLAT) {
      counts.quietSeen += 1;
      if (answer === ANSWER_FLAT) counts.quietCorrect += 1;
    }
  }
  // Stored as the rescore will read them: the new typical volunteer plus these counts, so that the
  // weights shown and the weights used are the same numbers.
  const newPriors = { ...estimate.typical, dipRate: DEFAULT_PRIORS.dipRate };
  const rows: ReliabilityRow[] = personIds.map((personId, judge) => {
    const control = controls[judge]!;
    const row: ReliabilityRow = {
      personId,
      campaignId,
      sensitivity: 0,
      specificity: 0,
      weightDip: 0,
      weightFlat: 0,
      ...control,
      dipSeen: Math.max(0, estimate.dipSeen[judge]! - control.plantedSeen),
      dipSaid: Math.max(0, estimate.dipSaid[judge]! - control.plantedFound),
      flatSeen: Math.max(0, estimate.flatSeen[judge]! - control.quietSeen),
      flatSaid: Math.max(0, estimate.flatSaid[judge]! - control.quietCorrect),
      verdictCount: verdictCounts[judge]!,
    };
    return Object.assign(row, currentReliability(row, newPriors));
  });

  await writeTransaction(db, async (trx) => {
    await saveReliability(trx, rows);
    await saveCampaignEstimate(trx, campaignId, {
      dipRate: estimate.dipRate,
      sensitivity: estimate.typical.sensitivity,
      specificity: estimate.typical.specificity,
    });
    await markCampaignForRescore(trx, campaignId);
  });
  const rescored = await rescoreDirtySnippets(db, campaignId);
  return {
    ...rescored,
    volunteers: personIds.length,
    verdicts: data.verdictAnswer.length,
    iterations: estimate.iterations,
    converged: estimate.converged,
    dipRate: estimate.dipRate,
  };
}
