import { describe, expect, it } from 'vitest';
import {
  EARTH_EQUATORIAL_RADIUS_M,
  SOLAR_EFFECTIVE_TEMPERATURE_K,
  SOLAR_RADIUS_M,
} from '../../../../server/science/constants';
import {
  aOverRstarFromDensity,
  equilibriumTemperature,
  expectedDurationHours,
  impactFromInclination,
  periodFromSemiMajorAxis,
  planetRadiusFromDepth,
  scaledSemiMajorAxis,
  semiMajorAxisFromPeriod,
  singleTransitPeriodRange,
  smallPlanetDepthFactor,
  stellarDensityFromMassRadius,
  stellarDensityFromTransit,
  transitProbability,
  transitProbabilityFromScaled,
} from '../../../../server/science/derived-parameters';
import { createRandom } from '../../../../server/science/random';
import {
  fullDurationDays,
  occultedFluxQuadratic,
  totalDurationDays,
} from '../../../../server/science/transit-model';
import { ScienceInputError } from '../../../../server/science/types';
// The table recomputed at full precision by tests/reference/make_model_reference.py with
// astropy 5.2.1 astropy.constants (IAU 2015 nominal values).
import reference from '../../../fixtures/model/astropy-reference.json';

const astropy = reference.derived;
const earthRadiusRsun = EARTH_EQUATORIAL_RADIUS_M / SOLAR_RADIUS_M;

/** |actual − expected| within half a unit of the last digit the table quotes. */
function expectToQuotedDigits(actual: number, quoted: number, decimals: number): void {
  expect(Math.abs(actual - quoted)).toBeLessThanOrEqual(0.5 * 10 ** -decimals + 1e-12);
}

