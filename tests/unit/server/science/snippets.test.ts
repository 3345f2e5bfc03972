import { describe, expect, it } from 'vitest';
import { cutWindows, displaySeries } from '../../../../server/science/snippets';

const cadence = 1 / 720; // 2 minutes
const times = (days: number, from = 0) =>
  Array.from({ length: Math.round(days / cadence) }, (_, i) => from + i * cadence);

describe('cutWindows', () => {
  it('cuts 2-day windows overlapping by 25% over the whole light curve', () => {
    const windows = cutWindows(Float64Array.from(times(10)), { lengthDays: 2, overlap: 0.25 });
    expect(windows.map((w) => Number(w.startDays.toFixed(6)))).toEqual([0, 1.5, 3, 4.5, 6, 7.5]);
    expect(windows.every((w) => w.endDays - w.startDays === 2)).toBe(true);
    expect(windows[0]!.pointCount).toBe(1440);
  });

  it('skips windows with less than 60% coverage, such as those across a gap', () => {
    const time = Float64Array.from([...times(3), ...times(3, 4.5)]);
    const windows = cutWindows(time, { lengthDays: 2, overlap: 0 });
    for (const window of windows) expect(window.coverage).toBeGreaterThanOrEqual(0.6);
    expect(windows.map((w) => w.startDays)).toEqual([0, 4, 6]);
    expect(windows.find((w) => w.startDays === 2)).toBeUndefined(); // 1 day of data in 2: 50%
  });

  it('names the argument when the length or overlap is out of range', () => {
    const time = Float64Array.from(times(1));
    expect(() => cutWindows(time, { lengthDays: 0, overlap: 0 })).toThrow(/lengthDays/);
    expect(() => cutWindows(time, { lengthDays: 1, overlap: 0.95 })).toThrow(/overlap/);
  });
});

describe('displaySeries', () => {
  it('keeps at most 600 points and keeps each bin’s lowest point, so a one-point dip survives', () => {
    const time = Float64Array.from(times(2));
    const flux = Float64Array.from(time, () => 1);
    flux[777] = 0.99;
    const [window] = cutWindows(time, { lengthDays: 2, overlap: 0 });
    const display = displaySeries(time, flux, window!);
    expect(display.timeDays.length).toBeLessThanOrEqual(600);
    expect(Math.min(...display.flux)).toBe(0.99);
    expect(display.timeDays[Array.from(display.flux).indexOf(0.99)]).toBe(time[777]);
  });

  it('keeps every point when there are fewer than the limit', () => {
    const time = Float64Array.from({ length: 100 }, (_, i) => i * 0.02);
    const flux = Float64Array.from(time, () => 1);
    const display = displaySeries(time, flux, { startDays: 0, endDays: 2, first: 0, end: 100 });
    expect(display.timeDays.length).toBe(100);
  });
});
