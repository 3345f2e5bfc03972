// The transit light curve of a dark planet in front of a limb-darkened star on a circular orbit: the
// analytic Mandel & Agol (2002) occultation for the uniform and quadratic laws, complete elliptic
// integrals by Bulirsch's general `cel`, exposure supersampling (Kipping 2010) and the contact-point
// durations (Seager & Mallén-Ornelas 2003; Winn 2010).

import { ScienceInputError } from './types';

// --- Complete elliptic integrals ------------------------------------------------------------------

// Bulirsch's iteration converges quadratically; stopping when the step is below CA gives ~CA² accuracy.
const CEL_TOLERANCE = 1e-8;
const CEL_MAX_STEPS = 60;

/**
 * Bulirsch's general complete elliptic integral
 * cel(kc, p, a, b) = ∫₀^{π/2} (a cos²θ + b sin²θ) / ((cos²θ + p sin²θ) √(cos²θ + kc² sin²θ)) dθ.
 *
 * @param kc - complementary modulus √(1 − k²), non-zero (|kc| ≤ 1 for the usual integrals)
 * @param p - characteristic parameter, non-zero (p = 1 − n for Π(n, k) in the A&S sign convention)
 * @param a - numerator coefficient of cos²θ
 * @param b - numerator coefficient of sin²θ
 * @returns the integral, to about 1e-15 relative
 * @throws ScienceInputError when kc or p is zero (the integral diverges)
 * @see Bulirsch 1969, Numer. Math. 13, 305 ("Numerical calculation of elliptic integrals and elliptic functions. III")
 */
export function bulirschCel(kc: number, p: number, a: number, b: number): number {
  if (kc === 0 || !Number.isFinite(kc)) {
    throw new ScienceInputError(
      `kc must be finite and non-zero (the integral diverges at kc = 0), got ${kc}`,
    );
  }
  if (p === 0 || !Number.isFinite(p)) {
    throw new ScienceInputError(`p must be finite and non-zero, got ${p}`);
  }
  let qc = Math.abs(kc);
  let aa = a;
  let bb = b;
  let pp = p;
  let e = qc;
  let em = 1;
  if (pp > 0) {
    pp = Math.sqrt(pp);
    bb /= pp;
  } else {
    // Bulirsch's transformation for negative p (Cauchy principal value).
    let f = qc * qc;
    let q = 1 - f;
    const g = 1 - pp;
    f -= pp;
    q *= bb - aa * pp;
    pp = Math.sqrt(f / g);
    aa = (aa - bb) / g;
    bb = -q / (g * g * pp) + aa * pp;
  }
  for (let step = 0; step < CEL_MAX_STEPS; step += 1) {
    const f = aa;
    aa += bb / pp;
    let g = e / pp;
    bb += f * g;
    bb += bb;
    pp = g + pp;
    g = em;
    em += qc;
    if (Math.abs(g - qc) <= g * CEL_TOLERANCE) break;
    qc = Math.sqrt(e);
    qc += qc;
    e = qc * em;
  }
  return (Math.PI / 2) * ((bb + aa * em) / (em * (em + pp)));
}

function checkModulus(k: number): void {
  if (!(k >= 0 && k < 1)) throw new ScienceInputError(`k (elliptic modulus) must be in [0, 1), got ${k}`);
}

/**
 * Complete elliptic integral of the first kind K(k) = ∫₀^{π/2} dθ / √(1 − k² sin²θ).
 *
 * @param k - modulus, in [0, 1)
 * @throws ScienceInputError when k is outside [0, 1)
 * @see Bulirsch 1969, Numer. Math. 13, 305: K(k) = cel(kc, 1, 1, 1)
 */
export function ellipticK(k: number): number {
  checkModulus(k);
  return bulirschCel(Math.sqrt((1 - k) * (1 + k)), 1, 1, 1);
}

/**
 * Complete elliptic integral of the second kind E(k) = ∫₀^{π/2} √(1 − k² sin²θ) dθ.
 *
 * @param k - modulus, in [0, 1)
 * @throws ScienceInputError when k is outside [0, 1)
 * @see Bulirsch 1969, Numer. Math. 13, 305: E(k) = cel(kc, 1, 1, kc²)
 */
export function ellipticE(k: number): number {
  checkModulus(k);
  const kc = Math.sqrt((1 - k) * (1 + k));
  return bulirschCel(kc, 1, 1, kc * kc);
}

