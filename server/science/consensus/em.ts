// A campaign's full re-estimate: every volunteer's sensitivity and specificity, the campaign's dip
// rate and every snippet's consensus score, by expectation–maximisation over all verdicts at once.

import { ScienceInputError } from '../types';
import { clampRate, logistic, logit } from './posterior';
import {
  ANSWER_DIP,
  ANSWER_FLAT,
  ANSWER_UNSURE,
  type BetaPrior,
  type ConsensusData,
  type ConsensusEstimate,
  type ConsensusPriors,
  TRUTH_DIP,
  TRUTH_FLAT,
  TRUTH_UNKNOWN,
} from './types';

export interface ConsensusOptions {
  /** Stop after this many rounds (M-step then E-step) even without convergence. Default 100. */
  maxIterations?: number;
  /** Converged when no score and not π moved by more than this in a round. Default 1e-6. */
  tolerance?: number;
  /**
   * A volunteer enters the fit of the typical volunteer's sensitivity (specificity) when they have judged
   * at least this many snippets with (without) a dip, in expected counts. Default 10.
   */
  typicalMinEvidence?: number;
}

/**
 * Where a campaign without a history starts: a volunteer somewhat better than a coin (sensitivity mean
 * 0.7, specificity mean 0.8), each prior worth 10 verdicts, and a flat prior on the dip rate. Our own
 * starting choice, replaced by the fitted typical volunteer after the first re-estimate.
 */
export const DEFAULT_PRIORS: ConsensusPriors = {
  sensitivity: { alpha: 7, beta: 3 },
  specificity: { alpha: 8, beta: 2 },
  dipRate: { alpha: 1, beta: 1 },
};

/**
 * The typical volunteer's prior is fitted by the method of moments, then held weak and sane: its
 * strength α + β within [TYPICAL_MIN_STRENGTH, TYPICAL_MAX_STRENGTH] (at most 10 verdicts' worth, so a
 * newcomer's own verdicts soon outweigh it), its mean within [TYPICAL_MIN_MEAN, TYPICAL_MAX_MEAN]: never
 * worse than a coin, and below the 0.9 at which settle.ts calls a volunteer highly reliable, so that
 * nobody is highly reliable on the prior alone. Fewer than TYPICAL_MIN_VOLUNTEERS with enough evidence
 * leave the given prior as it is.
 */
export const TYPICAL_MIN_STRENGTH = 2;
export const TYPICAL_MAX_STRENGTH = 10;
export const TYPICAL_MIN_MEAN = 0.5;
export const TYPICAL_MAX_MEAN = 0.85;
export const TYPICAL_MIN_VOLUNTEERS = 5;

function checkBeta(name: string, prior: BetaPrior): void {
  if (!(prior.alpha > 0 && prior.beta > 0 && Number.isFinite(prior.alpha + prior.beta))) {
    throw new ScienceInputError(
      `${name} must have finite alpha > 0 and beta > 0, got Beta(${prior.alpha}, ${prior.beta})`,
    );
  }
}

function checkInput(data: ConsensusData, priors: ConsensusPriors, options: Required<ConsensusOptions>): void {
  const { snippetCount, judgeCount } = data;
  if (!(Number.isInteger(snippetCount) && snippetCount >= 0)) {
    throw new ScienceInputError(`data.snippetCount must be an integer ≥ 0, got ${snippetCount}`);
  }
  if (!(Number.isInteger(judgeCount) && judgeCount >= 0)) {
    throw new ScienceInputError(`data.judgeCount must be an integer ≥ 0, got ${judgeCount}`);
  }
  const n = data.verdictSnippet.length;
  if (data.verdictJudge.length !== n || data.verdictAnswer.length !== n) {
    throw new ScienceInputError(
      `data.verdictSnippet, verdictJudge and verdictAnswer must have the same length, got ${n}, ` +
        `${data.verdictJudge.length} and ${data.verdictAnswer.length}`,
    );
  }
  if (data.knownTruth.length !== snippetCount) {
    throw new ScienceInputError(
      `data.knownTruth must have snippetCount (${snippetCount}) entries, got ${data.knownTruth.length}`,
    );
  }
  if (data.isControl && data.isControl.length !== snippetCount) {
    throw new ScienceInputError(
      `data.isControl must have snippetCount (${snippetCount}) entries, got ${data.isControl.length}`,
    );
  }
  checkBeta('priors.sensitivity', priors.sensitivity);
  checkBeta('priors.specificity', priors.specificity);
  checkBeta('priors.dipRate', priors.dipRate);
  if (!(Number.isInteger(options.maxIterations) && options.maxIterations >= 1)) {
    throw new ScienceInputError(`options.maxIterations must be an integer ≥ 1, got ${options.maxIterations}`);
  }
  if (!(options.tolerance >= 0)) {
    throw new ScienceInputError(`options.tolerance must be ≥ 0, got ${options.tolerance}`);
  }
  if (!(options.typicalMinEvidence >= 0)) {
    throw new ScienceInputError(`options.typicalMinEvidence must be ≥ 0, got ${options.typicalMinEvidence}`);
  }
}

