import { describe, expect, it } from 'vitest';
import { daysPerTimeUnit, findDaysPerTimeUnit } from '../../../../../server/science/readers/time-units';

describe('daysPerTimeUnit', () => {
  it('reads the unit words of TESS and Kepler TUNIT values, and plain units', () => {
    // 'BJD - 2457000, days' is how TESS light-curve files write TUNIT1 (from memory).
    expect(findDaysPerTimeUnit('BJD - 2457000, days')).toBe(1);
    expect(findDaysPerTimeUnit('BJD - 2454833')).toBeNull();
    expect(findDaysPerTimeUnit('s')).toBe(1 / 86400);
    expect(findDaysPerTimeUnit('min')).toBe(1 / 1440);
    expect(findDaysPerTimeUnit('a')).toBe(365.25); // FITS Standard 4.0 §9.3: a = Julian year, 365.25 d
  });

  it('lets the column unit win, then TIMEUNIT, then days', () => {
    expect(daysPerTimeUnit('h', 's')).toBe(1 / 24);
    expect(daysPerTimeUnit('BJD - 2454833', 's')).toBe(1 / 86400);
    expect(daysPerTimeUnit(null, null)).toBe(1);
    expect(() => daysPerTimeUnit(null, 'jiffy')).toThrow(
      "TIMEUNIT 'jiffy' is not a time unit this reader knows",
    );
  });
});
