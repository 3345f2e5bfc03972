// A snippet's consensus score from reliability-weighted verdicts, and a volunteer's reliability from
// counts. The incremental path: the worker calls these for one snippet when a verdict arrives.

import { ScienceInputError } from '../types';
import type { BetaPrior, Reliability, SnippetScore, WeightedVerdict } from './types';

/** Sensitivity and specificity are kept in [RATE_MIN, RATE_MAX] so that every vote weight is finite. */
export const RATE_MIN = 1e-3;
export const RATE_MAX = 1 - 1e-3;

/** The counts behind a volunteer's reliability (expected counts: controls whole, others by posterior). */
export interface ReliabilityCounts {
  /** Snippets with a dip the volunteer judged (dip or flat), and how many of those they called dip. */
  dipSeen: number;
  dipSaid: number;
  /** Snippets without a dip the volunteer judged, and how many of those they called flat. */
  flatSeen: number;
  flatSaid: number;
}

export function clampRate(rate: number): number {
  return Math.min(RATE_MAX, Math.max(RATE_MIN, rate));
}

/** log(p / (1 − p)). */
export function logit(probability: number): number {
  return Math.log(probability / (1 - probability));
}

/** 1 / (1 + e^−x), without overflow for large |x|. */
export function logistic(logOdds: number): number {
  if (logOdds >= 0) return 1 / (1 + Math.exp(-logOdds));
  const e = Math.exp(logOdds);
  return e / (1 + e);
}

function checkRate(name: string, value: number): void {
  if (!(value >= 0 && value <= 1)) throw new ScienceInputError(`${name} must be in [0, 1], got ${value}`);
}

function checkBeta(name: string, prior: BetaPrior): void {
  if (!(prior.alpha > 0 && prior.beta > 0 && Number.isFinite(prior.alpha + prior.beta))) {
    throw new ScienceInputError(
      `${name} must have finite alpha > 0 and beta > 0, got Beta(${prior.alpha}, ${prior.beta})`,
    );
  }
}

/**
 * A volunteer's vote weights from their sensitivity s and specificity t: a `dip` verdict adds
 * log(s / (1 − t)) to a snippet's log-odds of a dip, a `flat` verdict adds log((1 − s) / t).
 *
 * @param sensitivity - s in [0, 1]: the chance the volunteer says dip on a snippet with a dip.
 * @param specificity - t in [0, 1]: the chance the volunteer says flat on a snippet without one.
 * @returns s and t clamped to [RATE_MIN, RATE_MAX] and the weights (natural log) that follow from them.
 * @throws ScienceInputError when s or t is outside [0, 1] or NaN.
 * @see Nitzan & Paroush 1982, International Economic Review 23, 289 (log-likelihood-ratio vote weights)
 */
export function reliabilityFrom(sensitivity: number, specificity: number): Reliability {
  checkRate('sensitivity', sensitivity);
  checkRate('specificity', specificity);
  const s = clampRate(sensitivity);
  const t = clampRate(specificity);
  return {
    sensitivity: s,
    specificity: t,
    weightDip: Math.log(s / (1 - t)),
    weightFlat: Math.log((1 - s) / t),
  };
}

/**
 * A volunteer's reliability from their counts, as the posterior mean under Beta priors:
 * s = (α_s + dipSaid) / (α_s + β_s + dipSeen), t = (α_t + flatSaid) / (α_t + β_t + flatSeen).
 * A newcomer (all counts 0) gets the priors' means.
 *
 * @param counts - expected counts, each ≥ 0, with dipSaid ≤ dipSeen and flatSaid ≤ flatSeen.
 * @param prior - the campaign's typical volunteer (Beta priors of s and t).
 * @throws ScienceInputError when a count is negative or NaN or a prior is not a proper Beta.
 * @see Dawid & Skene 1979, Applied Statistics 28, 20 (the M-step), with Beta priors (posterior mean)
 */
export function reliabilityFromCounts(
  counts: ReliabilityCounts,
  prior: { sensitivity: BetaPrior; specificity: BetaPrior },
): Reliability {
  for (const key of ['dipSeen', 'dipSaid', 'flatSeen', 'flatSaid'] as const) {
    if (!(counts[key] >= 0)) throw new ScienceInputError(`counts.${key} must be ≥ 0, got ${counts[key]}`);
  }
  checkBeta('prior.sensitivity', prior.sensitivity);
  checkBeta('prior.specificity', prior.specificity);
  const { sensitivity: ps, specificity: pt } = prior;
  const s = (ps.alpha + counts.dipSaid) / (ps.alpha + ps.beta + counts.dipSeen);
  const t = (pt.alpha + counts.flatSaid) / (pt.alpha + pt.beta + counts.flatSeen);
  return reliabilityFrom(Math.min(1, s), Math.min(1, t));
}

/**
 * The log-odds that a snippet holds a dip: logit π + Σ_dip log(s/(1−t)) + Σ_flat log((1−s)/t).
 * `unsure` verdicts add nothing.
 *
 * @param dipRate - π in (0, 1): the campaign's share of snippets with a dip (the prior).
 * @throws ScienceInputError when dipRate is outside (0, 1).
 * @see Dawid & Skene 1979, Applied Statistics 28, 20 (the E-step, for two classes)
 */
export function snippetLogOdds(dipRate: number, verdicts: readonly WeightedVerdict[]): number {
  if (!(dipRate > 0 && dipRate < 1)) throw new ScienceInputError(`dipRate must be in (0, 1), got ${dipRate}`);
  let logOdds = logit(dipRate);
  for (const verdict of verdicts) {
    if (verdict.answer === 'dip') logOdds += verdict.reliability.weightDip;
    else if (verdict.answer === 'flat') logOdds += verdict.reliability.weightFlat;
  }
  return logOdds;
}

/**
 * A snippet's consensus score (posterior probability of a dip, computed in log-odds and turned into a
 * probability at the end), its plain dip share, its verdict count and Kish's effective number of votes
 * (Σ|w|)² / Σw² over the weights of its dip and flat verdicts (0 when there are none or all weigh 0).
 *
 * @param dipRate - π in (0, 1).
 * @param verdicts - the snippet's verdicts with their volunteers' reliability.
 * @throws ScienceInputError when dipRate is outside (0, 1).
 * @see Dawid & Skene 1979, Applied Statistics 28, 20; Kish 1965, Survey Sampling (effective sample size)
 */
export function scoreSnippet(dipRate: number, verdicts: readonly WeightedVerdict[]): SnippetScore {
  const logOdds = snippetLogOdds(dipRate, verdicts);
  let dips = 0;
  let flats = 0;
  let sumAbs = 0;
  let sumSquares = 0;
  for (const verdict of verdicts) {
    let weight: number;
    if (verdict.answer === 'dip') {
      dips += 1;
      weight = verdict.reliability.weightDip;
    } else if (verdict.answer === 'flat') {
      flats += 1;
      weight = verdict.reliability.weightFlat;
    } else continue;
    sumAbs += Math.abs(weight);
    sumSquares += weight * weight;
  }
  return {
    score: logistic(logOdds),
    dipShare: dips + flats > 0 ? dips / (dips + flats) : null,
    verdictCount: verdicts.length,
    effectiveVotes: sumSquares > 0 ? (sumAbs * sumAbs) / sumSquares : 0,
  };
}
