import { describe, expect, it } from 'vitest';
import {
  stellarDensityFromMassRadius,
  stellarDensityFromTransit,
} from '../../../../server/science/derived-parameters';
import { drawPlantedTransit, type PlantingRequest, plantTransit } from '../../../../server/science/planting';
import { createRandom } from '../../../../server/science/random';
import {
  occultedFluxQuadratic,
  totalDurationDays,
  transitFlux,
} from '../../../../server/science/transit-model';
import { ScienceInputError } from '../../../../server/science/types';

const cadenceDays = 2 / 1440;

const request: PlantingRequest = {
  snippetStartDays: 1500,
  snippetEndDays: 1503,
  noisePpm: 1200,
  cadenceDays,
  snrMin: 7,
  snrMax: 40,
  stellarDensityGcm3: 1.41,
  u1: 0.4,
  u2: 0.26,
};

/** A stand-in for a real window: flat flux with white noise of the request's level. */
function quietWindow(seed: string, noisePpm: number): { timeDays: Float64Array; flux: Float64Array } {
  const rng = createRandom(seed);
  const count = Math.floor((request.snippetEndDays - request.snippetStartDays) / cadenceDays) + 1;
  const timeDays = Float64Array.from({ length: count }, (_, i) => request.snippetStartDays + i * cadenceDays);
  const flux = Float64Array.from({ length: count }, () => 1 + rng.normal(0, noisePpm / 1e6));
  return { timeDays, flux };
}

/**
 * Least-squares fit of flux = c − α·s(t), with s = 1 − model the known transit shape at the known t0 and
 * duration (a matched-filter depth fit); returns the depth α·depth and its 1σ error for white noise σ.
 */
function fitDepth(
  flux: Float64Array,
  shape: Float64Array,
  sigma: number,
): { depth: number; depthErr: number } {
  const n = flux.length;
  let sumS = 0;
  let sumSS = 0;
  let sumY = 0;
  let sumSY = 0;
  for (let i = 0; i < n; i += 1) {
    sumS += shape[i]!;
    sumSS += shape[i]! * shape[i]!;
    sumY += flux[i]!;
    sumSY += shape[i]! * flux[i]!;
  }
  // Normal equations of y = c − α s.
  const det = n * sumSS - sumS * sumS;
  const alpha = (sumS * sumY - n * sumSY) / det;
  const peak = shape.reduce((max, value) => Math.max(max, value), 0);
  return { depth: alpha * peak, depthErr: sigma * Math.sqrt(n / det) * peak };
}

describe('drawPlantedTransit', () => {
  it('draws b in [0, 0.9], a period of at least the window length, and a/R★ consistent with the density', () => {
    const rng = createRandom('planting-ranges');
    for (let trial = 0; trial < 300; trial += 1) {
      const truth = drawPlantedTransit(rng, request);
      expect(truth.impact).toBeGreaterThanOrEqual(0);
      expect(truth.impact).toBeLessThanOrEqual(0.9);
      expect(truth.periodDays).toBeGreaterThanOrEqual(3);
      expect(truth.periodDays).toBeLessThanOrEqual(30);
      // Kepler: ρ★ = 3π (a/R★)³ / (G P²) gives back the requested density.
      const { stellarDensityGcm3 } = stellarDensityFromTransit(truth);
      expect(stellarDensityGcm3).toBeCloseTo(1.41, 10);
      const durationDays = totalDurationDays(truth);
      expect(truth.durationHours).toBeCloseTo(durationDays * 24, 10);
      expect(truth.depthPpm).toBeCloseTo(
        (1 - occultedFluxQuadratic(truth.impact, truth.radiusRatio, 0.4, 0.26)) * 1e6,
        6,
      );
      expect(truth.t0Days - durationDays).toBeGreaterThanOrEqual(request.snippetStartDays);
      expect(truth.t0Days + durationDays).toBeLessThanOrEqual(request.snippetEndDays);
      // SNR = depth/σ · √(T14/cadence) lies in the requested range.
      const snr = (truth.depthPpm / request.noisePpm) * Math.sqrt(durationDays / cadenceDays);
      expect(truth.expectedSnr).toBeCloseTo(snr, 8);
      expect(truth.expectedSnr).toBeGreaterThanOrEqual(7 * (1 - 1e-9));
      expect(truth.expectedSnr).toBeLessThanOrEqual(40 * (1 + 1e-9));
    }
  });

  it('draws the SNR log-uniformly: its median is near the geometric mean of the range', () => {
    const rng = createRandom('planting-log-uniform');
    const snrs = Array.from({ length: 2000 }, () => drawPlantedTransit(rng, request).expectedSnr).sort(
      (a, b) => a - b,
    );
    expect(snrs[1000]! / Math.sqrt(7 * 40)).toBeGreaterThan(0.93);
    expect(snrs[1000]! / Math.sqrt(7 * 40)).toBeLessThan(1.07);
  });

  it('gives the same draw for the same seed, and accepts R★ and M★ in place of the density', () => {
    const first = drawPlantedTransit(createRandom(42), request);
    expect(drawPlantedTransit(createRandom(42), request)).toEqual(first);
    const { stellarDensityGcm3: _dropped, ...withoutDensity } = request;
    const bySize = drawPlantedTransit(createRandom(42), {
      ...withoutDensity,
      stellarRadiusRsun: 0.9,
      stellarMassMsun: 0.9,
    });
    const density = stellarDensityFromMassRadius({ stellarMassMsun: 0.9, stellarRadiusRsun: 0.9 });
    expect(stellarDensityFromTransit(bySize).stellarDensityGcm3).toBeCloseTo(density, 10);
  });

  it('names the argument when the request cannot be met', () => {
    const rng = createRandom('planting-errors');
    expect(() => drawPlantedTransit(rng, { ...request, noisePpm: 0 })).toThrow(
      /noisePpm must be a finite number > 0/,
    );
    expect(() => drawPlantedTransit(rng, { ...request, snrMin: 50 })).toThrow(
      /snrMax must be ≥ snrMin \(50\)/,
    );
    expect(() => drawPlantedTransit(rng, { ...request, snippetEndDays: 1499 })).toThrow(
      /snippetEndDays must be after snippetStartDays/,
    );
    expect(() => drawPlantedTransit(rng, { ...request, snippetEndDays: 1500.1, periodMinDays: 10 })).toThrow(
      /must exceed twice the transit duration/,
    );
    expect(() =>
      drawPlantedTransit(rng, { ...request, noisePpm: 200_000, snrMin: 100, snrMax: 100 }),
    ).toThrow(/beyond a planet of k = 0.5/);
    const { stellarDensityGcm3: _dropped, ...withoutDensity } = request;
    expect(() => drawPlantedTransit(rng, withoutDensity)).toThrow(ScienceInputError);
  });
});