/**
 * Complete elliptic integral of the third kind Π(n, k) = ∫₀^{π/2} dθ / ((1 − n sin²θ) √(1 − k² sin²θ)),
 * in the sign convention of Abramowitz & Stegun §17.7 and Mandel & Agol (2002).
 *
 * @param n - characteristic, n < 1 (n > 1 gives a principal value, also returned)
 * @param k - modulus, in [0, 1)
 * @throws ScienceInputError when k is outside [0, 1) or n = 1
 * @see Bulirsch 1969, Numer. Math. 13, 305: Π(n, k) = cel(kc, 1 − n, 1, 1)
 */
export function ellipticPi(n: number, k: number): number {
  checkModulus(k);
  if (n === 1) throw new ScienceInputError('n (characteristic) must not be 1, where Π diverges');
  return bulirschCel(Math.sqrt((1 - k) * (1 + k)), 1 - n, 1, 1);
}

// --- The occultation -----------------------------------------------------------------------------

// Within this distance (in stellar radii) of z = p, z = 1 − p or z = 0 the special-case expressions of
// Mandel & Agol Table 1 are used; the flux is continuous in z, so the error is of this order.
const SNAP = 1e-9;

const INV_PI = 1 / Math.PI;

function clampUnit(value: number): number {
  return value > 1 ? 1 : Math.max(value, -1);
}

/**
 * Fraction of a uniform stellar disk hidden by an opaque disk: λᵉ(p, z) of Mandel & Agol (2002) eq. 1.
 *
 * @param z - centre separation in stellar radii, ≥ 0
 * @param p - planet-to-star radius ratio, > 0
 * @returns the hidden fraction, in [0, 1]
 * @see Mandel & Agol 2002, ApJ 580, L171, eq. 1
 */
export function uniformOccultedFraction(z: number, p: number): number {
  if (z >= 1 + p) return 0;
  if (p >= 1 && z <= p - 1) return 1;
  if (z <= 1 - p) return p * p;
  // Two-circle lens (M&A eq. 1): κ0 at the planet's centre, κ1 at the star's.
  const kappa0 = Math.acos(clampUnit((p * p + z * z - 1) / (2 * p * z)));
  const kappa1 = Math.acos(clampUnit((1 - p * p + z * z) / (2 * z)));
  const chord = 4 * z * z - (1 + z * z - p * p) ** 2;
  return INV_PI * (p * p * kappa0 + kappa1 - 0.5 * Math.sqrt(Math.max(chord, 0)));
}

// η₂ of M&A Table 1 / eq. 7.
function eta2(p: number, z: number): number {
  return 0.5 * p * p * (p * p + 2 * z * z);
}

// η₁ of M&A eq. 7 (partial overlap).
function eta1(p: number, z: number, a: number, b: number): number {
  const kappa0 = Math.acos(clampUnit((p * p + z * z - 1) / (2 * p * z)));
  const kappa1 = Math.acos(clampUnit((1 - p * p + z * z) / (2 * z)));
  const root = (1 - a) * (b - 1);
  return (
    0.5 *
    INV_PI *
    (kappa1 + 2 * eta2(p, z) * kappa0 - 0.25 * (1 + 5 * p * p + z * z) * Math.sqrt(Math.max(root, 0)))
  );
}

// Kernel of the bulirschCel calls below: K, E and Π from the complementary modulus directly, which keeps
// precision when k is near 1 (kc computed from its own expression rather than √(1 − k²)).
function ellKc(kc: number): number {
  return bulirschCel(kc, 1, 1, 1);
}
function ellEc(kc: number): number {
  return bulirschCel(kc, 1, 1, kc * kc);
}
function ellPic(n: number, kc: number): number {
  return bulirschCel(kc, 1 - n, 1, 1);
}

/**
 * λᵈ(p, z) + (2/3)Θ(p − z), the combination of M&A eq. 8 that multiplies c₂, by the cases of Table 1.
 * Returned combined so that the step functions of the special cases cancel consistently.
 */
