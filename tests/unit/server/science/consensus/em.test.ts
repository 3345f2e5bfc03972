import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_PRIORS,
  estimateConsensus,
  fitTypicalBeta,
  TYPICAL_MAX_MEAN,
  TYPICAL_MAX_STRENGTH,
  TYPICAL_MIN_MEAN,
  TYPICAL_MIN_STRENGTH,
  TYPICAL_MIN_VOLUNTEERS,
} from '../../../../../server/science/consensus/em';
import { reliabilityFromCounts } from '../../../../../server/science/consensus/posterior';
import {
  ANSWER_DIP,
  ANSWER_FLAT,
  ANSWER_UNSURE,
  type BetaPrior,
  type ConsensusData,
  type ConsensusPriors,
  TRUTH_DIP,
  TRUTH_FLAT,
  TRUTH_UNKNOWN,
} from '../../../../../server/science/consensus/types';
import { createRandom } from '../../../../../server/science/random';

// ---------------------------------------------------------------------------------------------
// The slow, obvious reference: plain objects, a loop per snippet and per volunteer, Bayes' rule with
// the likelihoods multiplied out. It follows the rules written in em.ts's TSDoc, not its code.
// ---------------------------------------------------------------------------------------------

interface PlainVerdict {
  snippet: number;
  judge: number;
  answer: 'dip' | 'flat' | 'unsure';
}

interface PlainCampaign {
  snippetCount: number;
  judgeCount: number;
  verdicts: PlainVerdict[];
  /** 1, 0 or null per snippet. */
  truth: (0 | 1 | null)[];
  control: boolean[];
}

const clamp = (rate: number) => Math.min(1 - 1e-3, Math.max(1e-3, rate));

function referenceTypical(rates: number[], evidence: number[], minEvidence: number, fallback: BetaPrior) {
  const chosen = rates.filter((_, j) => evidence[j]! >= minEvidence);
  if (chosen.length < TYPICAL_MIN_VOLUNTEERS) return fallback;
  const mean = chosen.reduce((a, b) => a + b, 0) / chosen.length;
  const variance = chosen.reduce((a, b) => a + (b - mean) ** 2, 0) / chosen.length;
  let strength = variance > 0 ? (mean * (1 - mean)) / variance - 1 : TYPICAL_MAX_STRENGTH;
  strength = Math.min(TYPICAL_MAX_STRENGTH, Math.max(TYPICAL_MIN_STRENGTH, strength));
  const m = Math.min(TYPICAL_MAX_MEAN, Math.max(TYPICAL_MIN_MEAN, mean));
  return { alpha: m * strength, beta: (1 - m) * strength };
}

