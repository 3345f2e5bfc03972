// Planet and orbit parameters derived from a settled dip and the target's stellar parameters.
// Uncertainties are propagated to first order (linearised, inputs independent); each result gives its
// 1σ error, 0 when no input had one. Circular orbits and a planet mass negligible beside the star's.

import {
  ASTRONOMICAL_UNIT_M,
  EARTH_EQUATORIAL_RADIUS_M,
  GRAVITATIONAL_CONSTANT_M3_PER_KG_S2,
  HOURS_PER_DAY,
  JUPITER_EQUATORIAL_RADIUS_M,
  KG_PER_M3_PER_G_PER_CM3,
  PPM_PER_UNIT,
  SECONDS_PER_DAY,
  SOLAR_MASS_KG,
  SOLAR_MASS_PARAMETER_M3_PER_S2,
  SOLAR_RADIUS_M,
} from './constants';
import { checkLimbDarkening, totalDurationDays } from './transit-model';
import { ScienceInputError } from './types';

function requirePositive(name: string, value: number): void {
  if (!(value > 0 && Number.isFinite(value))) {
    throw new ScienceInputError(`${name} must be a finite number > 0, got ${value}`);
  }
}

function requireError(name: string, value: number | undefined): number {
  const err = value ?? 0;
  if (!(err >= 0 && Number.isFinite(err))) {
    throw new ScienceInputError(`${name} must be a finite number ≥ 0 (a 1σ uncertainty), got ${value}`);
  }
  return err;
}

// First-order relative error of a product of powers Π xᵢ^eᵢ: √Σ (eᵢ σᵢ/xᵢ)² (inputs independent).
function relativeError(...terms: [exponent: number, value: number, err: number][]): number {
  let sum = 0;
  for (const [exponent, value, err] of terms) sum += ((exponent * err) / value) ** 2;
  return Math.sqrt(sum);
}

/** Planet radius from a transit depth. */
export interface PlanetRadius {
  /** k = Rp/R★. */
  radiusRatio: number;
  radiusRatioErr: number;
  /** Rp in Earth equatorial radii. */
  radiusEarth: number;
  radiusEarthErr: number;
  /** Rp in Jupiter equatorial radii. */
  radiusJupiter: number;
  radiusJupiterErr: number;
}

/**
 * Planet radius from the transit depth and the stellar radius. Without limb darkening the depth is
 * δ = k²; with it, the small-planet limit δ = k² I(μ)/(4Ω) at the impact parameter is inverted.
 *
 * @param input.depthPpm - transit depth (ppm), > 0 and < 10⁶
 * @param input.depthErrPpm - its 1σ error (ppm), ≥ 0, optional
 * @param input.stellarRadiusRsun - R★ (R☉), > 0
 * @param input.stellarRadiusErrRsun - its 1σ error (R☉), ≥ 0, optional
 * @param input.limbDarkening - quadratic law u1, u2 and impact b in [0, 1), optional (none: δ = k²)
 * @returns k, Rp in R⊕ and R_J, each with its first-order error
 * @throws ScienceInputError naming the bad argument
 * @see Seager & Mallén-Ornelas 2003, ApJ 585, 1038, eq. 1 (δ = k²); Mandel & Agol 2002, ApJ 580, L171, §5
 */