function lambdaDPlusStep(p: number, z: number, a: number, b: number): number {
  const q = p * p - z * z;
  // Case 4 and 6 (z = 1 − p, p < 1): λ₅ (M&A eq. 7), whose Θ(p − 1/2) cancels the flux formula's Θ(p − z).
  if (p < 1 && Math.abs(z - (1 - p)) < SNAP) {
    return (
      (2 / 3) * INV_PI * Math.acos(1 - 2 * p) -
      (4 / 9) * INV_PI * (3 + 2 * p - 8 * p * p) * Math.sqrt(p * (1 - p))
    );
  }
  if (z > 1 - p) {
    // Partial overlap (cases 2, 7, 8).
    if (Math.abs(z - p) < SNAP) {
      // Case 7 (z = p > 1/2): λ₃ (M&A eq. 7), Θ(0) = 0.
      const k = 1 / (2 * p);
      const kc = Math.sqrt((1 - k) * (1 + k));
      return (
        1 / 3 +
        ((16 * p) / (9 * Math.PI)) * (2 * p * p - 1) * ellEc(kc) -
        (((1 - 4 * p * p) * (3 - 8 * p * p)) / (9 * Math.PI * p)) * ellKc(kc)
      );
    }
    // λ₁ (M&A eq. 7), modulus k² = (1 − a)/(4zp), kc² = (b − 1)/(4zp).
    const kc = Math.sqrt((b - 1) / (4 * z * p));
    const lambda1 =
      (1 / (9 * Math.PI * Math.sqrt(p * z))) *
      (((1 - b) * (2 * b + a - 3) - 3 * q * (b - 2)) * ellKc(kc) +
        4 * p * z * (z * z + 7 * p * p - 4) * ellEc(kc) -
        3 * (q / a) * ellPic((a - 1) / a, kc));
    return lambda1 + (p > z ? 2 / 3 : 0);
  }
  // The planet wholly inside the disk (cases 3, 5, 9, 10).
  if (z < SNAP) {
    // Case 10 (z = 0): λ₆ + 2/3 (M&A eq. 7).
    return (2 / 3) * (1 - (1 - p * p) ** 1.5);
  }
  if (Math.abs(z - p) < SNAP) {
    // Case 5 (z = p < 1/2): λ₄ (M&A eq. 7), Θ(0) = 0.
    const kc = Math.sqrt((1 - 2 * p) * (1 + 2 * p));
    return 1 / 3 + (2 / (9 * Math.PI)) * (4 * (2 * p * p - 1) * ellEc(kc) + (1 - 4 * p * p) * ellKc(kc));
  }
  // λ₂ (M&A eq. 7), modulus 1/k with (1/k)² = 4zp/(1 − a), kc² = (1 − b)/(1 − a).
  const kc = Math.sqrt((1 - b) / (1 - a));
  const lambda2 =
    (2 / (9 * Math.PI * Math.sqrt(1 - a))) *
    ((1 - 5 * z * z + p * p + q * q) * ellKc(kc) +
      (1 - a) * (z * z + 7 * p * p - 4) * ellEc(kc) -
      3 * (q / a) * ellPic((a - b) / a, kc));
  return lambda2 + (p > z ? 2 / 3 : 0);
}

/**
 * Relative flux of a star with the quadratic limb-darkening law I(μ)/I(1) = 1 − u₁(1 − μ) − u₂(1 − μ)²
 * occulted by an opaque disk. u₁ = u₂ = 0 is the uniform disk.
 *
 * @param z - centre separation in stellar radii, ≥ 0
 * @param p - planet-to-star radius ratio, > 0 (p > 1 allowed)
 * @param u1 - linear limb-darkening coefficient
 * @param u2 - quadratic limb-darkening coefficient
 * @returns relative flux, 1 unocculted, in [0, 1]
 * @see Mandel & Agol 2002, ApJ 580, L171, eq. 8 and Table 1
 */
export function occultedFluxQuadratic(z: number, p: number, u1: number, u2: number): number {
  if (z >= 1 + p) return 1;
  const lambdaE = uniformOccultedFraction(z, p);
  if (u1 === 0 && u2 === 0) return 1 - lambdaE;
  if (p >= 1 && z <= p - 1) return 0;
  const a = (z - p) * (z - p);
  const b = (z + p) * (z + p);
  // η for the μ² term: η₂ while the planet is inside the disk, η₁ while it straddles the limb.
  const etaD = z <= 1 - p ? eta2(p, z) : eta1(p, z, a, b);
  const lambdaD = lambdaDPlusStep(p, z, a, b);
  // M&A eq. 8 with c₂ = u₁ + 2u₂, c₄ = −u₂; 4Ω = 1 − u₁/3 − u₂/6.
  const c2 = u1 + 2 * u2;
  const fourOmega = 1 - u1 / 3 - u2 / 6;
  const lost = ((1 - c2) * lambdaE + c2 * lambdaD + u2 * etaD) / fourOmega;
  return 1 - lost;
}

// --- Orbit, durations and the light curve ----------------------------------------------------------

