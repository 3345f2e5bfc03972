import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cleanLightCurve, noiseFigures, pointToPointScatter } from '../../../../server/science/clean';
import { createRandom } from '../../../../server/science/random';
import { type LightCurve, ScienceInputError } from '../../../../server/science/types';

const noTimeSystem = { timesys: null, timeref: null, timeunit: null, bjdRefDays: null };

function lightCurve(time: number[], flux: number[], extra: Partial<LightCurve> = {}): LightCurve {
  return {
    timeDays: Float64Array.from(time),
    flux: Float64Array.from(flux),
    fluxErr: null,
    quality: null,
    timeSystem: noTimeSystem,
    objectName: null,
    ...extra,
  };
}

function noisy(points: number, seed: string, level = 1000, sigma = 0.5) {
  const random = createRandom(seed);
  const time = Array.from({ length: points }, (_, i) => i / 720);
  const flux = time.map(() => level + random.normal(0, sigma));
  return { time, flux };
}

describe('cleanLightCurve', () => {
  it('drops non-finite and flagged points, sorts, merges repeats and normalises to median 1', () => {
    const { time, flux } = noisy(100, 'clean-basic');
    time[10] = Number.NaN;
    flux[20] = Number.POSITIVE_INFINITY;
    const quality = new Int32Array(100);
    quality[30] = 4;
    // Shuffle two points and repeat one timestamp.
    [time[40], time[41]] = [time[41]!, time[40]!];
    time.push(time[50]!);
    flux.push(flux[50]! + 0.2);
    const q = Int32Array.from([...quality, 0]);
    const { lightCurve: clean, report } = cleanLightCurve(lightCurve(time, flux, { quality: q }));
    expect(report.droppedNonFinite).toBe(2);
    expect(report.droppedFlagged).toBe(1);
    expect(report.mergedDuplicates).toBe(1);
    expect(report.pointsOut).toBe(100 - 3);
    for (let i = 1; i < clean.timeDays.length; i += 1)
      expect(clean.timeDays[i]).toBeGreaterThan(clean.timeDays[i - 1]!);
    const sorted = [...clean.flux].sort((a, b) => a - b);
    expect(sorted[sorted.length >> 1]).toBeCloseTo(1, 9);
    expect(clean.fluxErr.every((e) => e > 0)).toBe(true);
  });

  it('clips upward outliers but keeps every point of a dip', () => {
    const { time, flux } = noisy(2000, 'clean-outliers', 1, 0.0005);
    flux[500] = 1.05; // a cosmic ray
    flux[900] = 1.02;
    for (let i = 1200; i < 1230; i += 1) flux[i] = flux[i]! - 0.01; // a 1% transit
    const { lightCurve: clean, report } = cleanLightCurve(lightCurve(time, flux));
    expect(report.clippedOutliers).toBeGreaterThanOrEqual(2);
    expect(Math.max(...clean.flux)).toBeLessThan(1.01);
    const deep = [...clean.flux].filter((f) => f < 0.995);
    expect(deep).toHaveLength(30);
  });

  it('does not clip the peaks of slow stellar variability', () => {
    const time = Array.from({ length: 5000 }, (_, i) => i / 720);
    const flux = time.map((t) => 1 + 0.01 * Math.sin((2 * Math.PI * t) / 3));
    const { report } = cleanLightCurve(lightCurve(time, flux));
    expect(report.clippedOutliers).toBe(0);
  });

  it('changes nothing when run on its own output (idempotent)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10_000 }), fc.integer({ min: 20, max: 400 }), (seed, points) => {
        const random = createRandom(seed);
        const time = Array.from({ length: points }, () => random.uniform(0, 5));
        const flux = time.map(() => (random.next() < 0.02 ? 2 : 1 + random.normal(0, 0.001)));
        const once = cleanLightCurve(lightCurve(time, flux)).lightCurve;
        const again = cleanLightCurve({ ...once, quality: null, objectName: null }).lightCurve;
        expect(Array.from(again.timeDays)).toEqual(Array.from(once.timeDays));
        expect(Array.from(again.flux)).toEqual(Array.from(once.flux));
      }),
      { numRuns: 60 },
    );
  });

  it('refuses all-NaN flux and too few points with a ScienceInputError that says so', () => {
    const nan = lightCurve([1, 2, 3], [Number.NaN, Number.NaN, Number.NaN]);
    expect(() => cleanLightCurve(nan)).toThrow(ScienceInputError);
    expect(() => cleanLightCurve(nan)).toThrow(/no finite values/);
    expect(() => cleanLightCurve(lightCurve([1, 2, 3], [1, 1, 1]))).toThrow(/at least 10/);
  });
});

describe('noise figures', () => {
  it('measure white noise point to point and on 1-hour averages (σ/√n for n points per hour)', () => {
    const random = createRandom('noise-figures');
    const time = Float64Array.from({ length: 20_000 }, (_, i) => i / 720); // 2-minute cadence
    const flux = Float64Array.from(time, () => 1 + random.normal(0, 1e-3));
    const figures = noiseFigures(time, flux);
    expect(figures.pointToPointPpm).toBeGreaterThan(950);
    expect(figures.pointToPointPpm).toBeLessThan(1050);
    // 30 points per hour: 1000 ppm / √30 ≈ 183 ppm.
    expect(figures.oneHourPpm).toBeGreaterThan(183 * 0.85);
    expect(figures.oneHourPpm).toBeLessThan(183 * 1.15);
    expect(figures.cadenceDays).toBeCloseTo(1 / 720, 10);
  });

  it('point-to-point scatter ignores slow trends', () => {
    const flux = Float64Array.from({ length: 1000 }, (_, i) => 1 + i * 1e-4);
    expect(pointToPointScatter(flux)).toBeLessThan(1e-9);
  });
});