export function planetRadiusFromDepth(input: {
  depthPpm: number;
  depthErrPpm?: number;
  stellarRadiusRsun: number;
  stellarRadiusErrRsun?: number;
  limbDarkening?: { u1: number; u2: number; impact: number };
}): PlanetRadius {
  requirePositive('depthPpm', input.depthPpm);
  if (input.depthPpm >= PPM_PER_UNIT)
    throw new ScienceInputError(`depthPpm must be < 1e6, got ${input.depthPpm}`);
  requirePositive('stellarRadiusRsun', input.stellarRadiusRsun);
  const depthErr = requireError('depthErrPpm', input.depthErrPpm);
  const radiusErr = requireError('stellarRadiusErrRsun', input.stellarRadiusErrRsun);
  let depthToAreaRatio = 1;
  if (input.limbDarkening) {
    const { u1, u2, impact } = input.limbDarkening;
    checkLimbDarkening(u1, u2);
    if (!(impact >= 0 && impact < 1)) {
      throw new ScienceInputError(`limbDarkening.impact must be in [0, 1), got ${impact}`);
    }
    depthToAreaRatio = smallPlanetDepthFactor(impact, u1, u2);
  }
  // δ = k² I(μ)/(4Ω) (M&A 2002 §5, small planet), so k = √(δ·4Ω/I(μ)); δ = k² without limb darkening.
  const radiusRatio = Math.sqrt(input.depthPpm / PPM_PER_UNIT / depthToAreaRatio);
  const radiusRatioErr = radiusRatio * relativeError([0.5, input.depthPpm, depthErr]);
  const rel = relativeError([0.5, input.depthPpm, depthErr], [1, input.stellarRadiusRsun, radiusErr]);
  const radiusM = radiusRatio * input.stellarRadiusRsun * SOLAR_RADIUS_M;
  return {
    radiusRatio,
    radiusRatioErr,
    radiusEarth: radiusM / EARTH_EQUATORIAL_RADIUS_M,
    radiusEarthErr: (rel * radiusM) / EARTH_EQUATORIAL_RADIUS_M,
    radiusJupiter: radiusM / JUPITER_EQUATORIAL_RADIUS_M,
    radiusJupiterErr: (rel * radiusM) / JUPITER_EQUATORIAL_RADIUS_M,
  };
}

/**
 * Small-planet depth per unit area ratio, δ/k² = I(μ)/(4Ω), for the quadratic law with I(1) = 1, at the
 * disk position r = b (μ = √(1 − b²)).
 *
 * @param impact - b in [0, 1)
 * @param u1 - linear coefficient
 * @param u2 - quadratic coefficient
 * @returns I(μ)/(4Ω), with 4Ω = 1 − u₁/3 − u₂/6 the disk-integrated intensity over π
 * @see Mandel & Agol 2002, ApJ 580, L171, §5 (small-planet approximation, eq. 8 with I*(z) ≈ I(z))
 */
export function smallPlanetDepthFactor(impact: number, u1: number, u2: number): number {
  const mu = Math.sqrt(1 - impact * impact);
  // Quadratic law: I(μ)/I(1) = 1 − u₁(1 − μ) − u₂(1 − μ)²; ∫ I dA / π = 1 − u₁/3 − u₂/6.
  return (1 - u1 * (1 - mu) - u2 * (1 - mu) ** 2) / (1 - u1 / 3 - u2 / 6);
}

/**
 * Semi-major axis of a circular orbit from Kepler's third law, a³ = G M★ P² / (4π²), planet mass neglected.
 *
 * @param input.periodDays - P (days), > 0; periodErrDays ≥ 0 optional
 * @param input.stellarMassMsun - M★ (M☉), > 0; stellarMassErrMsun ≥ 0 optional
 * @returns a (au) with its first-order error
 * @throws ScienceInputError naming the bad argument
 * @see Kepler's third law in Newton's form; Winn 2010, "Transits and Occultations", §2
 */
export function semiMajorAxisFromPeriod(input: {
  periodDays: number;
  periodErrDays?: number;
  stellarMassMsun: number;
  stellarMassErrMsun?: number;
}): { semiMajorAxisAu: number; semiMajorAxisErrAu: number } {
  requirePositive('periodDays', input.periodDays);
  requirePositive('stellarMassMsun', input.stellarMassMsun);
  const periodErr = requireError('periodErrDays', input.periodErrDays);
  const massErr = requireError('stellarMassErrMsun', input.stellarMassErrMsun);
  const periodS = input.periodDays * SECONDS_PER_DAY;
  // Kepler III: a = (GM★ P² / 4π²)^(1/3), with GM★ = M★/M☉ · GM☉ (IAU 2015 B3).
  const aM = Math.cbrt(
    (SOLAR_MASS_PARAMETER_M3_PER_S2 * input.stellarMassMsun * periodS * periodS) / (4 * Math.PI ** 2),
  );
  const semiMajorAxisAu = aM / ASTRONOMICAL_UNIT_M;
  const rel = relativeError([2 / 3, input.periodDays, periodErr], [1 / 3, input.stellarMassMsun, massErr]);
  return { semiMajorAxisAu, semiMajorAxisErrAu: rel * semiMajorAxisAu };
}

