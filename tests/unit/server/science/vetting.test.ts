import { describe, expect, it } from 'vitest';
import { generateSurvey } from '../../../../server/science/synthetic-survey';
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
        },
        star(target),
      );
      const warned = diagnostics.filter((d) => d.verdict === 'warn').map((d) => d.code);
      expect(warned, `${target.designation}: ${JSON.stringify(diagnostics)}`).toEqual([]);
    }
  });

  it('warn on its eclipsing binaries (their secondary eclipse, and mostly their size)', () => {
    const binaries = survey.targets.filter((target) => target.truth.binary);
    expect(binaries.length).toBeGreaterThan(0);
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
        },
        star(target),
      );
      const warned = diagnostics.filter((d) => d.verdict === 'warn').map((d) => d.code);
      expect(warned.length, `${target.designation}: ${JSON.stringify(diagnostics)}`).toBeGreaterThan(0);
    }
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
