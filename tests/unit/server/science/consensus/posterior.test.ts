import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  logistic,
  RATE_MAX,
  RATE_MIN,
  reliabilityFrom,
  reliabilityFromCounts,
  scoreSnippet,
  snippetLogOdds,
} from '../../../../../server/science/consensus/posterior';
import type { WeightedVerdict } from '../../../../../server/science/consensus/types';
import { ScienceInputError } from '../../../../../server/science/types';

function verdict(
  answer: WeightedVerdict['answer'],
  sensitivity: number,
  specificity: number,
): WeightedVerdict {
  return { answer, reliability: reliabilityFrom(sensitivity, specificity) };
}

// The slow, obvious reference: Bayes' rule with the likelihoods multiplied out, no logarithms.
function directBayes(dipRate: number, verdicts: { answer: string; s: number; t: number }[]): number {
  let dip = dipRate;
  let noDip = 1 - dipRate;
  for (const { answer, s, t } of verdicts) {
    if (answer === 'dip') {
      dip *= s;
      noDip *= 1 - t;
    } else if (answer === 'flat') {
      dip *= 1 - s;
      noDip *= t;
    }
  }
  return dip / (dip + noDip);
}

describe('reliabilityFrom', () => {
  it('gives the log-likelihood-ratio weights log(s/(1−t)) and log((1−s)/t)', () => {
    // Hand-computed from the formula: log(0.9/0.05) = log 18, log(0.1/0.95).
    const reliability = reliabilityFrom(0.9, 0.95);
    expect(reliability.weightDip).toBeCloseTo(Math.log(18), 12);
    expect(reliability.weightFlat).toBeCloseTo(Math.log(0.1 / 0.95), 12);
  });

  it('gives a coin-flipping volunteer (s = t = 0.5) zero weight both ways', () => {
    // Hand-computed: log(0.5/0.5) = 0.
    const reliability = reliabilityFrom(0.5, 0.5);
    expect(reliability.weightDip).toBe(0);
    expect(reliability.weightFlat).toBe(0);
  });

  it('clamps perfect rates so that the weights stay finite', () => {
    const reliability = reliabilityFrom(1, 0);
    expect(reliability.sensitivity).toBe(RATE_MAX);
    expect(reliability.specificity).toBe(RATE_MIN);
    expect(Number.isFinite(reliability.weightDip)).toBe(true);
    expect(Number.isFinite(reliability.weightFlat)).toBe(true);
  });

  it('names the argument when a rate is outside [0, 1]', () => {
    expect(() => reliabilityFrom(1.2, 0.9)).toThrow(
      new ScienceInputError('sensitivity must be in [0, 1], got 1.2'),
    );
    expect(() => reliabilityFrom(0.9, Number.NaN)).toThrow(/specificity must be in \[0, 1\], got NaN/);
  });
});

describe('reliabilityFromCounts', () => {
  const flat = { sensitivity: { alpha: 1, beta: 1 }, specificity: { alpha: 1, beta: 1 } };

  it('with a flat Beta(1,1) prior: found 4 of 5 planted dips gives s = 5/7, flat on 9 of 10 quiet gives t = 10/12', () => {
    // Hand-computed from the formula (posterior mean (1 + k) / (2 + n)).
    const reliability = reliabilityFromCounts({ dipSeen: 5, dipSaid: 4, flatSeen: 10, flatSaid: 9 }, flat);
    expect(reliability.sensitivity).toBeCloseTo(5 / 7, 12);
    expect(reliability.specificity).toBeCloseTo(10 / 12, 12);
  });

  it('starts a newcomer at the prior mean and moves them as evidence accrues', () => {
    const typical = { sensitivity: { alpha: 8, beta: 2 }, specificity: { alpha: 6, beta: 4 } };
    const newcomer = reliabilityFromCounts({ dipSeen: 0, dipSaid: 0, flatSeen: 0, flatSaid: 0 }, typical);
    // Hand-computed: the prior means 8/10 and 6/10.
    expect(newcomer.sensitivity).toBeCloseTo(0.8, 12);
    expect(newcomer.specificity).toBeCloseTo(0.6, 12);
    // Hand-computed: after missing 10 of 10 dips, (8 + 0) / (10 + 10) = 0.4.
    const later = reliabilityFromCounts({ dipSeen: 10, dipSaid: 0, flatSeen: 0, flatSaid: 0 }, typical);
    expect(later.sensitivity).toBeCloseTo(0.4, 12);
  });

  it('names the count or prior that is wrong', () => {
    expect(() => reliabilityFromCounts({ dipSeen: -1, dipSaid: 0, flatSeen: 0, flatSaid: 0 }, flat)).toThrow(
      /counts\.dipSeen must be ≥ 0, got -1/,
    );
    expect(() =>
      reliabilityFromCounts(
        { dipSeen: 0, dipSaid: 0, flatSeen: 0, flatSaid: 0 },
        { ...flat, specificity: { alpha: 0, beta: 1 } },
      ),
    ).toThrow(/prior\.specificity must have finite alpha > 0 and beta > 0, got Beta\(0, 1\)/);
  });
});