/**
 * The typical volunteer's Beta prior for one rate, by the method of moments over the estimates of the
 * volunteers with at least `minEvidence` snippets of the class behind that rate: mean m and variance v
 * give α + β = m(1 − m)/v − 1; then held weak and sane (see TYPICAL_*). Returns `fallback` when fewer
 * than TYPICAL_MIN_VOLUNTEERS qualify.
 *
 * @see Pearson's method of moments for the Beta distribution (e.g. Johnson, Kotz & Balakrishnan 1995, §25.4)
 */
export function fitTypicalBeta(
  rates: Float64Array,
  evidence: Float64Array,
  minEvidence: number,
  fallback: BetaPrior,
): BetaPrior {
  let count = 0;
  let sum = 0;
  for (let j = 0; j < rates.length; j += 1) {
    if (evidence[j]! >= minEvidence) {
      count += 1;
      sum += rates[j]!;
    }
  }
  if (count < TYPICAL_MIN_VOLUNTEERS) return { alpha: fallback.alpha, beta: fallback.beta };
  const mean = sum / count;
  let squares = 0;
  for (let j = 0; j < rates.length; j += 1) {
    if (evidence[j]! >= minEvidence) squares += (rates[j]! - mean) ** 2;
  }
  const variance = squares / count;
  const moments = variance > 0 ? (mean * (1 - mean)) / variance - 1 : TYPICAL_MAX_STRENGTH;
  const strength = Math.min(TYPICAL_MAX_STRENGTH, Math.max(TYPICAL_MIN_STRENGTH, moments));
  const heldMean = Math.min(TYPICAL_MAX_MEAN, Math.max(TYPICAL_MIN_MEAN, mean));
  return { alpha: heldMean * strength, beta: (1 - heldMean) * strength };
}

/**
 * Re-estimates a campaign's consensus by expectation–maximisation with two classes (dip, no dip).
 *
 * - Start (Dawid & Skene's): each snippet's score is its plain dip share (π's prior mean without any
 *   dip or flat verdict); controls and rulings (known truth) are 1 or 0 and never change.
 * - M-step: with q_i the current score of snippet i, each volunteer's expected counts are
 *   dipSeen = Σ q_i, dipSaid = Σ_dip q_i, flatSeen = Σ (1 − q_i), flatSaid = Σ_flat (1 − q_i) over their
 *   dip and flat verdicts (`unsure` carries no evidence), and s = (α_s + dipSaid)/(α_s + β_s + dipSeen),
 *   t = (α_t + flatSaid)/(α_t + β_t + flatSeen) (posterior means), clamped to [RATE_MIN, RATE_MAX].
 *   π = (α_π + Σ q_i)/(α_π + β_π + n) over the n snippets that are not controls and have evidence.
 * - E-step: logit q_i = logit π + Σ_dip log(s/(1−t)) + Σ_flat log((1−s)/t).
 * - Repeat until no score nor π moves by more than `tolerance`, or `maxIterations` rounds.
 * - Finally the typical volunteer is fitted for newcomers (`fitTypicalBeta`).
 *
 * The returned counts, rates and weights are those of the last M-step, and the scores those of the
 * E-step that followed it, so `reliabilityFromCounts(counts_j, priors)` gives back volunteer j's rates.
 * Cost: O(verdicts) per round in four typed-array passes; memory about 9 bytes per verdict plus
 * 40 bytes per snippet and 80 per volunteer. Deterministic: the same input gives the same output.
 *
 * @param data - the campaign's verdicts and known truths, densely indexed (see ConsensusData).
 * @param priors - Beta priors of every volunteer's s and t and of π.
 * @throws ScienceInputError when the arrays disagree in length, an index is out of range, an answer or
 *   truth code is unknown, a prior is not a proper Beta or an option is out of range.
 * @see Dawid & Skene 1979, Applied Statistics 28, 20
 */