function referenceEstimate(
  campaign: PlainCampaign,
  priors: ConsensusPriors,
  rounds: number,
  minEvidence: number,
) {
  const informative = campaign.verdicts.filter((v) => v.answer !== 'unsure');
  const priorRate = priors.dipRate.alpha / (priors.dipRate.alpha + priors.dipRate.beta);
  const q: number[] = [];
  for (let i = 0; i < campaign.snippetCount; i += 1) {
    const truth = campaign.truth[i]!;
    const mine = informative.filter((v) => v.snippet === i);
    if (truth !== null) q.push(truth);
    else if (mine.length > 0) q.push(mine.filter((v) => v.answer === 'dip').length / mine.length);
    else q.push(priorRate);
  }
  const judges = Array.from({ length: campaign.judgeCount }, () => ({
    s: 0,
    t: 0,
    dipSeen: 0,
    dipSaid: 0,
    flatSeen: 0,
    flatSaid: 0,
  }));
  let dipRate = priorRate;
  for (let round = 0; round < rounds; round += 1) {
    for (let j = 0; j < campaign.judgeCount; j += 1) {
      const judge = judges[j]!;
      judge.dipSeen = 0;
      judge.dipSaid = 0;
      judge.flatSeen = 0;
      judge.flatSaid = 0;
      for (const v of informative) {
        if (v.judge !== j) continue;
        const p = q[v.snippet]!;
        judge.dipSeen += p;
        judge.flatSeen += 1 - p;
        if (v.answer === 'dip') judge.dipSaid += p;
        else judge.flatSaid += 1 - p;
      }
      const { sensitivity: ps, specificity: pt } = priors;
      judge.s = clamp((ps.alpha + judge.dipSaid) / (ps.alpha + ps.beta + judge.dipSeen));
      judge.t = clamp((pt.alpha + judge.flatSaid) / (pt.alpha + pt.beta + judge.flatSeen));
    }
    let sum = 0;
    let count = 0;
    for (let i = 0; i < campaign.snippetCount; i += 1) {
      const hasEvidence = campaign.truth[i] !== null || informative.some((v) => v.snippet === i);
      if (campaign.control[i] || !hasEvidence) continue;
      sum += q[i]!;
      count += 1;
    }
    dipRate = clamp((priors.dipRate.alpha + sum) / (priors.dipRate.alpha + priors.dipRate.beta + count));
    for (let i = 0; i < campaign.snippetCount; i += 1) {
      if (campaign.truth[i] !== null) continue;
      let dip = dipRate;
      let noDip = 1 - dipRate;
      for (const v of informative) {
        if (v.snippet !== i) continue;
        const { s, t } = judges[v.judge]!;
        dip *= v.answer === 'dip' ? s : 1 - s;
        noDip *= v.answer === 'dip' ? 1 - t : t;
      }
      q[i] = dip / (dip + noDip);
    }
  }
  return {
    judges,
    dipRate,
    score: q,
    typical: {
      sensitivity: referenceTypical(
        judges.map((j) => j.s),
        judges.map((j) => j.dipSeen),
        minEvidence,
        priors.sensitivity,
      ),
      specificity: referenceTypical(
        judges.map((j) => j.t),
        judges.map((j) => j.flatSeen),
        minEvidence,
        priors.specificity,
      ),
    },
  };
}

const ANSWER_CODE = { flat: ANSWER_FLAT, dip: ANSWER_DIP, unsure: ANSWER_UNSURE } as const;

function columnar(campaign: PlainCampaign): ConsensusData {
  return {
    snippetCount: campaign.snippetCount,
    judgeCount: campaign.judgeCount,
    verdictSnippet: Int32Array.from(campaign.verdicts, (v) => v.snippet),
    verdictJudge: Int32Array.from(campaign.verdicts, (v) => v.judge),
    verdictAnswer: Uint8Array.from(campaign.verdicts, (v) => ANSWER_CODE[v.answer]),
    knownTruth: Int8Array.from(campaign.truth, (t) => (t === null ? TRUTH_UNKNOWN : t)),
    isControl: Uint8Array.from(campaign.control, (c) => (c ? 1 : 0)),
  };
}

const plainCampaign: fc.Arbitrary<PlainCampaign> = fc
  .record({ snippetCount: fc.integer({ min: 1, max: 12 }), judgeCount: fc.integer({ min: 1, max: 8 }) })
  .chain(({ snippetCount, judgeCount }) =>
    fc.record({
      snippetCount: fc.constant(snippetCount),
      judgeCount: fc.constant(judgeCount),
      verdicts: fc.array(
        fc.record({
          snippet: fc.integer({ min: 0, max: snippetCount - 1 }),
          judge: fc.integer({ min: 0, max: judgeCount - 1 }),
          answer: fc.constantFrom('dip' as const, 'flat' as const, 'unsure' as const),
        }),
        { maxLength: 60 },
      ),
      truth: fc.array(fc.constantFrom(null, null, 0 as const, 1 as const), {
        minLength: snippetCount,
        maxLength: snippetCount,
      }),
      control: fc.array(fc.boolean(), { minLength: snippetCount, maxLength: snippetCount }),
    }),
  );

const betaPrior = fc.record({
  alpha: fc.double({ min: 0.5, max: 10, noNaN: true }),
  beta: fc.double({ min: 0.5, max: 10, noNaN: true }),
});