describe('plantTransit', () => {
  it('multiplies the model into a copy of the flux and leaves the input alone', () => {
    const { timeDays, flux } = quietWindow('copy', 1200);
    const before = Float64Array.from(flux);
    const truth = drawPlantedTransit(createRandom('copy-draw'), request);
    const planted = plantTransit(timeDays, flux, truth);
    expect(flux).toEqual(before);
    const model = transitFlux(timeDays, { ...truth });
    for (let i = 0; i < flux.length; i += 1) expect(planted[i]).toBeCloseTo(flux[i]! * model[i]!, 15);
  });

  it('refuses flux of a different length, naming it', () => {
    const truth = drawPlantedTransit(createRandom('length'), request);
    expect(() => plantTransit(Float64Array.of(1, 2), Float64Array.of(1), truth)).toThrow(
      /flux must have one value per time \(2\), got 1/,
    );
  });

  it('planted then fitted at the known t0 and duration gives back the planted depth within its error', () => {
    // Property over 300 seeds: the pull (fitted − planted)/σ of a least-squares depth fit is standard normal.
    const pulls: number[] = [];
    for (let seed = 0; seed < 300; seed += 1) {
      const noisePpm = 600 + 40 * (seed % 20);
      const { timeDays, flux } = quietWindow(`window:${seed}`, noisePpm);
      const truth = drawPlantedTransit(createRandom(`draw:${seed}`), { ...request, noisePpm });
      const planted = plantTransit(timeDays, flux, truth);
      const model = transitFlux(timeDays, { ...truth });
      const shape = model.map((value) => 1 - value);
      const fit = fitDepth(planted, shape, noisePpm / 1e6);
      // A box fit on the same points: mean deficit inside T14 against the mean outside.
      let inside = 0;
      let insideCount = 0;
      let outside = 0;
      let outsideCount = 0;
      let boxModel = 0;
      for (let i = 0; i < timeDays.length; i += 1) {
        if (Math.abs(timeDays[i]! - truth.t0Days) < truth.durationHours / 48) {
          inside += planted[i]!;
          boxModel += shape[i]!;
          insideCount += 1;
        } else {
          outside += planted[i]!;
          outsideCount += 1;
        }
      }
      const boxDepth = outside / outsideCount - inside / insideCount;
      const boxErr = (noisePpm / 1e6) * Math.sqrt(1 / insideCount + 1 / outsideCount);
      expect(Math.abs(boxDepth - boxModel / insideCount)).toBeLessThan(4.5 * boxErr);
      pulls.push((fit.depth - truth.depthPpm / 1e6) / fit.depthErr);
    }
    const mean = pulls.reduce((sum, x) => sum + x, 0) / pulls.length;
    const sd = Math.sqrt(pulls.reduce((sum, x) => sum + (x - mean) ** 2, 0) / (pulls.length - 1));
    expect(Math.abs(mean)).toBeLessThan(0.25); // 300 standard normals: σ of the mean 0.058
    expect(sd).toBeGreaterThan(0.85);
    expect(sd).toBeLessThan(1.15);
    expect(pulls.filter((pull) => Math.abs(pull) < 3).length / pulls.length).toBeGreaterThan(0.98);
  });
});
