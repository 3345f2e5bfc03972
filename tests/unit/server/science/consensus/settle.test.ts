import { describe, expect, it } from 'vitest';
import { reliabilityFrom } from '../../../../../server/science/consensus/posterior';
import {
  decideSettlement,
  HIGH_RELIABILITY,
  isReliable,
  reliableDisagreement,
} from '../../../../../server/science/consensus/settle';
import type { SettleRules, WeightedVerdict } from '../../../../../server/science/consensus/types';

// The campaign defaults of the first data model: settle_upper 0.95, settle_lower 0.05,
// verdicts_to_settle 5, verdicts_max 15.
const rules: SettleRules = { upper: 0.95, lower: 0.05, minVerdicts: 5, maxVerdicts: 15 };

function verdict(answer: WeightedVerdict['answer'], s: number, t: number): WeightedVerdict {
  return { answer, reliability: reliabilityFrom(s, t) };
}

describe('decideSettlement', () => {
  const decide = (score: number, verdictCount: number, disagreement = false) =>
    decideSettlement({ score, verdictCount, rules, reliableDisagreement: disagreement });

  it('settles as a dip at or above the upper threshold with enough verdicts', () => {
    expect(decide(0.95, 5)).toEqual({ state: 'settled', outcome: 'dip' });
    expect(decide(0.999, 9)).toEqual({ state: 'settled', outcome: 'dip' });
  });

  it('settles as flat at or below the lower threshold with enough verdicts', () => {
    expect(decide(0.05, 5)).toEqual({ state: 'settled', outcome: 'flat' });
    expect(decide(0.001, 12)).toEqual({ state: 'settled', outcome: 'flat' });
  });

  it('stays open past a threshold with too few verdicts', () => {
    expect(decide(0.99, 4)).toEqual({ state: 'open' });
    expect(decide(0.01, 1)).toEqual({ state: 'open' });
  });

  it('stays open between the thresholds below the maximum', () => {
    expect(decide(0.5, 10)).toEqual({ state: 'open' });
    expect(decide(0.9499, 14)).toEqual({ state: 'open' });
  });

  it('splits at the maximum number of verdicts when still between the thresholds', () => {
    expect(decide(0.5, 15)).toEqual({ state: 'split', reason: 'max_verdicts' });
    expect(decide(0.9, 20)).toEqual({ state: 'split', reason: 'max_verdicts' });
  });

  it('splits when two highly reliable volunteers disagree, even before enough verdicts', () => {
    expect(decide(0.5, 2, true)).toEqual({ state: 'split', reason: 'reliable_disagreement' });
    expect(decide(0.5, 15, true)).toEqual({ state: 'split', reason: 'reliable_disagreement' });
  });

  it('settles past a threshold even when reliable volunteers disagree', () => {
    expect(decide(0.97, 6, true)).toEqual({ state: 'settled', outcome: 'dip' });
  });

  it('names the rule or input that is out of range', () => {
    expect(() =>
      decideSettlement({
        score: 0.5,
        verdictCount: 3,
        rules: { ...rules, lower: 0.96 },
        reliableDisagreement: false,
      }),
    ).toThrow(/rules\.lower and rules\.upper must satisfy 0 ≤ lower < upper ≤ 1, got 0.96 and 0.95/);
    expect(() =>
      decideSettlement({
        score: 0.5,
        verdictCount: 3,
        rules: { ...rules, maxVerdicts: 4 },
        reliableDisagreement: false,
      }),
    ).toThrow(/rules\.maxVerdicts must be an integer ≥ rules\.minVerdicts \(5\), got 4/);
    expect(() => decide(1.2, 3)).toThrow(/score must be in \[0, 1\], got 1.2/);
    expect(() => decide(0.5, -1)).toThrow(/verdictCount must be an integer ≥ 0, got -1/);
  });
});

describe('isReliable', () => {
  it('needs both sensitivity and specificity at or above 0.9', () => {
    expect(HIGH_RELIABILITY).toBe(0.9);
    expect(isReliable(reliabilityFrom(0.9, 0.9))).toBe(true);
    expect(isReliable(reliabilityFrom(0.99, 0.89))).toBe(false);
    expect(isReliable(reliabilityFrom(0.89, 0.99))).toBe(false);
    expect(isReliable(reliabilityFrom(0.8, 0.8), 0.75)).toBe(true);
  });
});

describe('reliableDisagreement', () => {
  it('finds a dip and a flat from two highly reliable volunteers', () => {
    expect(reliableDisagreement([verdict('dip', 0.95, 0.92), verdict('flat', 0.9, 0.97)])).toBe(true);
  });

  it('ignores disagreement involving a volunteer who is not highly reliable', () => {
    expect(reliableDisagreement([verdict('dip', 0.95, 0.92), verdict('flat', 0.85, 0.99)])).toBe(false);
  });

  it('is not disagreement when reliable volunteers agree or one of them is unsure', () => {
    expect(reliableDisagreement([verdict('dip', 0.95, 0.95), verdict('dip', 0.93, 0.96)])).toBe(false);
    expect(reliableDisagreement([verdict('dip', 0.95, 0.95), verdict('unsure', 0.93, 0.96)])).toBe(false);
    expect(reliableDisagreement([])).toBe(false);
  });

  it('names the threshold when it is not above a coin flip', () => {
    expect(() => reliableDisagreement([], 0.5)).toThrow(/threshold must be in \(0\.5, 1\], got 0.5/);
  });
});