/**
 * Orbital period of a circular orbit from Kepler's third law, P = 2π √(a³ / (G M★)).
 *
 * @param input.semiMajorAxisAu - a (au), > 0
 * @param input.stellarMassMsun - M★ (M☉), > 0
 * @returns P (days)
 * @throws ScienceInputError naming the bad argument
 * @see Kepler's third law in Newton's form
 */
export function periodFromSemiMajorAxis(input: { semiMajorAxisAu: number; stellarMassMsun: number }): number {
  requirePositive('semiMajorAxisAu', input.semiMajorAxisAu);
  requirePositive('stellarMassMsun', input.stellarMassMsun);
  const aM = input.semiMajorAxisAu * ASTRONOMICAL_UNIT_M;
  // Kepler III: P = 2π √(a³ / GM★).
  return (
    (2 * Math.PI * Math.sqrt(aM ** 3 / (SOLAR_MASS_PARAMETER_M3_PER_S2 * input.stellarMassMsun))) /
    SECONDS_PER_DAY
  );
}

/**
 * Scaled semi-major axis a/R★.
 *
 * @param input.semiMajorAxisAu - a (au), > 0; semiMajorAxisErrAu ≥ 0 optional
 * @param input.stellarRadiusRsun - R★ (R☉), > 0; stellarRadiusErrRsun ≥ 0 optional
 * @returns a/R★ with its first-order error
 * @throws ScienceInputError naming the bad argument
 */
export function scaledSemiMajorAxis(input: {
  semiMajorAxisAu: number;
  semiMajorAxisErrAu?: number;
  stellarRadiusRsun: number;
  stellarRadiusErrRsun?: number;
}): { aOverRstar: number; aOverRstarErr: number } {
  requirePositive('semiMajorAxisAu', input.semiMajorAxisAu);
  requirePositive('stellarRadiusRsun', input.stellarRadiusRsun);
  const aErr = requireError('semiMajorAxisErrAu', input.semiMajorAxisErrAu);
  const rErr = requireError('stellarRadiusErrRsun', input.stellarRadiusErrRsun);
  const aOverRstar =
    (input.semiMajorAxisAu * ASTRONOMICAL_UNIT_M) / (input.stellarRadiusRsun * SOLAR_RADIUS_M);
  const rel = relativeError([1, input.semiMajorAxisAu, aErr], [-1, input.stellarRadiusRsun, rErr]);
  return { aOverRstar, aOverRstarErr: rel * aOverRstar };
}

/**
 * Geometric transit probability of a circular orbit, (R★ + Rp)/a: the fraction of random orientations
 * for which any part of the planet crosses the disk.
 *
 * @param input.stellarRadiusRsun - R★ (R☉), > 0; stellarRadiusErrRsun ≥ 0 optional
 * @param input.planetRadiusEarth - Rp (R⊕), ≥ 0 (0 gives R★/a); planetRadiusErrEarth ≥ 0 optional
 * @param input.semiMajorAxisAu - a (au), > 0; semiMajorAxisErrAu ≥ 0 optional
 * @returns the probability (a fraction, not %) with its first-order error
 * @throws ScienceInputError naming the bad argument, or when R★ + Rp ≥ a
 * @see Winn 2010, "Transits and Occultations", eq. 9 (e = 0)
 */