describe('the issue 4 table (astropy 5.2.1 astropy.constants, IAU 2015 nominal values)', () => {
  it('Earth–Sun geometric transit probability (R☉ + R⊕)/1 au is 0.4693%, and R☉/au alone 0.4650%', () => {
    const { probability } = transitProbability({
      stellarRadiusRsun: 1,
      planetRadiusEarth: 1,
      semiMajorAxisAu: 1,
    });
    expectToQuotedDigits(probability * 100, 0.4693, 4); // issue table, computed with astropy.constants
    expect(probability).toBeCloseTo(astropy.earthSunTransitProbability, 15);
    const starOnly = transitProbability({ stellarRadiusRsun: 1, planetRadiusEarth: 0, semiMajorAxisAu: 1 });
    expectToQuotedDigits(starOnly.probability * 100, 0.465, 4); // issue table
    expectToQuotedDigits(probability * 100, 0.47, 2); // the rule of thumb "0.47%" (common practice)
  });

  it('Earth–Sun depth (R⊕/R☉)² is 84.05 ppm, and inverts back to one Earth radius', () => {
    expectToQuotedDigits(earthRadiusRsun ** 2 * 1e6, 84.05, 2); // issue table
    expect(earthRadiusRsun ** 2 * 1e6).toBeCloseTo(astropy.earthSunDepthPpm, 10);
    const radius = planetRadiusFromDepth({ depthPpm: astropy.earthSunDepthPpm, stellarRadiusRsun: 1 });
    expect(radius.radiusEarth).toBeCloseTo(1, 12);
  });

  it('Earth central transit (b = 0, P = 365.2564 d) lasts T14 = 13.10 h and T23 = 12.86 h', () => {
    const { semiMajorAxisAu } = semiMajorAxisFromPeriod({ periodDays: 365.2564, stellarMassMsun: 1 });
    expect(semiMajorAxisAu).toBeCloseTo(astropy.earthSemiMajorAxisAu, 12);
    const { aOverRstar } = scaledSemiMajorAxis({ semiMajorAxisAu, stellarRadiusRsun: 1 });
    const geometry = { periodDays: 365.2564, radiusRatio: earthRadiusRsun, aOverRstar, impact: 0 };
    expectToQuotedDigits(totalDurationDays(geometry) * 24, 13.1, 2); // issue table
    expectToQuotedDigits(fullDurationDays(geometry) * 24, 12.86, 2); // issue table
    expect(totalDurationDays(geometry) * 24).toBeCloseTo(astropy.earthT14Hours, 9);
    expect(fullDurationDays(geometry) * 24).toBeCloseTo(astropy.earthT23Hours, 9);
  });

  it('Jupiter–Sun depth (R_J/R☉)² is 1.056%', () => {
    const radius = planetRadiusFromDepth({ depthPpm: astropy.jupiterSunDepth * 1e6, stellarRadiusRsun: 1 });
    expect(radius.radiusJupiter).toBeCloseTo(1, 12);
    expectToQuotedDigits(radius.radiusRatio ** 2 * 100, 1.056, 3); // issue table
  });

  it("Mercury's P = 87.9691 d around one solar mass gives a = 0.3871 au", () => {
    const { semiMajorAxisAu } = semiMajorAxisFromPeriod({ periodDays: 87.9691, stellarMassMsun: 1 });
    expectToQuotedDigits(semiMajorAxisAu, 0.3871, 4); // issue table
    expect(semiMajorAxisAu).toBeCloseTo(astropy.mercurySemiMajorAxisAu, 12);
  });

  it('red dwarf (0.35 R☉, 0.35 M☉) habitable zone at 0.1 au: R★/a = 1.628%, P = 19.52 d', () => {
    // a = 0.1 au from L = 0.01 L☉ by a_HZ ∝ √L (common practice rule of thumb), as the issue states.
    const { aOverRstar } = scaledSemiMajorAxis({ semiMajorAxisAu: 0.1, stellarRadiusRsun: 0.35 });
    expectToQuotedDigits(100 / aOverRstar, 1.628, 3); // issue table
    expectToQuotedDigits(100 / aOverRstar, 1.6, 1); // the rule of thumb "1.6%" (common practice)
    const periodDays = periodFromSemiMajorAxis({ semiMajorAxisAu: 0.1, stellarMassMsun: 0.35 });
    expectToQuotedDigits(periodDays, 19.52, 2); // issue table
    expect(periodDays).toBeCloseTo(astropy.redDwarfPeriodDays, 10);
  });

  describe('HD 209458 b (Torres, Winn & Holman 2008, ApJ 677, 1324; inputs from memory, self-consistent)', () => {
    const periodDays = 3.52474859;
    const radiusRatio = 0.12086;
    const aOverRstar = 8.76;
    const inclinationDeg = 86.71;

    it('b = 0.503 and T14 = 3.091 h', () => {
      const impact = impactFromInclination({ aOverRstar, inclinationDeg });
      expectToQuotedDigits(impact, 0.503, 3); // issue table
      expect(impact).toBeCloseTo(astropy.hd209458Impact, 12);
      const hours = totalDurationDays({ periodDays, radiusRatio, aOverRstar, impact }) * 24;
      expectToQuotedDigits(hours, 3.091, 3); // issue table
      expect(hours).toBeCloseTo(astropy.hd209458T14Hours, 10);
    });

    it('ρ★ = 1.024 g cm⁻³ from a/R★ and P, agreeing with M★ = 1.119 M☉ and R★ = 1.155 R☉', () => {
      const { stellarDensityGcm3 } = stellarDensityFromTransit({ aOverRstar, periodDays });
      expectToQuotedDigits(stellarDensityGcm3, 1.024, 3); // issue table
      expect(stellarDensityGcm3).toBeCloseTo(astropy.hd209458DensityGcm3, 12);
      const fromMassRadius = stellarDensityFromMassRadius({
        stellarMassMsun: 1.119,
        stellarRadiusRsun: 1.155,
      });
      expectToQuotedDigits(fromMassRadius, 1.024, 3); // issue table: the inputs are self-consistent
    });

    it('Rp = 1.358 R_J and a geometric transit probability of 12.80%', () => {
      const radius = planetRadiusFromDepth({ depthPpm: radiusRatio ** 2 * 1e6, stellarRadiusRsun: 1.155 });
      expectToQuotedDigits(radius.radiusJupiter, 1.358, 3); // issue table
      expect(radius.radiusJupiter).toBeCloseTo(astropy.hd209458RadiusJupiter, 12);
      const probability = transitProbabilityFromScaled({ radiusRatio, aOverRstar });
      expectToQuotedDigits(probability * 100, 12.8, 2); // issue table
    });
  });
});

