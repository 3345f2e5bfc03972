import { describe, expect, it } from 'vitest';
import {
  creditLine,
  formatBjd,
  formatEpochTime,
  formatPeriod,
  formatSigmaMinutes,
  formatUtc,
  formatUtcRange,
  orderByPriority,
  orderDipTargets,
} from '@/features/lab/lib/candidates';

describe('formatSigmaMinutes', () => {
  it('writes a σ in days as minutes, with a decimal below 100 min so its growth shows', () => {
    // 0.018062953 d and 0.018170393 d: epochs 1513 and 1522 of candidate 1 on the demo server.
    expect(formatSigmaMinutes(0.018062953106112636)).toBe('± 26.0 min');
    expect(formatSigmaMinutes(0.018170392929898728)).toBe('± 26.2 min');
    expect(formatSigmaMinutes(0.00014275925760041277)).toBe('± 0.2 min');
    expect(formatSigmaMinutes(0.1)).toBe('± 144 min');
    expect(formatSigmaMinutes(null)).toBe('± —');
  });
});

describe('ephemeris formatting', () => {
  it('gives the period as many decimals as its error needs', () => {
    expect(formatPeriod(2.2319075929743697, 0.000011938128852288922)).toBe('2.231908 ± 0.000012 d');
    expect(formatPeriod(10.5, 0.02)).toBe('10.5000 ± 0.0200 d');
    expect(formatPeriod(3.1, null)).toBe('3.100000 d');
    expect(formatPeriod(null, null)).toBe('—');
  });

  it('writes BJD_TDB to five decimals with the σ in minutes', () => {
    expect(formatBjd(2461377.8866048367)).toBe('2461377.88660');
    expect(formatEpochTime(2458001.0104166665, 0.00014275925760041277)).toBe(
      '2458001.01042 BJD_TDB ± 0.2 min',
    );
    expect(formatEpochTime(null, null)).toBe('—');
  });
});

describe('UTC formatting', () => {
  it('writes instants in UTC, and a window’s end date only when it is another day', () => {
    expect(formatUtc('2026-12-03T09:18:26.118Z')).toBe('Thu, 3 Dec 2026, 09:18 UTC');
    expect(formatUtcRange('2026-12-03T08:07:25.573Z', '2026-12-03T10:29:26.663Z')).toBe(
      'Thu, 3 Dec 2026, 08:07 – 10:29 UTC',
    );
    expect(formatUtcRange('2026-12-18T23:04:20.029Z', '2026-12-19T01:26:35.483Z')).toBe(
      'Fri, 18 Dec 2026, 23:04 – Sat, 19 Dec 2026, 01:26 UTC',
    );
  });
});

describe('creditLine', () => {
  it('names the volunteers who chose to be named and counts the others', () => {
    expect(creditLine({ named: ['Ada', 'Bea'], others: 3 })).toBe('Found by Ada, Bea and 3 others');
    expect(creditLine({ named: ['Ada', 'Bea'], others: 0 })).toBe('Found by Ada and Bea');
    expect(creditLine({ named: ['Ada'], others: 1 })).toBe('Found by Ada and 1 other volunteer');
    expect(creditLine({ named: ['Ada'], others: 0 })).toBe('Found by Ada');
    expect(creditLine({ named: [], others: 4 })).toBe('Found by 4 volunteers');
    expect(creditLine({ named: [], others: 0 })).toBe('No volunteer credited yet');
  });
});

describe('orderDipTargets', () => {
  const targets = [
    { targetId: 1, dipCount: 1, bestSnr: 41.6, meanScore: 0.9997 },
    { targetId: 2, dipCount: 3, bestSnr: 39.8, meanScore: 0.988 },
    { targetId: 3, dipCount: 6, bestSnr: null, meanScore: 0.999 },
    { targetId: 4, dipCount: 3, bestSnr: 39.8, meanScore: 0.99 },
  ];

  it('by SNR keeps the server’s ranking: SNR, then dips, then consensus, missing SNR last', () => {
    expect(orderDipTargets(targets, 'snr').map((t) => t.targetId)).toEqual([1, 4, 2, 3]);
  });

  it('by dips puts the most dips first and breaks ties on SNR then consensus', () => {
    expect(orderDipTargets(targets, 'dips').map((t) => t.targetId)).toEqual([3, 4, 2, 1]);
  });

  it('by consensus puts the highest mean score first, and does not change its input', () => {
    const before = targets.map((t) => t.targetId);
    expect(orderDipTargets(targets, 'consensus').map((t) => t.targetId)).toEqual([1, 3, 4, 2]);
    expect(targets.map((t) => t.targetId)).toEqual(before);
  });
});

describe('orderByPriority', () => {
  it('puts the highest priority first and candidates without one last, oldest first', () => {
    const ordered = orderByPriority([
      { id: 1, priority: null },
      { id: 2, priority: 1.5 },
      { id: 3, priority: 4.5 },
      { id: 4, priority: null },
    ]);
    expect(ordered.map((c) => c.id)).toEqual([3, 2, 1, 4]);
  });
});
