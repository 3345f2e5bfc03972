// The shape of a transit: a trapezoid fitted to the (folded) light curve, to tell a flat-bottomed
// planetary transit from the V of a grazing eclipsing binary. Pure: times and fluxes in, a fit out.
import { median } from './statistics';

export interface ShapeInput {
  /** Times (days) and relative fluxes (about 1) of the light curve; non-finite fluxes are skipped. */
  timeDays: ArrayLike<number>;
  flux: ArrayLike<number>;
  /** Null for a single transit: only the points around t0 are used. */
  periodDays: number | null;
  t0Days: number;
  /** The duration found by the search or the dip finder (hours), the scale of the fit's grid. */
  durationHours: number;
}

export interface ShapeFit {
  depthPpm: number;
  /** T₁₄, first to fourth contact (hours). */
  totalDurationHours: number;
  /** T₁₂ = T₃₄, one ingress (hours). */
  ingressHours: number;
  /** T₂₃ / T₁₄: 1 for a box, 0 for a V. */
  flatShare: number;
  /** χ² of the best trapezoid, and of the best one whose flat share is at least {@link FLAT_SHARE_MIN}. */
  chiSquare: number;
  flatChiSquare: number;
  /** Points within the fitted transit. */
  pointsInTransit: number;
}

/**
 * A flat bottom for less than this share of the transit is a V (our own threshold: a planet of
 * k = Rp/R★ = 0.2 crossing at b = 0.7 still keeps about 40 %, Winn 2010 eq. 14–15).
 */
export const FLAT_SHARE_MIN = 0.3;
/** Fewer points than this inside the transit cannot tell a V from a box (our own threshold). */
export const MIN_POINTS_IN_TRANSIT = 12;

// The grid: T₁₄ from half to twice the found duration, flat share 0–1, t0 within ±30 % of the duration.
const TOTAL_STEPS = 31;
const SHARE_STEPS = 21;
const SHIFT_STEPS = 13;

/** Trapezoid depth profile at offset x from mid-transit: 1 on the flat bottom, 0 outside (Carter et al. 2008, ApJ 689, 499, §2). */
function trapezoid(x: number, halfTotal: number, halfFull: number): number {
  const distance = Math.abs(x);
  if (distance >= halfTotal) return 0;
  if (distance <= halfFull) return 1;
  return (halfTotal - distance) / (halfTotal - halfFull);
}

/**
 * Fits a trapezoid (depth, T₁₄, T₂₃ and a small shift of t0) to the points around each transit by least
 * squares on a grid, the baseline and depth solved exactly at each node; the noise is the scaled MAD
 * of the points outside the transit. Null when the data cannot tell (too few points in transit, no
 * baseline, or no dip at all).
 *
 * @see Carter et al. 2008, ApJ 689, 499 (the trapezoid as an approximation of a limb-darkened transit)
 */
export function fitTransitShape(input: ShapeInput): ShapeFit | null {
  const durationDays = input.durationHours / 24;
  if (!(durationDays > 0) || !Number.isFinite(input.t0Days)) return null;
  const halfWindow = 1.5 * durationDays;
  const offsets: number[] = [];
  const fluxes: number[] = [];
  for (let i = 0; i < input.timeDays.length; i += 1) {
    const f = input.flux[i]!;
    if (!Number.isFinite(f)) continue;
    let offset = input.timeDays[i]! - input.t0Days;
    if (input.periodDays !== null) {
      offset -= Math.round(offset / input.periodDays) * input.periodDays;
    }
    if (Math.abs(offset) <= halfWindow) {
      offsets.push(offset);
      fluxes.push(f);
    }
  }
  const outside = fluxes.filter((_, i) => Math.abs(offsets[i]!) > durationDays);
  if (outside.length < 5) return null;
  const level = median(outside);
  // 1.4826 × MAD estimates σ for Gaussian noise (common practice).
  const sigma = 1.4826 * median(outside.map((f) => Math.abs(f - level)));
  if (!(sigma > 0)) return null;

  let best: { rss: number; depth: number; halfTotal: number; halfFull: number; shift: number } | null = null;
  let bestFlatRss = Number.POSITIVE_INFINITY;
  const n = offsets.length;
  let sumF = 0;
  let sumFF = 0;
  for (const f of fluxes) {
    sumF += f;
    sumFF += f * f;
  }
  for (let a = 0; a < TOTAL_STEPS; a += 1) {
    const total = durationDays * (0.5 + (1.5 * a) / (TOTAL_STEPS - 1));
    const halfTotal = total / 2;
    for (let b = 0; b < SHARE_STEPS; b += 1) {
      const share = b / (SHARE_STEPS - 1);
      const halfFull = halfTotal * share;
      for (let c = 0; c < SHIFT_STEPS; c += 1) {
        const shift = durationDays * (-0.3 + (0.6 * c) / (SHIFT_STEPS - 1));
        // Model f = level − depth · s(x): least squares for (level, depth) from the sums.
        let sumS = 0;
        let sumSS = 0;
        let sumFS = 0;
        for (let i = 0; i < n; i += 1) {
          const s = trapezoid(offsets[i]! - shift, halfTotal, halfFull);
          if (s === 0) continue;
          sumS += s;
          sumSS += s * s;
          sumFS += fluxes[i]! * s;
        }
        const determinant = n * sumSS - sumS * sumS;
        if (!(determinant > 0)) continue;
        const depth = (sumS * sumF - n * sumFS) / determinant;
        if (!(depth > 0)) continue;
        const base = (sumF + depth * sumS) / n;
        // RSS = Σ(f − base + depth·s)², expanded in the sums.
        const rss =
          sumFF +
          n * base * base +
          depth * depth * sumSS -
          2 * base * sumF +
          2 * depth * sumFS -
          2 * base * depth * sumS;
        if (!best || rss < best.rss) best = { rss, depth, halfTotal, halfFull, shift };
        if (share >= FLAT_SHARE_MIN && rss < bestFlatRss) bestFlatRss = rss;
      }
    }
  }
  if (!best) return null;
  const inTransit = offsets.filter((x) => Math.abs(x - best.shift) < best.halfTotal).length;
  if (inTransit < MIN_POINTS_IN_TRANSIT) return null;
  const variance = sigma * sigma;
  return {
    depthPpm: best.depth * 1e6,
    totalDurationHours: best.halfTotal * 2 * 24,
    ingressHours: (best.halfTotal - best.halfFull) * 24,
    flatShare: best.halfTotal > 0 ? best.halfFull / best.halfTotal : 0,
    chiSquare: Math.max(0, best.rss) / variance,
    flatChiSquare: Math.max(0, bestFlatRss) / variance,
    pointsInTransit: inTransit,
  };
}