export function transitProbability(input: {
  stellarRadiusRsun: number;
  stellarRadiusErrRsun?: number;
  planetRadiusEarth: number;
  planetRadiusErrEarth?: number;
  semiMajorAxisAu: number;
  semiMajorAxisErrAu?: number;
}): { probability: number; probabilityErr: number } {
  requirePositive('stellarRadiusRsun', input.stellarRadiusRsun);
  requirePositive('semiMajorAxisAu', input.semiMajorAxisAu);
  if (!(input.planetRadiusEarth >= 0 && Number.isFinite(input.planetRadiusEarth))) {
    throw new ScienceInputError(
      `planetRadiusEarth must be a finite number ≥ 0, got ${input.planetRadiusEarth}`,
    );
  }
  const rStarErr = requireError('stellarRadiusErrRsun', input.stellarRadiusErrRsun);
  const rPlanetErr = requireError('planetRadiusErrEarth', input.planetRadiusErrEarth);
  const aErr = requireError('semiMajorAxisErrAu', input.semiMajorAxisErrAu);
  const rStarM = input.stellarRadiusRsun * SOLAR_RADIUS_M;
  const rPlanetM = input.planetRadiusEarth * EARTH_EQUATORIAL_RADIUS_M;
  const aM = input.semiMajorAxisAu * ASTRONOMICAL_UNIT_M;
  if (rStarM + rPlanetM >= aM) {
    throw new ScienceInputError(
      `semiMajorAxisAu must exceed R★ + Rp (${((rStarM + rPlanetM) / ASTRONOMICAL_UNIT_M).toPrecision(4)} au), got ${input.semiMajorAxisAu}`,
    );
  }
  // Winn 2010 eq. 9 (e = 0): p_tra = (R★ + Rp)/a.
  const probability = (rStarM + rPlanetM) / aM;
  const sumErrM = Math.hypot(rStarErr * SOLAR_RADIUS_M, rPlanetErr * EARTH_EQUATORIAL_RADIUS_M);
  const rel = Math.hypot(sumErrM / (rStarM + rPlanetM), aErr / input.semiMajorAxisAu);
  return { probability, probabilityErr: rel * probability };
}

/**
 * Geometric transit probability from the transit observables, (1 + k)/(a/R★).
 *
 * @param input.radiusRatio - k (> 0); input.aOverRstar - a/R★ (> 1)
 * @returns the probability (a fraction)
 * @throws ScienceInputError naming the bad argument
 * @see Winn 2010, "Transits and Occultations", eq. 9 (e = 0)
 */
export function transitProbabilityFromScaled(input: { radiusRatio: number; aOverRstar: number }): number {
  requirePositive('radiusRatio', input.radiusRatio);
  if (!(input.aOverRstar > 1 + input.radiusRatio)) {
    throw new ScienceInputError(`aOverRstar must exceed 1 + radiusRatio, got ${input.aOverRstar}`);
  }
  // Winn 2010 eq. 9 (e = 0), divided through by R★.
  return (1 + input.radiusRatio) / input.aOverRstar;
}

/**
 * Impact parameter of a circular orbit, b = (a/R★) cos i.
 *
 * @param input.aOverRstar - a/R★, > 1
 * @param input.inclinationDeg - orbital inclination (degrees), in [0, 180]
 * @returns b (stellar radii)
 * @throws ScienceInputError naming the bad argument
 * @see Winn 2010, "Transits and Occultations", eq. 7 (e = 0)
 */
export function impactFromInclination(input: { aOverRstar: number; inclinationDeg: number }): number {
  if (!(input.aOverRstar > 1 && Number.isFinite(input.aOverRstar))) {
    throw new ScienceInputError(`aOverRstar must be a finite number > 1, got ${input.aOverRstar}`);
  }
  if (!(input.inclinationDeg >= 0 && input.inclinationDeg <= 180)) {
    throw new ScienceInputError(`inclinationDeg must be in [0, 180], got ${input.inclinationDeg}`);
  }
  // Winn 2010 eq. 7 with e = 0: b = (a/R★) cos i.
  return Math.abs(input.aOverRstar * Math.cos((input.inclinationDeg * Math.PI) / 180));
}

/**
 * Mean stellar density from the transit's a/R★ and period, ρ★ = 3π (a/R★)³ / (G P²) (planet mass
 * neglected).
 *
 * @param input.aOverRstar - a/R★, > 1; aOverRstarErr ≥ 0 optional
 * @param input.periodDays - P (days), > 0; periodErrDays ≥ 0 optional
 * @returns ρ★ (g cm⁻³) with its first-order error
 * @throws ScienceInputError naming the bad argument
 * @see Winn 2010, "Transits and Occultations", eq. 30 with Mp ≪ M★ (equation number from memory); Seager & Mallén-Ornelas 2003, ApJ 585, 1038
 */