// ---------------------------------------------------------------------------------------------
// A synthetic campaign: volunteers whose true sensitivity and specificity we know.
// ---------------------------------------------------------------------------------------------

type Kind = 'honest' | 'random' | 'always-dip';

interface SyntheticCampaign {
  data: ConsensusData;
  /** Whether each snippet truly holds a dip. */
  holdsDip: Uint8Array;
  kind: Kind[];
  trueSensitivity: Float64Array;
  trueSpecificity: Float64Array;
}

/**
 * 2,000 snippets, 10% of them controls (two planted to one quiet, as the campaign defaults planted_share
 * 0.1 and quiet_share 0.05), 20% of the rest holding a dip;
 * 300 synthetic volunteers: 10% answer at random, 5% always say dip, the rest have s drawn uniformly
 * from [0.6, 0.95] and t from [0.7, 0.99], and are active in proportions drawn log-uniformly from
 * [0.3, 3]. Each snippet gets 5–15 verdicts from distinct volunteers; 5% of verdicts are unsure.
 */
function syntheticCampaign(seed: string): SyntheticCampaign {
  const random = createRandom(seed);
  const snippetCount = 2000;
  const judgeCount = 300;
  const kind: Kind[] = [];
  const trueSensitivity = new Float64Array(judgeCount);
  const trueSpecificity = new Float64Array(judgeCount);
  const cumulativeActivity = new Float64Array(judgeCount);
  let activity = 0;
  for (let j = 0; j < judgeCount; j += 1) {
    const u = random.next();
    if (u < 0.1) {
      kind.push('random');
      trueSensitivity[j] = 0.5;
      trueSpecificity[j] = 0.5;
    } else if (u < 0.15) {
      kind.push('always-dip');
      trueSensitivity[j] = 1;
      trueSpecificity[j] = 0;
    } else {
      kind.push('honest');
      trueSensitivity[j] = random.uniform(0.6, 0.95);
      trueSpecificity[j] = random.uniform(0.7, 0.99);
    }
    activity += random.logUniform(0.3, 3);
    cumulativeActivity[j] = activity;
  }
  const holdsDip = new Uint8Array(snippetCount);
  const isControl = new Uint8Array(snippetCount);
  const knownTruth = new Int8Array(snippetCount).fill(TRUTH_UNKNOWN);
  for (let i = 0; i < snippetCount; i += 1) {
    if (random.next() < 0.1) {
      isControl[i] = 1;
      holdsDip[i] = random.next() < 2 / 3 ? 1 : 0;
      knownTruth[i] = holdsDip[i] ? TRUTH_DIP : TRUTH_FLAT;
    } else holdsDip[i] = random.next() < 0.2 ? 1 : 0;
  }
  const verdictSnippet: number[] = [];
  const verdictJudge: number[] = [];
  const verdictAnswer: number[] = [];
  for (let i = 0; i < snippetCount; i += 1) {
    const chosen = new Set<number>();
    const wanted = random.int(5, 15);
    while (chosen.size < wanted) {
      const x = random.next() * activity;
      let lo = 0;
      let hi = judgeCount - 1;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (cumulativeActivity[mid]! < x) lo = mid + 1;
        else hi = mid;
      }
      chosen.add(lo);
    }
    for (const j of chosen) {
      let answer: number;
      if (random.next() < 0.05) answer = ANSWER_UNSURE;
      else if (holdsDip[i]) answer = random.next() < trueSensitivity[j]! ? ANSWER_DIP : ANSWER_FLAT;
      else answer = random.next() < trueSpecificity[j]! ? ANSWER_FLAT : ANSWER_DIP;
      verdictSnippet.push(i);
      verdictJudge.push(j);
      verdictAnswer.push(answer);
    }
  }
  return {
    data: {
      snippetCount,
      judgeCount,
      verdictSnippet: Int32Array.from(verdictSnippet),
      verdictJudge: Int32Array.from(verdictJudge),
      verdictAnswer: Uint8Array.from(verdictAnswer),
      knownTruth,
      isControl,
    },
    holdsDip,
    kind,
    trueSensitivity,
    trueSpecificity,
  };
}

