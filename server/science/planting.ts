// Planted controls: a synthetic transit of known size drawn for a window of real data and multiplied into
// a copy of its flux, so volunteers' sensitivity and the search's completeness can be measured.

import { HOURS_PER_DAY, PPM_PER_UNIT } from './constants';
import { aOverRstarFromDensity, stellarDensityFromMassRadius } from './derived-parameters';
import type { Random } from './random';
import { checkLimbDarkening, occultedFluxQuadratic, totalDurationDays, transitFlux } from './transit-model';
import { ScienceInputError } from './types';

/** What was planted: enough to rebuild the model and to score a verdict's mark against it. */
export interface PlantedTransit {
  /** Mid-transit time (days, the light curve's time system). */
  t0Days: number;
  /** Depth at mid-transit, 1 − F(t0), limb darkening included (ppm). */
  depthPpm: number;
  /** Total duration T₁₄ (hours). */
  durationHours: number;
  /** Impact parameter b. */
  impact: number;
  /** k = Rp/R★. */
  radiusRatio: number;
  /** a/R★, consistent with the stellar density and the period (Kepler's third law). */
  aOverRstar: number;
  periodDays: number;
  /** depth/σ · √(points in T₁₄) for the window's noise and cadence. */
  expectedSnr: number;
  /** Quadratic limb-darkening coefficients used. */
  u1: number;
  u2: number;
}

/** The window and star a planted transit is drawn for. */
export interface PlantingRequest {
  /** The window's first and last time (days). */
  snippetStartDays: number;
  snippetEndDays: number;
  /** White noise per point (ppm), > 0. */
  noisePpm: number;
  /** Time between points (days), > 0. */
  cadenceDays: number;
  /** Target SNR range, 0 < snrMin ≤ snrMax. */
  snrMin: number;
  snrMax: number;
  /** Stellar density (g cm⁻³); or give stellarRadiusRsun and stellarMassMsun. */
  stellarDensityGcm3?: number;
  stellarRadiusRsun?: number;
  stellarMassMsun?: number;
  /** Quadratic limb-darkening coefficients of the target. */
  u1: number;
  u2: number;
  /** Period range to draw from (days), log-uniform; defaults 1–30 d. Periods shorter than the window are
   * raised to its length so that one transit falls in it. */
  periodMinDays?: number;
  periodMaxDays?: number;
  /** Largest impact parameter drawn (default 0.9); b is uniform in [0, impactMax]. */
  impactMax?: number;
}

/** The largest radius ratio a planted planet may have; deeper requests are refused. */
export const PLANTED_RADIUS_RATIO_MAX = 0.5;

function requirePositive(name: string, value: number | undefined): number {
  if (value === undefined || !(value > 0 && Number.isFinite(value))) {
    throw new ScienceInputError(`${name} must be a finite number > 0, got ${value}`);
  }
  return value;
}

/**
 * The radius ratio whose mid-transit depth at impact b is the given depth (bisection on the
 * Mandel & Agol model; depth grows monotonically with k).
 *
 * @param depth - fractional depth 1 − F, > 0
 * @param impact - b in [0, 1)
 * @param u1 - linear limb-darkening coefficient; u2 - quadratic
 * @returns k, or null when even k = PLANTED_RADIUS_RATIO_MAX is too shallow
 */