export function stellarDensityFromTransit(input: {
  aOverRstar: number;
  aOverRstarErr?: number;
  periodDays: number;
  periodErrDays?: number;
}): { stellarDensityGcm3: number; stellarDensityErrGcm3: number } {
  if (!(input.aOverRstar > 1 && Number.isFinite(input.aOverRstar))) {
    throw new ScienceInputError(`aOverRstar must be a finite number > 1, got ${input.aOverRstar}`);
  }
  requirePositive('periodDays', input.periodDays);
  const aErr = requireError('aOverRstarErr', input.aOverRstarErr);
  const pErr = requireError('periodErrDays', input.periodErrDays);
  const periodS = input.periodDays * SECONDS_PER_DAY;
  // ρ★ = 3π (a/R★)³ / (G P²) (Winn 2010 eq. 30, Mp ≪ M★).
  const densityKgM3 =
    (3 * Math.PI * input.aOverRstar ** 3) / (GRAVITATIONAL_CONSTANT_M3_PER_KG_S2 * periodS * periodS);
  const stellarDensityGcm3 = densityKgM3 / KG_PER_M3_PER_G_PER_CM3;
  const rel = relativeError([3, input.aOverRstar, aErr], [-2, input.periodDays, pErr]);
  return { stellarDensityGcm3, stellarDensityErrGcm3: rel * stellarDensityGcm3 };
}

/**
 * Mean stellar density from mass and radius, ρ★ = M★ / (4/3 π R★³).
 *
 * @param input.stellarMassMsun - M★ (M☉), > 0
 * @param input.stellarRadiusRsun - R★ (R☉), > 0
 * @returns ρ★ (g cm⁻³)
 * @throws ScienceInputError naming the bad argument
 */
export function stellarDensityFromMassRadius(input: {
  stellarMassMsun: number;
  stellarRadiusRsun: number;
}): number {
  requirePositive('stellarMassMsun', input.stellarMassMsun);
  requirePositive('stellarRadiusRsun', input.stellarRadiusRsun);
  const radiusM = input.stellarRadiusRsun * SOLAR_RADIUS_M;
  // ρ = M / (4/3 π R³), M☉ = GM☉/G (IAU 2015 B3, CODATA 2018 G).
  return (
    (input.stellarMassMsun * SOLAR_MASS_KG) / ((4 / 3) * Math.PI * radiusM ** 3) / KG_PER_M3_PER_G_PER_CM3
  );
}

/**
 * a/R★ implied by a stellar density and a period (Kepler's third law), (G ρ★ P² / (3π))^(1/3).
 *
 * @param input.stellarDensityGcm3 - ρ★ (g cm⁻³), > 0
 * @param input.periodDays - P (days), > 0
 * @returns a/R★
 * @throws ScienceInputError naming the bad argument
 * @see Winn 2010, "Transits and Occultations", eq. 30 solved for a/R★
 */
export function aOverRstarFromDensity(input: { stellarDensityGcm3: number; periodDays: number }): number {
  requirePositive('stellarDensityGcm3', input.stellarDensityGcm3);
  requirePositive('periodDays', input.periodDays);
  const periodS = input.periodDays * SECONDS_PER_DAY;
  const densityKgM3 = input.stellarDensityGcm3 * KG_PER_M3_PER_G_PER_CM3;
  // (a/R★)³ = G ρ★ P² / (3π) (Winn 2010 eq. 30, Mp ≪ M★).
  return Math.cbrt((GRAVITATIONAL_CONSTANT_M3_PER_KG_S2 * densityKgM3 * periodS * periodS) / (3 * Math.PI));
}

/**
 * Expected transit duration T₁₄ for a period, a stellar density, a radius ratio and an impact parameter.
 * With impact 0 this is the central (longest) duration.
 *
 * @param input.periodDays - P (days), > 0
 * @param input.stellarDensityGcm3 - ρ★ (g cm⁻³), > 0
 * @param input.radiusRatio - k, > 0
 * @param input.impact - b, ≥ 0 (default 0: a central transit)
 * @returns T₁₄ (hours); 0 when b ≥ 1 + k
 * @throws ScienceInputError naming the bad argument
 * @see Winn 2010, "Transits and Occultations", eq. 14, with a/R★ from eq. 30
 */
export function expectedDurationHours(input: {
  periodDays: number;
  stellarDensityGcm3: number;
  radiusRatio: number;
  impact?: number;
}): number {
  const aOverRstar = aOverRstarFromDensity(input);
  const impact = input.impact ?? 0;
  if (impact >= aOverRstar) {
    throw new ScienceInputError(`impact must be below a/R★ (${aOverRstar.toPrecision(4)}), got ${impact}`);
  }
  return (
    totalDurationDays({ periodDays: input.periodDays, radiusRatio: input.radiusRatio, aOverRstar, impact }) *
    HOURS_PER_DAY
  );
}

