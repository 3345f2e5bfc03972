import { describe, expect, it } from 'vitest';
import { binSeries, breakAtGaps } from '@/features/deck/lib/binning';
import { describeCard } from '@/features/deck/lib/card-summary';
import { markTimeDays, plantedBandHours } from '@/features/deck/lib/cards';

const hours = [0, 0.5, 1, 1.5, 4, 4.5, 5, 5.5];
const ppm = [10, -10, 0, 20, -3000, -3100, 0, 5];
const card = {
  snippetId: 1,
  campaign: { id: 1, name: 'Invented field' },
  timeStart: 1400.25,
  durationHours: 5.5,
  cadenceMinutes: 20,
  pointCount: 8,
  hours,
  ppm,
};

describe('describeCard', () => {
  it('says the span, cadence, points and gaps, and never where the faint points are', () => {
    const text = describeCard(card);
    expect(text).toBe(
      'Brightness of one star over 5.5 h; 8 points plotted of 8 measured; one measurement every 20 minutes; no data from 1.5 h to 4 h.',
    );
    expect(text).not.toMatch(/deep|dip|faint|lowest|minimum|4\.5 h/);
  });
});

describe('binSeries', () => {
  it('averages points in equal time bins', () => {
    expect(binSeries([0, 1, 2, 3], [0, 10, 20, 30], 2)).toEqual({ hours: [0.5, 2.5], ppm: [5, 25] });
  });

  it('breaks the line across a gap in the data', () => {
    expect(breakAtGaps({ hours: [0, 1, 5], ppm: [1, 2, 3] }, 2)).toEqual({
      hours: [0, 1, 3, 5],
      ppm: [1, 2, Number.NaN, 3],
    });
  });
});

describe('times', () => {
  it('turns a mark in hours into days of the light curve, and a planted dip into a band in hours', () => {
    expect(markTimeDays(card, 6)).toBeCloseTo(1400.5);
    expect(plantedBandHours(card, { t0Days: 1400.5, durationHours: 2 })).toEqual({
      centreHours: 6,
      startHours: 5,
      endHours: 7,
    });
  });
});