export function estimateConsensus(
  data: ConsensusData,
  priors: ConsensusPriors,
  options: ConsensusOptions = {},
): ConsensusEstimate {
  const settings: Required<ConsensusOptions> = {
    maxIterations: options.maxIterations ?? 100,
    tolerance: options.tolerance ?? 1e-6,
    typicalMinEvidence: options.typicalMinEvidence ?? 10,
  };
  checkInput(data, priors, settings);
  const { snippetCount, judgeCount, knownTruth } = data;

  // Keep only dip and flat verdicts, each as its snippet and a key 2·judge + answer into per-judge pairs.
  const total = data.verdictSnippet.length;
  let used = 0;
  for (let v = 0; v < total; v += 1) {
    const answer = data.verdictAnswer[v]!;
    if (answer === ANSWER_DIP || answer === ANSWER_FLAT) used += 1;
    else if (answer !== ANSWER_UNSURE) {
      throw new ScienceInputError(`data.verdictAnswer[${v}] must be 0, 1 or 2, got ${answer}`);
    }
  }
  const snippetOf = new Int32Array(used);
  const keyOf = new Int32Array(used);
  const answered = new Float64Array(2 * judgeCount); // per key: how many such verdicts
  const snippetVotes = new Float64Array(snippetCount); // dip + flat verdicts per snippet
  const snippetDips = new Float64Array(snippetCount);
  for (let v = 0, u = 0; v < total; v += 1) {
    const answer = data.verdictAnswer[v]!;
    if (answer === ANSWER_UNSURE) continue;
    const snippet = data.verdictSnippet[v]!;
    const judge = data.verdictJudge[v]!;
    if (!(snippet >= 0 && snippet < snippetCount)) {
      throw new ScienceInputError(
        `data.verdictSnippet[${v}] must be in [0, ${snippetCount}), got ${snippet}`,
      );
    }
    if (!(judge >= 0 && judge < judgeCount)) {
      throw new ScienceInputError(`data.verdictJudge[${v}] must be in [0, ${judgeCount}), got ${judge}`);
    }
    snippetOf[u] = snippet;
    const key = 2 * judge + answer;
    keyOf[u] = key;
    answered[key]! += 1;
    snippetVotes[snippet]! += 1;
    snippetDips[snippet]! += answer;
    u += 1;
  }

  // Scores start at the plain dip share; known truths are fixed.
  const priorRate = priors.dipRate.alpha / (priors.dipRate.alpha + priors.dipRate.beta);
  const score = new Float64Array(snippetCount);
  const countsForRate = new Uint8Array(snippetCount);
  let rateSnippets = 0;
  for (let i = 0; i < snippetCount; i += 1) {
    const truth = knownTruth[i]!;
    if (truth === TRUTH_DIP || truth === TRUTH_FLAT) score[i] = truth;
    else if (truth === TRUTH_UNKNOWN) {
      score[i] = snippetVotes[i]! > 0 ? snippetDips[i]! / snippetVotes[i]! : priorRate;
    } else throw new ScienceInputError(`data.knownTruth[${i}] must be -1, 0 or 1, got ${truth}`);
    // π is the share of real snippets with a dip: controls (planted or quiet) and snippets without
    // evidence say nothing of it. Without isControl, every known truth is taken for a control.
    const control = data.isControl ? data.isControl[i] === 1 : truth !== TRUTH_UNKNOWN;
    if (!control && (truth !== TRUTH_UNKNOWN || snippetVotes[i]! > 0)) {
      countsForRate[i] = 1;
      rateSnippets += 1;
    }
  }

  const sensitivity = new Float64Array(judgeCount);
  const specificity = new Float64Array(judgeCount);
  const weightDip = new Float64Array(judgeCount);
  const weightFlat = new Float64Array(judgeCount);
  const dipSeen = new Float64Array(judgeCount);
  const dipSaid = new Float64Array(judgeCount);
  const flatSeen = new Float64Array(judgeCount);
  const flatSaid = new Float64Array(judgeCount);
  const scoreByKey = new Float64Array(2 * judgeCount); // per key: Σ q over such verdicts
  const weightByKey = new Float64Array(2 * judgeCount); // per key: the weight such a verdict adds
  const logOdds = new Float64Array(snippetCount);
  const alphaS = priors.sensitivity.alpha;
  const strengthS = alphaS + priors.sensitivity.beta;
  const alphaT = priors.specificity.alpha;
  const strengthT = alphaT + priors.specificity.beta;
  const alphaRate = priors.dipRate.alpha;
  const strengthRate = alphaRate + priors.dipRate.beta;

  let dipRate = priorRate;
  let iterations = 0;
  let converged = false;
  while (iterations < settings.maxIterations) {
    iterations += 1;

    // M-step.
    scoreByKey.fill(0);
    for (let u = 0; u < used; u += 1) scoreByKey[keyOf[u]!]! += score[snippetOf[u]!]!;
    for (let j = 0; j < judgeCount; j += 1) {
      const onFlat = scoreByKey[2 * j]!; // Σ q over the judge's flat verdicts
      const onDip = scoreByKey[2 * j + 1]!;
      const flats = answered[2 * j]!;
      const seenDip = onFlat + onDip;
      const seenFlat = Math.max(0, flats + answered[2 * j + 1]! - seenDip);
      const saidFlat = Math.max(0, flats - onFlat);
      dipSeen[j] = seenDip;
      dipSaid[j] = onDip;
      flatSeen[j] = seenFlat;
      flatSaid[j] = saidFlat;
      const s = clampRate((alphaS + onDip) / (strengthS + seenDip));
      const t = clampRate((alphaT + saidFlat) / (strengthT + seenFlat));
      sensitivity[j] = s;
      specificity[j] = t;
      const wDip = Math.log(s / (1 - t));
      const wFlat = Math.log((1 - s) / t);
      weightDip[j] = wDip;
      weightFlat[j] = wFlat;
      weightByKey[2 * j + ANSWER_DIP] = wDip;
      weightByKey[2 * j + ANSWER_FLAT] = wFlat;
    }
    let rateSum = 0;
    for (let i = 0; i < snippetCount; i += 1) if (countsForRate[i] === 1) rateSum += score[i]!;
    const newRate = clampRate((alphaRate + rateSum) / (strengthRate + rateSnippets));
    let change = Math.abs(newRate - dipRate);
    dipRate = newRate;

    // E-step.
    logOdds.fill(logit(dipRate));
    for (let u = 0; u < used; u += 1) logOdds[snippetOf[u]!]! += weightByKey[keyOf[u]!]!;
    for (let i = 0; i < snippetCount; i += 1) {
      if (knownTruth[i] !== TRUTH_UNKNOWN) continue;
      const q = logistic(logOdds[i]!);
      const moved = Math.abs(q - score[i]!);
      if (moved > change) change = moved;
      score[i] = q;
    }
    if (change <= settings.tolerance) {
      converged = true;
      break;
    }
  }

  const minEvidence = settings.typicalMinEvidence;
  return {
    sensitivity,
    specificity,
    weightDip,
    weightFlat,
    dipSeen,
    dipSaid,
    flatSeen,
    flatSaid,
    dipRate,
    score,
    iterations,
    converged,
    typical: {
      sensitivity: fitTypicalBeta(sensitivity, dipSeen, minEvidence, priors.sensitivity),
      specificity: fitTypicalBeta(specificity, flatSeen, minEvidence, priors.specificity),
    },
  };
}
