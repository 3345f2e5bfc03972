// The consensus model's data, in columnar typed arrays: a full re-estimate holds a million verdicts.
// Pure types; no I/O. The model and its sources are in the modules beside this one.

/** A verdict's answer as stored in the arrays. `unsure` carries no evidence. */
export const ANSWER_FLAT = 0;
export const ANSWER_DIP = 1;
export const ANSWER_UNSURE = 2;

/** What is known of a snippet's truth: from a control (planted → dip, quiet → flat) or a moderator's ruling. */
export const TRUTH_UNKNOWN = -1;
export const TRUTH_FLAT = 0;
export const TRUTH_DIP = 1;

/** A Beta(alpha, beta) distribution, as a prior or a posterior. */
export interface BetaPrior {
  alpha: number;
  beta: number;
}

/** Everything a campaign's full re-estimate reads, indexed densely from 0. */
export interface ConsensusData {
  snippetCount: number;
  judgeCount: number;
  /** One entry per verdict (withdrawn verdicts left out). */
  verdictSnippet: Int32Array;
  verdictJudge: Int32Array;
  /** ANSWER_FLAT, ANSWER_DIP or ANSWER_UNSURE. */
  verdictAnswer: Uint8Array;
  /** Per snippet: TRUTH_UNKNOWN, TRUTH_FLAT or TRUTH_DIP. */
  knownTruth: Int8Array;
  /**
   * Per snippet, optional: 1 for a control (planted or quiet), 0 otherwise. A control's truth teaches
   * reliability but says nothing of the campaign's dip rate π; a moderator's ruling counts for both.
   * Without it, every known truth is taken for a control.
   */
  isControl?: Uint8Array;
}

export interface ConsensusPriors {
  /** Prior of a volunteer's sensitivity; a newcomer starts at its mean. */
  sensitivity: BetaPrior;
  /** Prior of a volunteer's specificity. */
  specificity: BetaPrior;
  /** Prior of the campaign's share of snippets that hold a dip (π). */
  dipRate: BetaPrior;
}

/** A volunteer's reliability: point estimates and the vote weights that follow from them. */
export interface Reliability {
  sensitivity: number;
  specificity: number;
  /** log(s / (1 − t)): what a `dip` verdict adds to a snippet's log-odds. */
  weightDip: number;
  /** log((1 − s) / t): what a `flat` verdict adds (negative for a useful volunteer). */
  weightFlat: number;
}

export interface ConsensusEstimate {
  /** Per judge, same index as in ConsensusData. */
  sensitivity: Float64Array;
  specificity: Float64Array;
  weightDip: Float64Array;
  weightFlat: Float64Array;
  /**
   * Per judge, the expected counts behind the estimates (controls and rulings count whole, the other
   * snippets by their posterior): so that an incremental update can add new control evidence to them.
   */
  dipSeen: Float64Array;
  dipSaid: Float64Array;
  flatSeen: Float64Array;
  flatSaid: Float64Array;
  /** π, the campaign's estimated share of snippets with a dip. */
  dipRate: number;
  /** Per snippet: the posterior probability of a dip (known truths give 0 or 1). */
  score: Float64Array;
  iterations: number;
  converged: boolean;
  /** The priors fitted to this campaign's volunteers (empirical Bayes), for newcomers from now on. */
  typical: { sensitivity: BetaPrior; specificity: BetaPrior };
}

/** A snippet's verdicts as an incremental update sees them. */
export interface WeightedVerdict {
  answer: 'dip' | 'flat' | 'unsure';
  reliability: Reliability;
  /** The marked dip centre (light-curve time, days), for dip verdicts that have one. */
  markTime?: number | null;
}

export interface SnippetScore {
  /** Posterior probability of a dip. */
  score: number;
  /** Plain share of dip verdicts among dip and flat verdicts (null without any). */
  dipShare: number | null;
  /** dip + flat + unsure verdicts counted. */
  verdictCount: number;
  /** Kish's effective number of votes from the absolute weights of the dip and flat verdicts. */
  effectiveVotes: number;
}

export interface DipTimeCluster {
  /** Reliability-weighted median of the marks (days). */
  center: number;
  /** 1.4826 × the weighted median absolute deviation (days); 0 with one mark. */
  sigma: number;
  /** How many marks, and their total weight. */
  count: number;
  weight: number;
}

export type SettleDecision =
  | { state: 'open' }
  | { state: 'settled'; outcome: 'dip' | 'flat' }
  | { state: 'split'; reason: 'max_verdicts' | 'reliable_disagreement' };

export interface SettleRules {
  /** settle_upper, settle_lower, verdicts_to_settle, verdicts_max of the campaign. */
  upper: number;
  lower: number;
  minVerdicts: number;
  maxVerdicts: number;
}