/**
 * Equilibrium temperature of a planet in radiative balance with its star:
 * T_eq = T★ √(R★/a) [f (1 − A_B)]^(1/4). Assumptions: a blackbody planet (emissivity 1) on a circular
 * orbit, Bond albedo A_B, and a redistribution factor f: 1/4 when the absorbed energy is spread over the
 * whole sphere, 1/2 when re-radiated by the day side only, 2/3 for instant re-radiation (no
 * redistribution, the hottest dayside); no internal heat.
 *
 * @param input.stellarTeffK - T★ (K), > 0; stellarTeffErrK ≥ 0 optional
 * @param input.stellarRadiusRsun - R★ (R☉), > 0; stellarRadiusErrRsun ≥ 0 optional
 * @param input.semiMajorAxisAu - a (au), > 0; semiMajorAxisErrAu ≥ 0 optional
 * @param input.bondAlbedo - A_B in [0, 1) (default 0)
 * @param input.redistribution - f in (0, 2/3] (default 1/4, full redistribution)
 * @returns T_eq (K) with its first-order error
 * @throws ScienceInputError naming the bad argument
 * @see Cowan & Agol 2011, ApJ 729, 54, eq. 4 (f = 2/3 − 5ε/12 between no and full redistribution; from memory)
 */
export function equilibriumTemperature(input: {
  stellarTeffK: number;
  stellarTeffErrK?: number;
  stellarRadiusRsun: number;
  stellarRadiusErrRsun?: number;
  semiMajorAxisAu: number;
  semiMajorAxisErrAu?: number;
  bondAlbedo?: number;
  redistribution?: number;
}): { temperatureK: number; temperatureErrK: number } {
  requirePositive('stellarTeffK', input.stellarTeffK);
  requirePositive('stellarRadiusRsun', input.stellarRadiusRsun);
  requirePositive('semiMajorAxisAu', input.semiMajorAxisAu);
  const bondAlbedo = input.bondAlbedo ?? 0;
  const redistribution = input.redistribution ?? 0.25;
  if (!(bondAlbedo >= 0 && bondAlbedo < 1)) {
    throw new ScienceInputError(`bondAlbedo must be in [0, 1), got ${input.bondAlbedo}`);
  }
  if (!(redistribution > 0 && redistribution <= 2 / 3)) {
    throw new ScienceInputError(
      `redistribution must be in (0, 2/3] (1/4 full, 2/3 none), got ${input.redistribution}`,
    );
  }
  const teffErr = requireError('stellarTeffErrK', input.stellarTeffErrK);
  const rErr = requireError('stellarRadiusErrRsun', input.stellarRadiusErrRsun);
  const aErr = requireError('semiMajorAxisErrAu', input.semiMajorAxisErrAu);
  const ratio = (input.stellarRadiusRsun * SOLAR_RADIUS_M) / (input.semiMajorAxisAu * ASTRONOMICAL_UNIT_M);
  // Energy balance: (1 − A_B) L★ Rp²/(4a²) absorbed = σT_eq⁴ πRp²/f emitted, L★ = 4πR★²σT★⁴
  // ⇒ T_eq = T★ √(R★/a) [f (1 − A_B)]^(1/4).
  const temperatureK = input.stellarTeffK * Math.sqrt(ratio) * (redistribution * (1 - bondAlbedo)) ** 0.25;
  const rel = relativeError(
    [1, input.stellarTeffK, teffErr],
    [0.5, input.stellarRadiusRsun, rErr],
    [-0.5, input.semiMajorAxisAu, aErr],
  );
  return { temperatureK, temperatureErrK: rel * temperatureK };
}

/** Range of periods consistent with one transit's duration. */
export interface SingleTransitPeriodRange {
  /** Shortest period (days): a central transit (b = impactMin) around the least dense star allowed. */
  periodMinDays: number;
  /** Longest period (days): the most grazing chord allowed (b = impactMax) around the densest star. */
  periodMaxDays: number;
  /** The impact range assumed. */
  impactMin: number;
  impactMax: number;
}