describe('derived parameters', () => {
  it('invert the small-planet limb-darkened depth back to the radius ratio (Mandel & Agol 2002 §5)', () => {
    const u1 = 0.4;
    const u2 = 0.26;
    const k = 0.02;
    for (const impact of [0, 0.5, 0.8]) {
      const depthPpm = (1 - occultedFluxQuadratic(impact, k, u1, u2)) * 1e6;
      const plain = planetRadiusFromDepth({ depthPpm, stellarRadiusRsun: 1 });
      const corrected = planetRadiusFromDepth({
        depthPpm,
        stellarRadiusRsun: 1,
        limbDarkening: { u1, u2, impact },
      });
      expect(Math.abs(corrected.radiusRatio / k - 1)).toBeLessThan(1e-3);
      expect(plain.radiusRatio / k).toBeCloseTo(Math.sqrt(smallPlanetDepthFactor(impact, u1, u2)), 3);
    }
  });

  it('propagate errors to first order: Rp from a 10% depth error and a 5% radius error is √(5² + 5²)% uncertain', () => {
    const radius = planetRadiusFromDepth({
      depthPpm: 1000,
      depthErrPpm: 100,
      stellarRadiusRsun: 1,
      stellarRadiusErrRsun: 0.05,
    });
    expect(radius.radiusEarthErr / radius.radiusEarth).toBeCloseTo(Math.hypot(0.05, 0.05), 12);
    const { semiMajorAxisAu, semiMajorAxisErrAu } = semiMajorAxisFromPeriod({
      periodDays: 10,
      stellarMassMsun: 1,
      stellarMassErrMsun: 0.03,
    });
    expect(semiMajorAxisErrAu / semiMajorAxisAu).toBeCloseTo(0.01, 12);
    expect(semiMajorAxisFromPeriod({ periodDays: 10, stellarMassMsun: 1 }).semiMajorAxisErrAu).toBe(0);
  });

  it('propagate errors that agree with a Monte Carlo of the same inputs (seeded), for the stellar density', () => {
    const rng = createRandom('density-monte-carlo');
    const input = { aOverRstar: 10, aOverRstarErr: 0.1, periodDays: 4, periodErrDays: 0.001 };
    const { stellarDensityGcm3, stellarDensityErrGcm3 } = stellarDensityFromTransit(input);
    const draws: number[] = [];
    for (let i = 0; i < 20_000; i += 1) {
      draws.push(
        stellarDensityFromTransit({
          aOverRstar: rng.normal(input.aOverRstar, input.aOverRstarErr),
          periodDays: rng.normal(input.periodDays, input.periodErrDays),
        }).stellarDensityGcm3,
      );
    }
    const mean = draws.reduce((sum, x) => sum + x, 0) / draws.length;
    const sd = Math.sqrt(draws.reduce((sum, x) => sum + (x - mean) ** 2, 0) / (draws.length - 1));
    expect(Math.abs(mean / stellarDensityGcm3 - 1)).toBeLessThan(0.002);
    expect(Math.abs(sd / stellarDensityErrGcm3 - 1)).toBeLessThan(0.03);
  });

  it('give a/R★ from the density and period consistent with Kepler (round trip through ρ★)', () => {
    const aOverRstar = aOverRstarFromDensity({ stellarDensityGcm3: 1.41, periodDays: 12 });
    expect(stellarDensityFromTransit({ aOverRstar, periodDays: 12 }).stellarDensityGcm3).toBeCloseTo(
      1.41,
      12,
    );
  });

  it('give the expected central duration of an Earth around the Sun as 13.1 h (issue table)', () => {
    const density = stellarDensityFromMassRadius({ stellarMassMsun: 1, stellarRadiusRsun: 1 });
    const hours = expectedDurationHours({
      periodDays: 365.2564,
      stellarDensityGcm3: density,
      radiusRatio: earthRadiusRsun,
    });
    expectToQuotedDigits(hours, 13.1, 2);
  });

  it('give the Earth an equilibrium temperature of 255 K for albedo 0.3 and full redistribution (textbook value, from memory)', () => {
    const { temperatureK } = equilibriumTemperature({
      stellarTeffK: SOLAR_EFFECTIVE_TEMPERATURE_K,
      stellarRadiusRsun: 1,
      semiMajorAxisAu: 1,
      bondAlbedo: 0.3,
    });
    expect(temperatureK).toBeGreaterThan(254);
    expect(temperatureK).toBeLessThan(256);
    const dayside = equilibriumTemperature({
      stellarTeffK: SOLAR_EFFECTIVE_TEMPERATURE_K,
      stellarRadiusRsun: 1,
      semiMajorAxisAu: 1,
      bondAlbedo: 0.3,
      redistribution: 2 / 3,
    });
    // T scales as f^(1/4): (2/3 ÷ 1/4)^(1/4).
    expect(dayside.temperatureK / temperatureK).toBeCloseTo((8 / 3) ** 0.25, 12);
  });

  it('bracket a single transit period between b = 0 (shortest) and b = 0.9 (longest), containing the true period', () => {
    const density = 1.41;
    const radiusRatio = 0.05;
    for (const [periodDays, impact] of [
      [40, 0],
      [40, 0.5],
      [40, 0.9],
      [120, 0.3],
    ] as const) {
      const durationHours = expectedDurationHours({
        periodDays,
        stellarDensityGcm3: density,
        radiusRatio,
        impact,
      });
      const range = singleTransitPeriodRange({ durationHours, stellarDensityGcm3: density, radiusRatio });
      expect(range.periodMinDays).toBeLessThanOrEqual(periodDays * (1 + 1e-9));
      expect(range.periodMaxDays).toBeGreaterThanOrEqual(periodDays * (1 - 1e-9));
      if (impact === 0) expect(range.periodMinDays).toBeCloseTo(periodDays, 6);
      if (impact === 0.9) expect(range.periodMaxDays).toBeCloseTo(periodDays, 6);
    }
    const widened = singleTransitPeriodRange({
      durationHours: 8,
      stellarDensityGcm3: density,
      stellarDensityErrGcm3: 0.2,
      radiusRatio,
    });
    const narrow = singleTransitPeriodRange({ durationHours: 8, stellarDensityGcm3: density, radiusRatio });
    expect(widened.periodMinDays).toBeLessThan(narrow.periodMinDays);
    expect(widened.periodMaxDays).toBeGreaterThan(narrow.periodMaxDays);
  });

  it('name the bad argument and what was allowed', () => {
    expect(() => planetRadiusFromDepth({ depthPpm: -5, stellarRadiusRsun: 1 })).toThrow(
      /depthPpm must be a finite number > 0, got -5/,
    );
    expect(() =>
      semiMajorAxisFromPeriod({ periodDays: 3, stellarMassMsun: 1, stellarMassErrMsun: -1 }),
    ).toThrow(/stellarMassErrMsun must be a finite number ≥ 0/);
    expect(() =>
      transitProbability({ stellarRadiusRsun: 300, planetRadiusEarth: 1, semiMajorAxisAu: 1 }),
    ).toThrow(/semiMajorAxisAu must exceed R★ \+ Rp/);
    expect(() => impactFromInclination({ aOverRstar: 10, inclinationDeg: 200 })).toThrow(
      /inclinationDeg must be in \[0, 180\]/,
    );
    expect(() =>
      equilibriumTemperature({ stellarTeffK: 5000, stellarRadiusRsun: 1, semiMajorAxisAu: 1, bondAlbedo: 1 }),
    ).toThrow(/bondAlbedo must be in \[0, 1\)/);
    expect(() =>
      singleTransitPeriodRange({ durationHours: 5, stellarDensityGcm3: 1, radiusRatio: 0.1, impactMax: 1.5 }),
    ).toThrow(ScienceInputError);
  });
});
