import { describe, expect, it } from 'vitest';
import { detrendBiweight } from '../../../../server/science/detrend';
import { generateSurvey } from '../../../../server/science/synthetic-survey';
import { fitTransitShape } from '../../../../server/science/transit-shape';
import {
  derivedParameters,
  transitProbabilityStatement,
  vettingDiagnostics,
} from '../../../../server/science/vetting';

// The invented survey's truth, as a perfect period search would report it.
const survey = generateSurvey({ seed: 'vetting-test', targetCount: 120, cadenceMinutes: 10 });
const star = (target: (typeof survey.targets)[number]) => ({
  radiusRsun: target.stellarRadiusRsun,
  massMsun: target.stellarMassMsun,
  teffK: target.effectiveTemperatureK,
});
/** The trapezoid fitted to the light curve as ingestion leaves it (biweight-detrended, 1-day window). */
const shapeOf = (
  target: (typeof survey.targets)[number],
  periodDays: number,
  t0Days: number,
  durationHours: number,
) => {
  const { timeDays, flux } = target.lightCurve;
  const { detrended } = detrendBiweight(timeDays, flux, {
    windowDays: Math.max(1, (3 * durationHours) / 24),
  });
  return fitTransitShape({ timeDays, flux: detrended, periodDays, t0Days, durationHours });
};

describe('vetting diagnostics on the synthetic survey', () => {
  it('pass its planets', () => {
    const planets = survey.targets.flatMap((target) =>
      target.truth.planets.filter((planet) => planet.expectedSnr >= 10).map((planet) => ({ target, planet })),
    );
    expect(planets.length).toBeGreaterThan(3);
    for (const { target, planet } of planets) {
      const diagnostics = vettingDiagnostics(
        {
          periodDays: planet.periodDays,
          depthPpm: planet.depthPpm,
          durationHours: planet.durationHours,
          snr: planet.expectedSnr,
          oddEvenDifferenceSigma: 0.4,
          depthSecondaryPpm: 0,
          depthSecondaryErrPpm: planet.depthPpm / planet.expectedSnr,
          shape: shapeOf(target, planet.periodDays, planet.t0Days, planet.durationHours),
        },
        star(target),
      );
      const warned = diagnostics.filter((d) => d.verdict === 'warn').map((d) => d.code);
      expect(warned, `${target.designation}: ${JSON.stringify(diagnostics)}`).toEqual([]);
    }
  });

  it('warn on its eclipsing binaries (their secondary eclipse, their V shape, and mostly their size)', () => {
    const binaries = survey.targets.filter((target) => target.truth.binary);
    expect(binaries.length).toBeGreaterThan(0);
    let clear = 0;
    for (const target of binaries) {
      const binary = target.truth.binary!;
      const noise = target.truth.noisePpmPerHour / Math.sqrt(binary.durationHours);
      const diagnostics = vettingDiagnostics(
        {
          periodDays: binary.periodDays,
          depthPpm: binary.primaryDepthPpm,
          durationHours: binary.durationHours,
          snr: binary.primaryDepthPpm / noise,
          oddEvenDifferenceSigma: 0.5,
          depthSecondaryPpm: binary.secondaryDepthPpm,
          depthSecondaryErrPpm: noise,
          shape: shapeOf(target, binary.periodDays, binary.t0Days, binary.durationHours),
        },
        star(target),
      );
      const warned = diagnostics.filter((d) => d.verdict === 'warn').map((d) => d.code);
      expect(warned.length, `${target.designation}: ${JSON.stringify(diagnostics)}`).toBeGreaterThan(0);
      // The generator's eclipses are grazing (b > 1 − k), so every one seen clearly enough is a V.
      if (binary.primaryDepthPpm / noise >= 10) {
        clear += 1;
        expect(warned, `${target.designation}: ${JSON.stringify(diagnostics)}`).toContain('shape');
      }
    }
    expect(clear).toBeGreaterThan(0);
  });
});

describe('derived parameters', () => {
  it('give an Earth twin its geometric transit probability of about 0.47 % (the product brief; (R☉ + R⊕)/au)', () => {
    // A 1 R☉, 1 M☉ star, an Earth-sized dip (84 ppm = (R⊕/R☉)²) every 365.25 days.
    const derived = derivedParameters(
      { periodDays: 365.25, depthPpm: 84, durationHours: 13, snr: 10 },
      { radiusRsun: 1, massMsun: 1, teffK: 5772 },
    );
    expect(derived.orbit!.semiMajorAxisAu).toBeCloseTo(1, 2);
    expect(derived.radius.radiusEarth).toBeCloseTo(1, 1);
    expect(derived.orbit!.transitProbability).toBeCloseTo(0.0047, 4);
    expect(derived.orbit!.statement).toMatch(/0\.47 %.*about 212 more exist/);
  });

  it('give a single transit the period range its duration and the star’s density allow, and no orbit', () => {
    const derived = derivedParameters(
      { periodDays: null, depthPpm: 1_000, durationHours: 6, snr: 12 },
      { radiusRsun: 1, massMsun: 1, teffK: 5772 },
    );
    expect(derived.orbit).toBeNull();
    expect(derived.singleTransitPeriodRange!.periodMaxDays).toBeGreaterThan(
      derived.singleTransitPeriodRange!.periodMinDays,
    );
  });

  it('say what a probability implies in plain words', () => {
    expect(transitProbabilityStatement(0.1)).toBe(
      'The chance that such an orbit transits from our view is 10 %: for each such planet seen transiting, about 9 more exist around stars like this that do not transit from our view.',
    );
  });
});

describe('the V-shape diagnostic', () => {
  const transit = { periodDays: 3, depthPpm: 5_000, durationHours: 2.5, snr: 40 };
  const sunLike = { radiusRsun: 1, massMsun: 1, teffK: 5772 };
  const shape = {
    depthPpm: 5_000,
    totalDurationHours: 2.5,
    ingressHours: 1.1,
    flatShare: 0.12,
    chiSquare: 1_000,
    flatChiSquare: 1_050,
    pointsInTransit: 300,
  };
  const verdict = (fit: typeof shape | null | undefined) =>
    vettingDiagnostics({ ...transit, shape: fit }, sunLike).find((d) => d.code === 'shape');

  it('warns on a V that a flat bottom fits clearly worse, and passes one it does not', () => {
    expect(verdict(shape)).toMatchObject({ verdict: 'warn', value: 0.12 });
    expect(verdict(shape)!.detail).toMatch(/V-shaped.*Δχ² = 50/);
    // Δχ² of 5 is under the 3σ bar of 9: the data do not prefer the V enough to warn.
    expect(verdict({ ...shape, flatChiSquare: 1_005 })!.verdict).toBe('pass');
    expect(verdict({ ...shape, flatShare: 0.6, flatChiSquare: 1_000 })).toMatchObject({
      verdict: 'pass',
      value: 0.6,
    });
  });

  it('warns that it cannot tell when the fit could not be made, and is left out when not fitted', () => {
    expect(verdict(null)).toMatchObject({ verdict: 'warn', value: null });
    expect(verdict(undefined)).toBeUndefined();
  });
});