/**
 * Period range of a single transit from its duration and the stellar density, for a circular orbit, over
 * impact parameters in [impactMin, impactMax] (and, when given, ρ★ ± 1σ). Solves
 * T₁₄(P; a/R★(ρ★, P), k, b) = duration for P. A shorter chord (larger b) needs a slower planet for the
 * same duration, so b = impactMin gives the shortest period and b = impactMax the longest; in the
 * small-angle limit P = π² G ρ★ T³ / (3 [(1 + k)² − b²]^(3/2)), so a denser star also means a longer period.
 *
 * @param input.durationHours - observed T₁₄ (hours), > 0
 * @param input.stellarDensityGcm3 - ρ★ (g cm⁻³), > 0; stellarDensityErrGcm3 ≥ 0 optional (must be < ρ★)
 * @param input.radiusRatio - k, in (0, 1)
 * @param input.impactMin - default 0; input.impactMax - default 0.9; 0 ≤ min ≤ max < 1 + k
 * @returns the period range (days) and the impact range used
 * @throws ScienceInputError naming the bad argument, or when no period below 10⁵ days gives the duration
 * @see Seager & Mallén-Ornelas 2003, ApJ 585, 1038, eq. 3; Winn 2010, "Transits and Occultations", eq. 14 and 30
 */
export function singleTransitPeriodRange(input: {
  durationHours: number;
  stellarDensityGcm3: number;
  stellarDensityErrGcm3?: number;
  radiusRatio: number;
  impactMin?: number;
  impactMax?: number;
}): SingleTransitPeriodRange {
  requirePositive('durationHours', input.durationHours);
  requirePositive('stellarDensityGcm3', input.stellarDensityGcm3);
  if (!(input.radiusRatio > 0 && input.radiusRatio < 1)) {
    throw new ScienceInputError(`radiusRatio must be in (0, 1), got ${input.radiusRatio}`);
  }
  const densityErr = requireError('stellarDensityErrGcm3', input.stellarDensityErrGcm3);
  if (densityErr >= input.stellarDensityGcm3) {
    throw new ScienceInputError(
      `stellarDensityErrGcm3 must be below stellarDensityGcm3 (${input.stellarDensityGcm3}), got ${densityErr}`,
    );
  }
  const impactMin = input.impactMin ?? 0;
  const impactMax = input.impactMax ?? 0.9;
  if (!(impactMin >= 0 && impactMin <= impactMax && impactMax < 1 + input.radiusRatio)) {
    throw new ScienceInputError(
      `impactMin and impactMax must satisfy 0 ≤ impactMin ≤ impactMax < 1 + radiusRatio, got ${impactMin} and ${impactMax}`,
    );
  }
  const durationDays = input.durationHours / HOURS_PER_DAY;
  const solve = (density: number, impact: number): number => {
    const durationAt = (periodDays: number): number => {
      const aOverRstar = aOverRstarFromDensity({ stellarDensityGcm3: density, periodDays });
      // No orbit outside the star (a/R★ ≤ 1 or b ≥ a/R★): treat as no transit, keeping T₁₄(P) monotonic.
      if (aOverRstar <= 1 || impact >= aOverRstar) return 0;
      return totalDurationDays({ periodDays, radiusRatio: input.radiusRatio, aOverRstar, impact });
    };
    // T₁₄ grows monotonically with P (≈ P^(1/3)); bisect in log P.
    let lo = Math.log(1e-3);
    let hi = Math.log(1e5);
    if (durationAt(Math.exp(hi)) < durationDays) {
      throw new ScienceInputError(
        `durationHours ${input.durationHours} is too long for a circular orbit below 1e5 days around a star of ${density} g cm⁻³`,
      );
    }
    for (let step = 0; step < 200 && hi - lo > 1e-12; step += 1) {
      const mid = 0.5 * (lo + hi);
      if (durationAt(Math.exp(mid)) < durationDays) lo = mid;
      else hi = mid;
    }
    return Math.exp(0.5 * (lo + hi));
  };
  return {
    periodMinDays: solve(input.stellarDensityGcm3 - densityErr, impactMin),
    periodMaxDays: solve(input.stellarDensityGcm3 + densityErr, impactMax),
    impactMin,
    impactMax,
  };
}