/** Per volunteer, their dip and flat verdicts counted against the true classes. */
function trueCounts(campaign: SyntheticCampaign) {
  const n = campaign.data.judgeCount;
  const counts = {
    verdicts: new Float64Array(n),
    dipSeen: new Float64Array(n),
    dipSaid: new Float64Array(n),
    flatSeen: new Float64Array(n),
    flatSaid: new Float64Array(n),
  };
  const { verdictSnippet, verdictJudge, verdictAnswer } = campaign.data;
  for (let v = 0; v < verdictAnswer.length; v += 1) {
    const answer = verdictAnswer[v]!;
    if (answer === ANSWER_UNSURE) continue;
    const j = verdictJudge[v]!;
    counts.verdicts[j]! += 1;
    if (campaign.holdsDip[verdictSnippet[v]!]) {
      counts.dipSeen[j]! += 1;
      if (answer === ANSWER_DIP) counts.dipSaid[j]! += 1;
    } else {
      counts.flatSeen[j]! += 1;
      if (answer === ANSWER_FLAT) counts.flatSaid[j]! += 1;
    }
  }
  return counts;
}

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length;
const medianOf = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

describe('estimateConsensus on a synthetic campaign', () => {
  const campaign = syntheticCampaign('consensus-em-campaign');
  const estimate = estimateConsensus(campaign.data, DEFAULT_PRIORS);
  const counts = trueCounts(campaign);
  const clampRate = (rate: number) => Math.min(1 - 1e-3, Math.max(1e-3, rate));
  const experienced = campaign.kind.map((_, j) => j).filter((j) => counts.verdicts[j]! >= 30);

  it('converges within 50 iterations (the issue asks for 50)', () => {
    expect(estimate.converged).toBe(true);
    expect(estimate.iterations).toBeLessThanOrEqual(50);
    process.stdout.write(`EM converged in ${estimate.iterations} iterations\n`);
  });

  it('recovers specificity within a mean absolute error of 0.05 for volunteers with ≥ 30 verdicts (the issue)', () => {
    const errors = experienced.map((j) =>
      Math.abs(estimate.specificity[j]! - clampRate(campaign.trueSpecificity[j]!)),
    );
    expect(experienced.length).toBeGreaterThan(150);
    process.stdout.write(`specificity MAE ${mean(errors).toFixed(4)} over ${errors.length} volunteers\n`);
    expect(mean(errors)).toBeLessThan(0.05);
  });

  it('recovers sensitivity as well as the evidence allows: within 0.01 (MAE) of an estimator told every truth', () => {
    // The 0.05 for sensitivity cannot be met here by any estimator: each volunteer sees only about
    // 15 snippets with a dip (binomial σ ≈ 0.1), and an estimator told every snippet's truth, with the same
    // prior, does no better than 0.07 (printed). So sensitivity is checked against that estimator.
    const error = (j: number, s: number) => Math.abs(s - clampRate(campaign.trueSensitivity[j]!));
    const ours = experienced.map((j) => error(j, estimate.sensitivity[j]!));
    const told = experienced.map((j) =>
      error(
        j,
        reliabilityFromCounts(
          { dipSeen: counts.dipSeen[j]!, dipSaid: counts.dipSaid[j]!, flatSeen: 0, flatSaid: 0 },
          DEFAULT_PRIORS,
        ).sensitivity,
      ),
    );
    const withDips = experienced.filter((j) => counts.dipSeen[j]! >= 30);
    const oursWithDips = withDips.map((j) => error(j, estimate.sensitivity[j]!));
    process.stdout.write(
      `sensitivity MAE ${mean(ours).toFixed(4)} over ${ours.length} volunteers with ≥ 30 verdicts ` +
        `(told the truth: ${mean(told).toFixed(4)}); ${mean(oursWithDips).toFixed(4)} over the ` +
        `${withDips.length} with ≥ 30 verdicts on snippets holding a dip\n`,
    );
    expect(mean(ours)).toBeLessThan(mean(told) + 0.01);
  });

  it('loses little to not knowing the truth: its rates are within 0.02 (MAE) of those from the true classes', () => {
    const gap = (pick: 's' | 't') =>
      mean(
        experienced.map((j) => {
          const told = reliabilityFromCounts(
            {
              dipSeen: counts.dipSeen[j]!,
              dipSaid: counts.dipSaid[j]!,
              flatSeen: counts.flatSeen[j]!,
              flatSaid: counts.flatSaid[j]!,
            },
            DEFAULT_PRIORS,
          );
          return pick === 's'
            ? Math.abs(estimate.sensitivity[j]! - told.sensitivity)
            : Math.abs(estimate.specificity[j]! - told.specificity);
        }),
      );
    expect(gap('s')).toBeLessThan(0.02);
    expect(gap('t')).toBeLessThan(0.02);
  });

  it('classifies the non-control snippets more accurately than the plain majority', () => {
    const votes = new Float64Array(campaign.data.snippetCount);
    const dips = new Float64Array(campaign.data.snippetCount);
    const { verdictSnippet, verdictAnswer } = campaign.data;
    for (let v = 0; v < verdictAnswer.length; v += 1) {
      if (verdictAnswer[v] === ANSWER_UNSURE) continue;
      votes[verdictSnippet[v]!]! += 1;
      dips[verdictSnippet[v]!]! += verdictAnswer[v]!;
    }
    let weightedRight = 0;
    let majorityRight = 0;
    let judged = 0;
    for (let i = 0; i < campaign.data.snippetCount; i += 1) {
      if (campaign.data.isControl![i]) continue;
      judged += 1;
      const truth = campaign.holdsDip[i]!;
      if ((estimate.score[i]! >= 0.5 ? 1 : 0) === truth) weightedRight += 1;
      // A tie goes to flat, the commoner class.
      if ((dips[i]! > votes[i]! / 2 ? 1 : 0) === truth) majorityRight += 1;
    }
    const weighted = weightedRight / judged;
    const majority = majorityRight / judged;
    process.stdout.write(
      `accuracy on ${judged} non-control snippets: weighted ${weighted.toFixed(4)}, plain majority ${majority.toFixed(4)}\n`,
    );
    expect(weighted).toBeGreaterThan(majority);
  });

  it('estimates the dip rate near the true 20% (within 0.03)', () => {
    // The campaign's non-control snippets hold a dip with probability 0.2 (by construction).
    expect(Math.abs(estimate.dipRate - 0.2)).toBeLessThan(0.03);
  });

  it('gives random and always-dip volunteers weights near zero', () => {
    // A random volunteer's weights are not exactly 0 here: the prior pulls their s and t towards the
    // typical volunteer's, and with ≈ 15 dip and ≈ 50 other snippets each, s̄ ≈ (7 + 7.5)/25 and
    // t̄ ≈ (8 + 25)/60 give |weight| ≈ 0.27 ± 0.2 (hand-computed from the formulas in em.ts). So the group's
    // median |weight| is held below 0.45 — that expectation plus three standard errors of a median of
    // about 20 — rather than the suggested 0.3, which a correct estimator would miss for about
    // a third of seeds; and below a third of the honest volunteers' median weight.
    const ofKind = (k: Kind) => experienced.filter((j) => campaign.kind[j] === k);
    const random = ofKind('random');
    const always = ofKind('always-dip');
    const honest = ofKind('honest');
    expect(random.length).toBeGreaterThanOrEqual(10);
    expect(always.length).toBeGreaterThanOrEqual(5);
    const abs = (values: Float64Array, js: number[]) => js.map((j) => Math.abs(values[j]!));
    const randomDip = medianOf(abs(estimate.weightDip, random));
    const randomFlat = medianOf(abs(estimate.weightFlat, random));
    const honestDip = medianOf(abs(estimate.weightDip, honest));
    const honestFlat = medianOf(abs(estimate.weightFlat, honest));
    process.stdout.write(
      `median |weightDip|, |weightFlat|: random ${randomDip.toFixed(3)}, ${randomFlat.toFixed(3)}; ` +
        `honest ${honestDip.toFixed(3)}, ${honestFlat.toFixed(3)}\n`,
    );
    expect(randomDip).toBeLessThan(0.45);
    expect(randomFlat).toBeLessThan(0.45);
    expect(randomDip).toBeLessThan(honestDip / 3);
    expect(randomFlat).toBeLessThan(honestFlat / 3);
    // An always-dip volunteer's s → 1 and t → 0 together, so log(s/(1 − t)) → 0: with the prior,
    // (7 + 15)/25 and 8/60 give 0.015 (hand-computed). Their flat weight is left unchecked: they never
    // give a flat verdict, so it applies to nothing and is set by the prior alone.
    for (const j of always) expect(Math.abs(estimate.weightDip[j]!)).toBeLessThan(0.3);
  });

  it('fits a typical volunteer near the experienced volunteers, weak and within the sane range', () => {
    const { sensitivity, specificity } = estimate.typical;
    for (const prior of [sensitivity, specificity]) {
      const strength = prior.alpha + prior.beta;
      expect(strength).toBeGreaterThanOrEqual(TYPICAL_MIN_STRENGTH);
      expect(strength).toBeLessThanOrEqual(TYPICAL_MAX_STRENGTH);
    }
    const estimatedMean = mean(experienced.map((j) => estimate.sensitivity[j]!));
    expect(sensitivity.alpha / (sensitivity.alpha + sensitivity.beta)).toBeCloseTo(estimatedMean, 1);
    // A newcomer starts at the typical volunteer.
    const newcomer = reliabilityFromCounts(
      { dipSeen: 0, dipSaid: 0, flatSeen: 0, flatSaid: 0 },
      { sensitivity, specificity },
    );
    expect(newcomer.sensitivity).toBeCloseTo(sensitivity.alpha / (sensitivity.alpha + sensitivity.beta), 12);
  });

  it('returns counts from which reliabilityFromCounts gives back every volunteer’s rates', () => {
    for (let j = 0; j < campaign.data.judgeCount; j += 1) {
      const again = reliabilityFromCounts(
        {
          dipSeen: estimate.dipSeen[j]!,
          dipSaid: estimate.dipSaid[j]!,
          flatSeen: estimate.flatSeen[j]!,
          flatSaid: estimate.flatSaid[j]!,
        },
        DEFAULT_PRIORS,
      );
      expect(again.sensitivity).toBeCloseTo(estimate.sensitivity[j]!, 12);
      expect(again.specificity).toBeCloseTo(estimate.specificity[j]!, 12);
      expect(again.weightDip).toBeCloseTo(estimate.weightDip[j]!, 10);
    }
  });

  it('gives the same output for the same input', () => {
    const again = estimateConsensus(campaign.data, DEFAULT_PRIORS);
    expect(again).toEqual(estimate);
    // And a second re-estimate from the fitted typical volunteer is itself repeatable.
    const priors = { ...DEFAULT_PRIORS, ...estimate.typical };
    expect(estimateConsensus(campaign.data, priors)).toEqual(estimateConsensus(campaign.data, priors));
  });
});

