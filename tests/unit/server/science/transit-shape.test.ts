import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../../server/science/random';
import { fullDurationDays, totalDurationDays, transitFlux } from '../../../../server/science/transit-model';
import { fitTransitShape } from '../../../../server/science/transit-shape';

// Light curves made with our Mandel & Agol model (itself checked against published values in
// transit-model.test.ts); the expected contact durations are Winn 2010 ("Transits and Occultations",
// arXiv:1001.2010) eq. 14–15, as implemented and checked against astropy-based fixtures there.
const CADENCE_DAYS = 2 / 60 / 24;

function lightCurve(
  orbit: {
    periodDays: number;
    radiusRatio: number;
    aOverRstar: number;
    impact: number;
    u1?: number;
    u2?: number;
  },
  noisePpm: number,
  baselineDays = 27,
  seed = 'shape',
) {
  const n = Math.floor(baselineDays / CADENCE_DAYS);
  const timeDays = new Float64Array(n);
  for (let i = 0; i < n; i += 1) timeDays[i] = 1000 + i * CADENCE_DAYS;
  const flux = transitFlux(timeDays, { ...orbit, t0Days: 1001.3, u1: orbit.u1 ?? 0, u2: orbit.u2 ?? 0 });
  const random = createRandom(seed);
  for (let i = 0; i < n; i += 1) flux[i]! += random.normal(0, noisePpm * 1e-6);
  return { timeDays, flux };
}

describe('fitTransitShape', () => {
  it('finds a uniform-disk planet’s flat share T₂₃/T₁₄ and T₁₄ (Winn 2010 eq. 14–15)', () => {
    const orbit = { periodDays: 3, radiusRatio: 0.1, aOverRstar: 15, impact: 0.3 };
    const t14Hours = totalDurationDays(orbit) * 24;
    const expectedShare = fullDurationDays(orbit) / totalDurationDays(orbit);
    const fit = fitTransitShape({
      ...lightCurve(orbit, 200),
      periodDays: 3,
      t0Days: 1001.3,
      durationHours: t14Hours * 0.9,
    })!;
    expect(fit).not.toBeNull();
    // The grid's share step is 0.05 and its T₁₄ step 5 % of the duration given.
    expect(Math.abs(fit.flatShare - expectedShare)).toBeLessThan(0.06);
    expect(fit.totalDurationHours / t14Hours).toBeCloseTo(1, 1);
    // A uniform disk's depth is k² (Mandel & Agol 2002 for z ≤ 1 − k).
    expect(fit.depthPpm / 10_000).toBeCloseTo(1, 1);
    expect(fit.flatShare).toBeGreaterThan(0.3);
  });

  it('keeps a limb-darkened planet flat-bottomed enough (Sun-like u₁ = 0.4, u₂ = 0.25, from memory)', () => {
    const orbit = { periodDays: 4.2, radiusRatio: 0.08, aOverRstar: 12, impact: 0.5, u1: 0.4, u2: 0.25 };
    const fit = fitTransitShape({
      ...lightCurve(orbit, 150),
      periodDays: 4.2,
      t0Days: 1001.3,
      durationHours: totalDurationDays(orbit) * 24,
    })!;
    expect(fit.flatShare).toBeGreaterThanOrEqual(0.3);
  });

  it('sees the V of a grazing eclipse (b > 1 − k: no flat phase, T₂₃ = 0)', () => {
    const orbit = { periodDays: 2.5, radiusRatio: 0.6, aOverRstar: 6, impact: 1.05 };
    expect(fullDurationDays(orbit)).toBe(0);
    const fit = fitTransitShape({
      ...lightCurve(orbit, 500),
      periodDays: 2.5,
      t0Days: 1001.3,
      durationHours: totalDurationDays(orbit) * 24,
    })!;
    expect(fit.flatShare).toBeLessThan(0.3);
    expect(fit.flatChiSquare - fit.chiSquare).toBeGreaterThan(9);
  });

  it('fits a single transit when there is no period', () => {
    const orbit = { periodDays: 40, radiusRatio: 0.1, aOverRstar: 40, impact: 0.2 };
    const fit = fitTransitShape({
      ...lightCurve(orbit, 200, 4),
      periodDays: null,
      t0Days: 1001.3,
      durationHours: totalDurationDays(orbit) * 24,
    })!;
    expect(fit.flatShare).toBeGreaterThan(0.5);
  });

  it('cannot tell with too few points, no baseline, flat data or a duration of nothing', () => {
    const orbit = { periodDays: 3, radiusRatio: 0.1, aOverRstar: 15, impact: 0.3 };
    const { timeDays, flux } = lightCurve(orbit, 200);
    const sparse = {
      timeDays: timeDays.filter((_, i) => i % 40 === 0),
      flux: flux.filter((_, i) => i % 40 === 0),
    };
    expect(fitTransitShape({ ...sparse, periodDays: null, t0Days: 1001.3, durationHours: 2 })).toBeNull();
    expect(
      fitTransitShape({
        timeDays: timeDays.subarray(0, 10),
        flux: flux.subarray(0, 10),
        periodDays: 3,
        t0Days: 1000.1,
        durationHours: 2,
      }),
    ).toBeNull();
    const flat = new Float64Array(timeDays.length).fill(1);
    expect(
      fitTransitShape({ timeDays, flux: flat, periodDays: 3, t0Days: 1001.3, durationHours: 2 }),
    ).toBeNull();
    expect(fitTransitShape({ timeDays, flux, periodDays: 3, t0Days: 1001.3, durationHours: 0 })).toBeNull();
    expect(
      fitTransitShape({ timeDays, flux, periodDays: 3, t0Days: Number.NaN, durationHours: 2 }),
    ).toBeNull();
  });
});
