// When a snippet's verdicts are enough: settled (consensus reached), split (it waits for a moderator on
// the Desk) or still open.

import { ScienceInputError } from '../types';
import type { Reliability, SettleDecision, SettleRules, WeightedVerdict } from './types';

/**
 * A volunteer is highly reliable when both their sensitivity and their specificity are at least this:
 * then a dip verdict from them adds at least log(0.9/0.1) ≈ 2.2 to a snippet's log-odds and a flat
 * verdict takes at least as much away. Our choice for the Desk, not a published figure.
 */
export const HIGH_RELIABILITY = 0.9;

/** Whether the volunteer is highly reliable: sensitivity and specificity both ≥ `threshold`. */
export function isReliable(reliability: Reliability, threshold = HIGH_RELIABILITY): boolean {
  return reliability.sensitivity >= threshold && reliability.specificity >= threshold;
}

/**
 * Whether two highly reliable volunteers (see `isReliable`) disagree on the snippet: at least one of
 * them said dip and another said flat. `unsure` verdicts are not disagreement.
 *
 * @param threshold - in (0.5, 1]: the sensitivity and specificity both volunteers need. Default 0.9.
 * @throws ScienceInputError when threshold is outside (0.5, 1].
 */
export function reliableDisagreement(
  verdicts: readonly WeightedVerdict[],
  threshold = HIGH_RELIABILITY,
): boolean {
  if (!(threshold > 0.5 && threshold <= 1)) {
    throw new ScienceInputError(`threshold must be in (0.5, 1], got ${threshold}`);
  }
  let dip = false;
  let flat = false;
  for (const verdict of verdicts) {
    if (verdict.answer === 'unsure' || !isReliable(verdict.reliability, threshold)) continue;
    if (verdict.answer === 'dip') dip = true;
    else flat = true;
    if (dip && flat) return true;
  }
  return false;
}

function checkRules(rules: SettleRules): void {
  const { upper, lower, minVerdicts, maxVerdicts } = rules;
  if (!(lower >= 0 && lower < upper && upper <= 1)) {
    throw new ScienceInputError(
      `rules.lower and rules.upper must satisfy 0 ≤ lower < upper ≤ 1, got ${lower} and ${upper}`,
    );
  }
  if (!(Number.isInteger(minVerdicts) && minVerdicts >= 1)) {
    throw new ScienceInputError(`rules.minVerdicts must be an integer ≥ 1, got ${minVerdicts}`);
  }
  if (!(Number.isInteger(maxVerdicts) && maxVerdicts >= minVerdicts)) {
    throw new ScienceInputError(
      `rules.maxVerdicts must be an integer ≥ rules.minVerdicts (${minVerdicts}), got ${maxVerdicts}`,
    );
  }
}

/**
 * A snippet's state from its consensus score and verdicts, in this order:
 * 1. settled, outcome dip, when it has at least `minVerdicts` verdicts and score ≥ `upper`;
 *    settled, outcome flat, when it has at least `minVerdicts` and score ≤ `lower`;
 * 2. split (`reliable_disagreement`) when two highly reliable volunteers disagree, even before
 *    `minVerdicts`: more verdicts from ordinary volunteers are unlikely to be worth more than theirs;
 * 3. split (`max_verdicts`) when it has `maxVerdicts` or more and the score is still between;
 * 4. open otherwise.
 * A score past a threshold settles even when reliable volunteers disagree: the weighted evidence has
 * already outweighed the dissent.
 *
 * @param input.score - the consensus score in [0, 1].
 * @param input.verdictCount - dip, flat and unsure verdicts counted (an integer ≥ 0).
 * @param input.rules - the campaign's thresholds (0 ≤ lower < upper ≤ 1, 1 ≤ minVerdicts ≤ maxVerdicts).
 * @param input.reliableDisagreement - from `reliableDisagreement(verdicts)`.
 * @throws ScienceInputError when score, verdictCount or the rules are out of range.
 */
export function decideSettlement(input: {
  score: number;
  verdictCount: number;
  rules: SettleRules;
  reliableDisagreement: boolean;
}): SettleDecision {
  const { score, verdictCount, rules } = input;
  checkRules(rules);
  if (!(score >= 0 && score <= 1)) throw new ScienceInputError(`score must be in [0, 1], got ${score}`);
  if (!(Number.isInteger(verdictCount) && verdictCount >= 0)) {
    throw new ScienceInputError(`verdictCount must be an integer ≥ 0, got ${verdictCount}`);
  }
  if (verdictCount >= rules.minVerdicts) {
    if (score >= rules.upper) return { state: 'settled', outcome: 'dip' };
    if (score <= rules.lower) return { state: 'settled', outcome: 'flat' };
  }
  if (input.reliableDisagreement) return { state: 'split', reason: 'reliable_disagreement' };
  if (verdictCount >= rules.maxVerdicts) return { state: 'split', reason: 'max_verdicts' };
  return { state: 'open' };
}