/** Parameters of a circular-orbit transit, as taken by {@link transitFlux}. */
export interface TransitParameters {
  /** Orbital period (days), > 0. */
  periodDays: number;
  /** Mid-transit time of one transit (days, same time system as the times). */
  t0Days: number;
  /** Planet-to-star radius ratio k = Rp/R★, > 0. */
  radiusRatio: number;
  /** Scaled semi-major axis a/R★, > 1. */
  aOverRstar: number;
  /** Impact parameter b = (a/R★) cos i, in [0, a/R★). */
  impact: number;
  /** Quadratic limb-darkening coefficients (u₁ = u₂ = 0 for a uniform disk). */
  u1: number;
  u2: number;
  /** Number of sub-samples per exposure (integer ≥ 1); 1 means the model at the time stamp. */
  supersample?: number;
  /** Exposure length (days), needed when supersample > 1. */
  exposureDays?: number;
}

function requireFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) throw new ScienceInputError(`${name} must be a finite number, got ${value}`);
}

function checkGeometry(params: {
  periodDays: number;
  radiusRatio: number;
  aOverRstar: number;
  impact: number;
}): void {
  requireFinite('periodDays', params.periodDays);
  if (params.periodDays <= 0) throw new ScienceInputError(`periodDays must be > 0, got ${params.periodDays}`);
  requireFinite('radiusRatio', params.radiusRatio);
  if (params.radiusRatio <= 0)
    throw new ScienceInputError(`radiusRatio must be > 0, got ${params.radiusRatio}`);
  requireFinite('aOverRstar', params.aOverRstar);
  if (params.aOverRstar <= 1) throw new ScienceInputError(`aOverRstar must be > 1, got ${params.aOverRstar}`);
  requireFinite('impact', params.impact);
  if (params.impact < 0 || params.impact >= params.aOverRstar) {
    throw new ScienceInputError(
      `impact must be in [0, aOverRstar) = [0, ${params.aOverRstar}), got ${params.impact}`,
    );
  }
}

/**
 * Checks quadratic limb-darkening coefficients for a physical profile: intensity positive everywhere and
 * not increasing toward the limb (u₁ ≥ 0, u₁ + u₂ ≤ 1, u₁ + 2u₂ ≥ 0).
 *
 * @throws ScienceInputError naming u1/u2 when the profile is unphysical
 * @see Kipping 2013, MNRAS 435, 2152, §2 (conditions on the quadratic law)
 */
export function checkLimbDarkening(u1: number, u2: number): void {
  requireFinite('u1', u1);
  requireFinite('u2', u2);
  if (u1 < 0 || u1 + u2 > 1 || u1 + 2 * u2 < 0) {
    throw new ScienceInputError(
      `u1, u2 must give a positive intensity that falls toward the limb (u1 ≥ 0, u1 + u2 ≤ 1, u1 + 2·u2 ≥ 0), got u1 = ${u1}, u2 = ${u2}`,
    );
  }
}

/**
 * Sky-projected centre separation (in stellar radii) at a time, for a circular orbit; Infinity when the
 * planet is behind the star (no occultation modelled).
 *
 * @see Winn 2010, "Transits and Occultations" (arXiv:1001.2010), eq. 5–6 with e = 0
 */
export function projectedSeparation(
  timeDays: number,
  params: { periodDays: number; t0Days: number; aOverRstar: number; impact: number },
): number {
  const phase = (2 * Math.PI * (timeDays - params.t0Days)) / params.periodDays;
  const cosPhase = Math.cos(phase);
  if (cosPhase <= 0) return Number.POSITIVE_INFINITY;
  const cosInc = params.impact / params.aOverRstar;
  const sinPhase = Math.sin(phase);
  // Winn 2010 eq. 5–6: r_sky/R★ = (a/R★) √(sin²φ + cos²i cos²φ) for a circular orbit.
  return params.aOverRstar * Math.sqrt(sinPhase * sinPhase + cosInc * cosInc * cosPhase * cosPhase);
}

/**
 * Relative flux of a star with a transiting planet on a circular orbit at each time: the Mandel & Agol
 * (2002) quadratic-limb-darkened occultation, averaged over the exposure when supersampled.
 *
 * @param timeDays - observation times (days), any order
 * @param params - the orbit and star: periodDays > 0, t0Days, radiusRatio > 0, aOverRstar > 1,
 *   impact in [0, aOverRstar), u1/u2 physical (see {@link checkLimbDarkening}); supersample integer ≥ 1
 *   with exposureDays > 0 when supersample > 1
 * @returns relative flux at each time (1 out of transit), a new Float64Array
 * @throws ScienceInputError naming the first bad parameter
 * @see Mandel & Agol 2002, ApJ 580, L171 (the occultation)
 * @see Kipping 2010, MNRAS 408, 1758 (supersampling long exposures: the mean over N sub-exposures)
 */