describe('scoreSnippet', () => {
  it('π = 0.2, A (0.90, 0.95) dip, B (0.70, 0.80) flat, C (0.60, 0.90) dip: log-odds 2.315 and P = 0.9101', () => {
    const verdicts = [verdict('dip', 0.9, 0.95), verdict('flat', 0.7, 0.8), verdict('dip', 0.6, 0.9)];
    // Hand-computed from the formula: log(0.25) + log 18 + log(0.3/0.8) + log 6 = 2.3150.
    expect(snippetLogOdds(0.2, verdicts)).toBeCloseTo(2.315, 3);
    // Hand-computed by direct Bayes, as in the issue: 0.0324 / (0.0324 + 0.0032) = 0.91011.
    expect(scoreSnippet(0.2, verdicts).score).toBeCloseTo(0.0324 / (0.0324 + 0.0032), 10);
    expect(scoreSnippet(0.2, verdicts).score).toBeCloseTo(0.9101, 4);
  });

  it('equal accuracies p = (0.9, 0.7, 0.6) saying (dip, flat, flat) at π = 0.5: weighted says dip (P = 0.72) where plain majority says flat', () => {
    const verdicts = [verdict('dip', 0.9, 0.9), verdict('flat', 0.7, 0.7), verdict('flat', 0.6, 0.6)];
    const result = scoreSnippet(0.5, verdicts);
    // Hand-computed from the formula: log 9 − log(7/3) − log(3/2) = 0.9445; by direct Bayes
    // 0.108 / (0.108 + 0.042) = 0.72 (Nitzan & Paroush 1982's weighted rule against the plain majority).
    expect(result.score).toBeCloseTo(0.72, 10);
    expect(result.score).toBeGreaterThan(0.5);
    // Hand-computed: one dip of three.
    expect(result.dipShare).toBeCloseTo(1 / 3, 12);
  });

  it("counts verdicts, leaves unsure out of the share, and gives Kish's effective number of votes", () => {
    const verdicts = [
      verdict('dip', 0.9, 0.95),
      verdict('flat', 0.7, 0.8),
      verdict('dip', 0.6, 0.9),
      verdict('unsure', 0.99, 0.99),
    ];
    const result = scoreSnippet(0.2, verdicts);
    expect(result.verdictCount).toBe(4);
    // Hand-computed: two dips of the three dip and flat verdicts.
    expect(result.dipShare).toBeCloseTo(2 / 3, 12);
    // Hand-computed from Kish 1965: (2.8904 + 0.9808 + 1.7918)² / (2.8904² + 0.9808² + 1.7918²) = 2.5601.
    expect(result.effectiveVotes).toBeCloseTo(2.5601, 4);
  });

  it('gives n effective votes for n equal weights and 1 when one vote carries all the weight (Kish 1965)', () => {
    const equal = [verdict('dip', 0.8, 0.8), verdict('flat', 0.8, 0.8), verdict('dip', 0.8, 0.8)];
    expect(scoreSnippet(0.3, equal).effectiveVotes).toBeCloseTo(3, 12);
    const one = [verdict('dip', 0.8, 0.8), verdict('dip', 0.5, 0.5)];
    expect(scoreSnippet(0.3, one).effectiveVotes).toBeCloseTo(1, 12);
  });

  it('gives the prior for no evidence: no share, no effective votes', () => {
    const result = scoreSnippet(0.2, [verdict('unsure', 0.9, 0.9)]);
    expect(result.score).toBeCloseTo(0.2, 12);
    expect(result.dipShare).toBeNull();
    expect(result.effectiveVotes).toBe(0);
    expect(result.verdictCount).toBe(1);
  });

  it('stays finite and exact in log-odds far beyond where probabilities round to 1', () => {
    const many = Array.from({ length: 400 }, () => verdict('dip', RATE_MAX, RATE_MAX));
    // Hand-computed: 400 × log(0.999/0.001) + logit 0.5 = 400 × 6.9068 = 2762.7.
    expect(snippetLogOdds(0.5, many)).toBeCloseTo(400 * Math.log(0.999 / 0.001), 6);
    expect(scoreSnippet(0.5, many).score).toBe(1);
    const flats = Array.from({ length: 400 }, () => verdict('flat', RATE_MAX, RATE_MAX));
    expect(scoreSnippet(0.5, flats).score).toBeGreaterThanOrEqual(0);
    expect(logistic(-800)).toBeGreaterThanOrEqual(0);
    expect(logistic(800)).toBe(1);
  });

  it('agrees with direct Bayes on random verdicts', () => {
    const answers = fc.constantFrom('dip', 'flat', 'unsure');
    const rate = fc.double({ min: 0.01, max: 0.99, noNaN: true });
    fc.assert(
      fc.property(
        rate,
        fc.array(fc.record({ answer: answers, s: rate, t: rate }), { maxLength: 15 }),
        (dipRate, plain) => {
          const verdicts = plain.map(({ answer, s, t }) => verdict(answer, s, t));
          expect(scoreSnippet(dipRate, verdicts).score).toBeCloseTo(directBayes(dipRate, plain), 10);
        },
      ),
    );
  });

  it('names dipRate when it is not a probability strictly between 0 and 1', () => {
    expect(() => scoreSnippet(0, [])).toThrow(/dipRate must be in \(0, 1\), got 0/);
    expect(() => scoreSnippet(1.5, [])).toThrow(/dipRate must be in \(0, 1\), got 1.5/);
  });
});