function radiusRatioForDepth(depth: number, impact: number, u1: number, u2: number): number | null {
  const depthAt = (k: number) => 1 - occultedFluxQuadratic(impact, k, u1, u2);
  if (depthAt(PLANTED_RADIUS_RATIO_MAX) < depth) return null;
  let lo = 0;
  let hi = PLANTED_RADIUS_RATIO_MAX;
  for (let step = 0; step < 100 && hi - lo > 1e-13; step += 1) {
    const mid = 0.5 * (lo + hi);
    if (depthAt(mid) < depth) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Draws the parameters of a planted transit for one window: impact b uniform in [0, impactMax], period
 * log-uniform in the range, a/R★ from the stellar density by Kepler's third law
 * (ρ★ = 3π (a/R★)³ / (G P²)), SNR log-uniform in [snrMin, snrMax] — that is, depth log-uniform over the
 * depths giving that SNR range, with SNR = depth/σ · √(T₁₄/cadence) — the radius ratio giving that depth
 * at b (limb darkening included), and t0 uniform in the window at least max(T₁₄, 10% of the window) from
 * either edge. The duration follows from P, a/R★, k and b.
 *
 * @param rng - the seeded generator (see random.ts); consumed in a fixed order, so a seed gives one draw
 * @param request - the window, its noise and cadence, the SNR range and the star (see PlantingRequest)
 * @returns the planted transit's parameters
 * @throws ScienceInputError naming the argument when the request is inconsistent: window too short for
 *   the transit, SNR asking for a depth beyond k = 0.5, bad ranges or missing stellar parameters
 * @see Winn 2010, "Transits and Occultations", eq. 14 and 30; Mandel & Agol 2002, ApJ 580, L171
 */
export function drawPlantedTransit(rng: Random, request: PlantingRequest): PlantedTransit {
  const { snippetStartDays, snippetEndDays, u1, u2 } = request;
  if (
    !(
      Number.isFinite(snippetStartDays) &&
      Number.isFinite(snippetEndDays) &&
      snippetEndDays > snippetStartDays
    )
  ) {
    throw new ScienceInputError(
      `snippetEndDays must be after snippetStartDays, got ${snippetStartDays} to ${snippetEndDays}`,
    );
  }
  const noise = requirePositive('noisePpm', request.noisePpm) / PPM_PER_UNIT;
  const cadenceDays = requirePositive('cadenceDays', request.cadenceDays);
  const snrMin = requirePositive('snrMin', request.snrMin);
  const snrMax = requirePositive('snrMax', request.snrMax);
  if (snrMax < snrMin) throw new ScienceInputError(`snrMax must be ≥ snrMin (${snrMin}), got ${snrMax}`);
  checkLimbDarkening(u1, u2);
  const impactMax = request.impactMax ?? 0.9;
  if (!(impactMax >= 0 && impactMax < 1)) {
    throw new ScienceInputError(`impactMax must be in [0, 1), got ${request.impactMax}`);
  }
  let density: number;
  if (request.stellarDensityGcm3 !== undefined) {
    density = requirePositive('stellarDensityGcm3', request.stellarDensityGcm3);
  } else if (request.stellarRadiusRsun !== undefined && request.stellarMassMsun !== undefined) {
    density = stellarDensityFromMassRadius({
      stellarMassMsun: requirePositive('stellarMassMsun', request.stellarMassMsun),
      stellarRadiusRsun: requirePositive('stellarRadiusRsun', request.stellarRadiusRsun),
    });
  } else {
    throw new ScienceInputError(
      'stellarDensityGcm3, or both stellarRadiusRsun and stellarMassMsun, must be given',
    );
  }
  const spanDays = snippetEndDays - snippetStartDays;
  const periodMaxDays = requirePositive('periodMaxDays', request.periodMaxDays ?? 30);
  const periodMinDays = Math.max(requirePositive('periodMinDays', request.periodMinDays ?? 1), spanDays);
  if (periodMinDays > periodMaxDays) {
    throw new ScienceInputError(
      `periodMaxDays must be at least the window's length (${spanDays.toFixed(3)} d) and periodMinDays, got ${periodMaxDays}`,
    );
  }

  const impact = rng.uniform(0, impactMax);
  const periodDays = rng.logUniform(periodMinDays, periodMaxDays);
  const snr = snrMin === snrMax ? snrMin : rng.logUniform(snrMin, snrMax);
  const aOverRstar = aOverRstarFromDensity({ stellarDensityGcm3: density, periodDays });
  if (aOverRstar <= 1 + PLANTED_RADIUS_RATIO_MAX) {
    throw new ScienceInputError(
      `stellarDensityGcm3 ${density.toPrecision(3)} with a period of ${periodDays.toPrecision(3)} d puts the orbit inside the star (a/R★ = ${aOverRstar.toPrecision(3)}); raise periodMinDays`,
    );
  }

  // The duration depends weakly on k and the depth on the duration: iterate to the fixed point.
  let radiusRatio = 0.05;
  let durationDays = 0;
  let depth = 0;
  for (let iteration = 0; iteration < 20; iteration += 1) {
    durationDays = totalDurationDays({ periodDays, radiusRatio, aOverRstar, impact });
    // SNR = δ/σ · √N with N = T₁₄/cadence points in transit (common practice definition).
    depth = (snr * noise) / Math.sqrt(durationDays / cadenceDays);
    const next = radiusRatioForDepth(depth, impact, u1, u2);
    if (next === null) {
      throw new ScienceInputError(
        `snrMax ${snrMax} needs a depth of ${(depth * PPM_PER_UNIT).toFixed(0)} ppm at noisePpm ${request.noisePpm}, beyond a planet of k = ${PLANTED_RADIUS_RATIO_MAX}`,
      );
    }
    const converged = Math.abs(next - radiusRatio) < 1e-12;
    radiusRatio = next;
    if (converged) break;
  }
  durationDays = totalDurationDays({ periodDays, radiusRatio, aOverRstar, impact });
  depth = 1 - occultedFluxQuadratic(impact, radiusRatio, u1, u2);

  const marginDays = Math.max(durationDays, 0.1 * spanDays);
  if (spanDays <= 2 * marginDays) {
    throw new ScienceInputError(
      `snippetEndDays − snippetStartDays must exceed twice the transit duration (${(durationDays * HOURS_PER_DAY).toFixed(2)} h) to keep it away from the edges, got ${(spanDays * HOURS_PER_DAY).toFixed(2)} h`,
    );
  }
  const t0Days = rng.uniform(snippetStartDays + marginDays, snippetEndDays - marginDays);
  return {
    t0Days,
    depthPpm: depth * PPM_PER_UNIT,
    durationHours: durationDays * HOURS_PER_DAY,
    impact,
    radiusRatio,
    aOverRstar,
    periodDays,
    expectedSnr: (depth / noise) * Math.sqrt(durationDays / cadenceDays),
    u1,
    u2,
  };
}

/**
 * Multiplies a planted transit into a copy of a window's flux; the input is not changed.
 *
 * @param timeDays - the window's times (days)
 * @param flux - its relative flux, the same length
 * @param truth - the planted transit (from drawPlantedTransit)
 * @param options.exposureDays - exposure length (days) to average the model over (e.g. the cadence of
 *   long-cadence data), with options.supersample sub-samples (default 1: no averaging)
 * @returns the flux with the model multiplied in, a new Float64Array
 * @throws ScienceInputError when the lengths differ or the truth is not a valid transit
 * @see Mandel & Agol 2002, ApJ 580, L171; Kipping 2010, MNRAS 408, 1758 (supersampling)
 */
export function plantTransit(
  timeDays: Float64Array,
  flux: Float64Array,
  truth: PlantedTransit,
  options: { exposureDays?: number; supersample?: number } = {},
): Float64Array {
  if (timeDays.length !== flux.length) {
    throw new ScienceInputError(`flux must have one value per time (${timeDays.length}), got ${flux.length}`);
  }
  const model = transitFlux(timeDays, {
    periodDays: truth.periodDays,
    t0Days: truth.t0Days,
    radiusRatio: truth.radiusRatio,
    aOverRstar: truth.aOverRstar,
    impact: truth.impact,
    u1: truth.u1,
    u2: truth.u2,
    ...(options.supersample !== undefined ? { supersample: options.supersample } : {}),
    ...(options.exposureDays !== undefined ? { exposureDays: options.exposureDays } : {}),
  });
  const out = new Float64Array(flux.length);
  for (let i = 0; i < flux.length; i += 1) out[i] = flux[i]! * model[i]!;
  return out;
}