export function transitFlux(timeDays: Float64Array, params: TransitParameters): Float64Array {
  checkGeometry(params);
  requireFinite('t0Days', params.t0Days);
  checkLimbDarkening(params.u1, params.u2);
  const supersample = params.supersample ?? 1;
  if (!Number.isInteger(supersample) || supersample < 1) {
    throw new ScienceInputError(`supersample must be an integer ≥ 1, got ${supersample}`);
  }
  const exposureDays = params.exposureDays ?? 0;
  if (supersample > 1 && !(exposureDays > 0 && Number.isFinite(exposureDays))) {
    throw new ScienceInputError(`exposureDays must be > 0 when supersample > 1, got ${params.exposureDays}`);
  }
  const { periodDays, t0Days, radiusRatio: p, aOverRstar, impact, u1, u2 } = params;
  const contact = 1 + p;
  // Cheap rejection far from transit: |phase| beyond the first contact (plus the exposure) gives flux 1.
  const halfWindowDays =
    (periodDays / (2 * Math.PI)) * Math.asin(Math.min(1, contact / aOverRstar)) * 1.01 + exposureDays;
  const out = new Float64Array(timeDays.length);
  const orbit = { periodDays, t0Days, aOverRstar, impact };
  for (let i = 0; i < timeDays.length; i += 1) {
    const t = timeDays[i]!;
    let offset = (t - t0Days) % periodDays;
    if (offset > periodDays / 2) offset -= periodDays;
    else if (offset < -periodDays / 2) offset += periodDays;
    if (Math.abs(offset) > halfWindowDays) {
      out[i] = 1;
      continue;
    }
    if (supersample === 1) {
      out[i] = occultedFluxQuadratic(projectedSeparation(t, orbit), p, u1, u2);
      continue;
    }
    let sum = 0;
    for (let j = 0; j < supersample; j += 1) {
      // Kipping 2010: the exposure-mean flux, sampled at the centres of N equal slices of the exposure.
      const ts = t + ((j + 0.5) / supersample - 0.5) * exposureDays;
      sum += occultedFluxQuadratic(projectedSeparation(ts, orbit), p, u1, u2);
    }
    out[i] = sum / supersample;
  }
  return out;
}

/** Geometry of a circular-orbit transit, as taken by the duration formulas. */
export interface TransitGeometry {
  /** Orbital period (days), > 0. */
  periodDays: number;
  /** k = Rp/R★, > 0. */
  radiusRatio: number;
  /** a/R★, > 1. */
  aOverRstar: number;
  /** b = (a/R★) cos i, in [0, a/R★). */
  impact: number;
}

function contactDuration(params: TransitGeometry, chordSquared: number): number {
  if (chordSquared <= 0) return 0;
  const sinInc = Math.sqrt(1 - (params.impact / params.aOverRstar) ** 2);
  const argument = Math.sqrt(chordSquared) / (params.aOverRstar * sinInc);
  return (params.periodDays / Math.PI) * Math.asin(Math.min(1, argument));
}

/**
 * Total transit duration T₁₄ (first to fourth contact), circular orbit.
 *
 * @param params - periodDays > 0, radiusRatio > 0, aOverRstar > 1, impact in [0, aOverRstar)
 * @returns T₁₄ (days); 0 when b ≥ 1 + k (no transit)
 * @throws ScienceInputError naming the first bad parameter
 * @see Seager & Mallén-Ornelas 2003, ApJ 585, 1038, eq. 3; Winn 2010, "Transits and Occultations", eq. 14
 */
export function totalDurationDays(params: TransitGeometry): number {
  checkGeometry(params);
  // Winn 2010 eq. 14: T₁₄ = (P/π) asin[(R★/a) √((1 + k)² − b²) / sin i].
  return contactDuration(params, (1 + params.radiusRatio) ** 2 - params.impact ** 2);
}

/**
 * Full transit duration T₂₃ (second to third contact: the planet wholly inside the disk), circular orbit.
 *
 * @param params - periodDays > 0, radiusRatio > 0, aOverRstar > 1, impact in [0, aOverRstar)
 * @returns T₂₃ (days); 0 when b ≥ 1 − k (grazing: no full phase)
 * @throws ScienceInputError naming the first bad parameter
 * @see Seager & Mallén-Ornelas 2003, ApJ 585, 1038, eq. 3; Winn 2010, "Transits and Occultations", eq. 15
 */
export function fullDurationDays(params: TransitGeometry): number {
  checkGeometry(params);
  if (params.radiusRatio >= 1) return 0;
  // Winn 2010 eq. 15: T₂₃ = (P/π) asin[(R★/a) √((1 − k)² − b²) / sin i].
  return contactDuration(params, (1 - params.radiusRatio) ** 2 - params.impact ** 2);
}