describe('estimateConsensus against the slow reference', () => {
  it('agrees on random campaigns, round for round', () => {
    fc.assert(
      fc.property(
        plainCampaign,
        fc.record({ sensitivity: betaPrior, specificity: betaPrior, dipRate: betaPrior }),
        fc.integer({ min: 1, max: 6 }),
        fc.integer({ min: 0, max: 3 }),
        (campaign, priors, rounds, minEvidence) => {
          const fast = estimateConsensus(columnar(campaign), priors, {
            maxIterations: rounds,
            tolerance: 0,
            typicalMinEvidence: minEvidence,
          });
          const slow = referenceEstimate(campaign, priors, rounds, minEvidence);
          expect(fast.dipRate).toBeCloseTo(slow.dipRate, 10);
          for (let i = 0; i < campaign.snippetCount; i += 1)
            expect(fast.score[i]).toBeCloseTo(slow.score[i]!, 9);
          for (let j = 0; j < campaign.judgeCount; j += 1) {
            const judge = slow.judges[j]!;
            expect(fast.sensitivity[j]).toBeCloseTo(judge.s, 10);
            expect(fast.specificity[j]).toBeCloseTo(judge.t, 10);
            expect(fast.weightDip[j]).toBeCloseTo(Math.log(judge.s / (1 - judge.t)), 9);
            expect(fast.weightFlat[j]).toBeCloseTo(Math.log((1 - judge.s) / judge.t), 9);
            expect(fast.dipSeen[j]).toBeCloseTo(judge.dipSeen, 9);
            expect(fast.dipSaid[j]).toBeCloseTo(judge.dipSaid, 9);
            expect(fast.flatSeen[j]).toBeCloseTo(judge.flatSeen, 9);
            expect(fast.flatSaid[j]).toBeCloseTo(judge.flatSaid, 9);
          }
          for (const rate of ['sensitivity', 'specificity'] as const) {
            expect(fast.typical[rate].alpha).toBeCloseTo(slow.typical[rate].alpha, 8);
            expect(fast.typical[rate].beta).toBeCloseTo(slow.typical[rate].beta, 8);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it('is unmoved by unsure verdicts', () => {
    fc.assert(
      fc.property(plainCampaign, (campaign) => {
        const without = { ...campaign, verdicts: campaign.verdicts.filter((v) => v.answer !== 'unsure') };
        expect(estimateConsensus(columnar(campaign), DEFAULT_PRIORS)).toEqual(
          estimateConsensus(columnar(without), DEFAULT_PRIORS),
        );
      }),
    );
  });
});

describe('fitTypicalBeta', () => {
  const evidence = new Float64Array([20, 20, 20, 20, 20]);

  it('fits Beta by the method of moments on a hand example', () => {
    // Hand-computed: rates 0.5, 0.6, 0.75, 0.9, 1.0 have mean 0.75 and variance 0.034, so
    // α + β = 0.75 × 0.25 / 0.034 − 1 = 4.5147 and α = 0.75 × 4.5147 = 3.3860 (Pearson's moments).
    const prior = fitTypicalBeta(new Float64Array([0.5, 0.6, 0.75, 0.9, 1]), evidence, 10, {
      alpha: 1,
      beta: 1,
    });
    expect(prior.alpha + prior.beta).toBeCloseTo(0.1875 / 0.034 - 1, 10);
    expect(prior.alpha).toBeCloseTo(0.75 * (0.1875 / 0.034 - 1), 10);
  });

  it('holds the fit weak and its mean sane', () => {
    // Identical volunteers would make the moments' strength infinite: held at 10; their mean 0.95 is
    // held at 0.85, so Beta(8.5, 1.5) (hand-computed).
    const prior = fitTypicalBeta(new Float64Array(5).fill(0.95), evidence, 10, { alpha: 1, beta: 1 });
    expect(prior.alpha).toBeCloseTo(8.5, 12);
    expect(prior.beta).toBeCloseTo(1.5, 12);
  });

  it('keeps the given prior with fewer than five volunteers of enough evidence', () => {
    const fallback = { alpha: 7, beta: 3 };
    const rates = new Float64Array([0.5, 0.6, 0.75, 0.9, 1]);
    const thin = new Float64Array([20, 20, 20, 20, 9]);
    expect(fitTypicalBeta(rates, thin, 10, fallback)).toEqual(fallback);
  });
});

describe('estimateConsensus with known truths', () => {
  it('counts controls whole, never re-scores them, and keeps them out of the dip rate', () => {
    // One volunteer, four planted controls of which they found 3, two quiet ones both called flat;
    // a second volunteer on one unknown snippet.
    const campaign: PlainCampaign = {
      snippetCount: 7,
      judgeCount: 2,
      verdicts: [
        { snippet: 0, judge: 0, answer: 'dip' },
        { snippet: 1, judge: 0, answer: 'dip' },
        { snippet: 2, judge: 0, answer: 'dip' },
        { snippet: 3, judge: 0, answer: 'flat' },
        { snippet: 4, judge: 0, answer: 'flat' },
        { snippet: 5, judge: 0, answer: 'flat' },
        { snippet: 6, judge: 1, answer: 'dip' },
      ],
      truth: [1, 1, 1, 1, 0, 0, null],
      control: [true, true, true, true, true, true, false],
    };
    const priors = {
      sensitivity: { alpha: 1, beta: 1 },
      specificity: { alpha: 1, beta: 1 },
      dipRate: { alpha: 1, beta: 1 },
    };
    const estimate = estimateConsensus(columnar(campaign), priors);
    // Hand-computed from the formula: s = (1 + 3) / (2 + 4), t = (1 + 2) / (2 + 2).
    expect(estimate.sensitivity[0]).toBeCloseTo(4 / 6, 12);
    expect(estimate.specificity[0]).toBeCloseTo(3 / 4, 12);
    expect(Array.from(estimate.score.subarray(0, 6))).toEqual([1, 1, 1, 1, 0, 0]);
    // Only snippet 6 counts for π: π = (1 + q₆) / (2 + 1), with q₆ from volunteer 1 alone.
    expect(estimate.dipRate).toBeCloseTo((1 + estimate.score[6]!) / 3, 5);
  });

  it('without isControl, takes every known truth for a control', () => {
    const data = columnar({
      snippetCount: 2,
      judgeCount: 1,
      verdicts: [
        { snippet: 0, judge: 0, answer: 'dip' },
        { snippet: 1, judge: 0, answer: 'dip' },
      ],
      truth: [1, null],
      control: [false, false],
    });
    const asRuling = estimateConsensus(data, DEFAULT_PRIORS);
    const { isControl: _, ...withoutFlags } = data;
    const asControl = estimateConsensus(withoutFlags, DEFAULT_PRIORS);
    // A ruling counts for π; a control does not, so π differs.
    expect(asRuling.dipRate).not.toBeCloseTo(asControl.dipRate, 6);
    expect(asControl.dipRate).toBeCloseTo((1 + asControl.score[1]!) / 3, 5);
  });
});

describe('estimateConsensus input errors', () => {
  const base = columnar({
    snippetCount: 2,
    judgeCount: 1,
    verdicts: [{ snippet: 0, judge: 0, answer: 'dip' }],
    truth: [null, null],
    control: [false, false],
  });

  it('names the array or option that is wrong', () => {
    expect(() => estimateConsensus({ ...base, verdictJudge: new Int32Array(2) }, DEFAULT_PRIORS)).toThrow(
      /data\.verdictSnippet, verdictJudge and verdictAnswer must have the same length, got 1, 2 and 1/,
    );
    expect(() => estimateConsensus({ ...base, verdictJudge: Int32Array.of(3) }, DEFAULT_PRIORS)).toThrow(
      /data\.verdictJudge\[0\] must be in \[0, 1\), got 3/,
    );
    expect(() => estimateConsensus({ ...base, verdictAnswer: Uint8Array.of(7) }, DEFAULT_PRIORS)).toThrow(
      /data\.verdictAnswer\[0\] must be 0, 1 or 2, got 7/,
    );
    expect(() => estimateConsensus({ ...base, knownTruth: Int8Array.of(-1, 4) }, DEFAULT_PRIORS)).toThrow(
      /data\.knownTruth\[1\] must be -1, 0 or 1, got 4/,
    );
    expect(() => estimateConsensus(base, { ...DEFAULT_PRIORS, dipRate: { alpha: -1, beta: 1 } })).toThrow(
      /priors\.dipRate must have finite alpha > 0 and beta > 0/,
    );
    expect(() => estimateConsensus(base, DEFAULT_PRIORS, { maxIterations: 0 })).toThrow(
      /options\.maxIterations must be an integer ≥ 1, got 0/,
    );
  });
});
