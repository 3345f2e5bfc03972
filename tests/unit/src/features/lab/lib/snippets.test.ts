import { describe, expect, it } from 'vitest';
import { plantedOffsetDays, plantedTimeDays } from '@/features/lab/lib/snippets';

const snippet = { timeStart: 17.8, timeEnd: 19.8 };

describe('plantedOffsetDays', () => {
  it('reads a t0 on the light curve’s time axis as an offset from the snippet start', () => {
    expect(plantedOffsetDays({ t0Days: 18.3 }, snippet)).toBeCloseTo(0.5, 12);
    expect(plantedTimeDays({ t0Days: 18.3 }, snippet)).toBeCloseTo(18.3, 12);
  });

  it('takes a t0 inside the snippet’s length but outside its time range as an offset already', () => {
    expect(plantedOffsetDays({ t0Days: 1.25 }, snippet)).toBe(1.25);
  });

  it('gives null for a t0 that fits neither', () => {
    expect(plantedOffsetDays({ t0Days: 42 }, snippet)).toBeNull();
  });
});
