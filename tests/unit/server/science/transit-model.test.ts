import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../../server/science/random';
import {
  bulirschCel,
  ellipticE,
  ellipticK,
  ellipticPi,
  fullDurationDays,
  occultedFluxQuadratic,
  projectedSeparation,
  totalDurationDays,
  transitFlux,
  uniformOccultedFraction,
} from '../../../../server/science/transit-model';
import { ScienceInputError } from '../../../../server/science/types';
// Fractions of light lost recomputed with numpy by tests/reference/make_model_reference.py.
import reference from '../../../fixtures/model/astropy-reference.json';

// --- Slow, obvious references ----------------------------------------------------------------------

/** ∫ₐᵇ f by the midpoint rule after θ ↦ a + (b − a)(1 − cos θ)/2, which tames √ end-point singularities. */
function integrate(f: (x: number) => number, lo: number, hi: number, steps = 20_000): number {
  let sum = 0;
  for (let i = 0; i < steps; i += 1) {
    const theta = ((i + 0.5) / steps) * Math.PI;
    const x = lo + ((hi - lo) * (1 - Math.cos(theta))) / 2;
    sum += f(x) * ((hi - lo) / 2) * Math.sin(theta);
  }
  return (sum * Math.PI) / steps;
}

/** Π(n, k) by quadrature of its definition (A&S 17.7.2). */
function ellipticPiByQuadrature(n: number, k: number): number {
  return integrate(
    (theta) => 1 / ((1 - n * Math.sin(theta) ** 2) * Math.sqrt(1 - k * k * Math.sin(theta) ** 2)),
    0,
    Math.PI / 2,
    200_000,
  );
}

function quadraticIntensity(r: number, u1: number, u2: number): number {
  const mu = Math.sqrt(Math.max(0, 1 - r * r));
  return 1 - u1 * (1 - mu) - u2 * (1 - mu) ** 2;
}

/**
 * Flux by numerical integration over the occulted part of the disk: rings of radius r about the star's
 * centre, each contributing I(r) times the length of its arc inside the planet's disk.
 */
function fluxByIntegration(z: number, p: number, u1: number, u2: number): number {
  const arcInsidePlanet = (r: number): number => {
    if (r <= p - z) return 2 * Math.PI * r;
    if (r >= z + p || r <= z - p) return 0;
    const cosine = (r * r + z * z - p * p) / (2 * r * z);
    return 2 * Math.acos(Math.min(1, Math.max(-1, cosine))) * r;
  };
  const breaks = [Math.max(0, z - p), Math.abs(z - p), Math.min(1, z + p), 1]
    .filter((r) => r <= Math.min(1, z + p))
    .sort((a, b) => a - b);
  let blocked = 0;
  for (let i = 0; i + 1 < breaks.length; i += 1) {
    if (breaks[i + 1]! > breaks[i]!) {
      blocked += integrate(
        (r) => arcInsidePlanet(r) * quadraticIntensity(r, u1, u2),
        breaks[i]!,
        breaks[i + 1]!,
      );
    }
  }
  // Total: ∫₀¹ I(r) 2πr dr = π (1 − u₁/3 − u₂/6).
  return 1 - blocked / (Math.PI * (1 - u1 / 3 - u2 / 6));
}

/** Area of overlap of two circles (radii 1 and p, centres z apart): the textbook lens formula. */
function lensArea(z: number, p: number): number {
  if (z >= 1 + p) return 0;
  if (z <= Math.abs(1 - p)) return Math.PI * Math.min(1, p) ** 2;
  const d1 = (z * z + 1 - p * p) / (2 * z);
  const d2 = z - d1;
  return (
    Math.acos(d1) - d1 * Math.sqrt(1 - d1 * d1) + p * p * Math.acos(d2 / p) - d2 * Math.sqrt(p * p - d2 * d2)
  );
}

// --- Elliptic integrals ----------------------------------------------------------------------------

describe('complete elliptic integrals', () => {
  it('at m = k² = 1/2 give K = 1.854074677301372 and E = 1.350643881047675 (Abramowitz & Stegun Table 17.1)', () => {
    expect(ellipticK(Math.SQRT1_2)).toBeCloseTo(1.854074677301372, 14);
    expect(ellipticE(Math.SQRT1_2)).toBeCloseTo(1.350643881047675, 14);
  });

  it('at k = 0 give K = E = π/2 (A&S 17.3.11, 17.3.12)', () => {
    expect(ellipticK(0)).toBeCloseTo(Math.PI / 2, 15);
    expect(ellipticE(0)).toBeCloseTo(Math.PI / 2, 15);
  });

  it("satisfy Legendre's relation EK' + E'K − KK' = π/2 (A&S 17.3.13) on random moduli", () => {
    const rng = createRandom('legendre');
    for (let trial = 0; trial < 200; trial += 1) {
      const k = rng.uniform(0, 0.999_999);
      const kp = Math.sqrt(1 - k * k);
      const value =
        ellipticE(k) * ellipticK(kp) + ellipticE(kp) * ellipticK(k) - ellipticK(k) * ellipticK(kp);
      expect(value).toBeCloseTo(Math.PI / 2, 11);
    }
  });

  it('give Π(0, k) = K(k) and Π(n, 0) = π / (2√(1 − n)) (from the definition, A&S 17.7.2)', () => {
    expect(ellipticPi(0, 0.7)).toBeCloseTo(ellipticK(0.7), 14);
    expect(ellipticPi(-3, 0)).toBeCloseTo(Math.PI / (2 * Math.sqrt(4)), 14);
    expect(ellipticPi(0.6, 0)).toBeCloseTo(Math.PI / (2 * Math.sqrt(0.4)), 14);
  });

  it('agree with quadrature of the definition of Π on random characteristics and moduli', () => {
    const rng = createRandom('pi-quadrature');
    for (let trial = 0; trial < 60; trial += 1) {
      const k = rng.uniform(0, 0.98);
      const n = trial % 2 === 0 ? -rng.logUniform(1e-3, 1e3) : rng.uniform(0, 0.9);
      const expected = ellipticPiByQuadrature(n, k);
      expect(Math.abs(ellipticPi(n, k) / expected - 1)).toBeLessThan(1e-9);
    }
  });

  it('reject a modulus outside [0, 1) and kc = 0, naming the argument', () => {
    expect(() => ellipticK(1)).toThrow(/k \(elliptic modulus\) must be in \[0, 1\), got 1/);
    expect(() => ellipticE(-0.1)).toThrow(ScienceInputError);
    expect(() => ellipticPi(1, 0.5)).toThrow(/n \(characteristic\) must not be 1/);
    expect(() => bulirschCel(0, 1, 1, 1)).toThrow(/kc must be finite and non-zero/);
  });
});

// --- The occultation -------------------------------------------------------------------------------

describe('uniform-disk occultation', () => {
  it('equals the two-circle lens area over π on random separations and radius ratios, p > 1 included', () => {
    const rng = createRandom('lens');
    for (let trial = 0; trial < 500; trial += 1) {
      const p = rng.logUniform(0.005, 2);
      const z = rng.uniform(0, 1 + p + 0.1);
      expect(uniformOccultedFraction(z, p)).toBeCloseTo(lensArea(z, p) / Math.PI, 13);
      expect(occultedFluxQuadratic(z, p, 0, 0)).toBeCloseTo(1 - lensArea(z, p) / Math.PI, 13);
    }
  });

  it('hides p² with the planet inside the disk, all of it when p > 1 covers the star, nothing past contact', () => {
    expect(uniformOccultedFraction(0.3, 0.1)).toBeCloseTo(0.01, 15);
    expect(uniformOccultedFraction(0.1, 1.5)).toBe(1);
    expect(uniformOccultedFraction(1.1, 0.1)).toBe(0);
  });
});

describe('quadratic limb-darkened occultation (Mandel & Agol 2002)', () => {
  it('for k = 0.1, u1 = 0.4, u2 = 0.26 loses 0.01213 at z = 0, 0.008169 at z = 0.9, 0.003360 at z = 1.0 (values from the issue)', () => {
    // Issue 4 gives these to four significant figures; our numerical integration over the occulted area
    // (fluxByIntegration) and numpy's midpoint sum (astropy-reference.json) reproduce them.
    const lost = (z: number) => 1 - occultedFluxQuadratic(z, 0.1, 0.4, 0.26);
    expect(lost(0)).toBeCloseTo(0.01213, 5);
    expect(lost(0.9)).toBeCloseTo(0.008169, 6);
    expect(lost(1.0)).toBeCloseTo(0.00336, 6);
    for (const z of [0, 0.9, 1.0]) {
      expect(lost(z)).toBeCloseTo(1 - fluxByIntegration(z, 0.1, 0.4, 0.26), 8);
      const numpy = reference.limbDarkenedLightLost.byZ[z.toFixed(1) as '0.0' | '0.9' | '1.0'];
      expect(lost(z)).toBeCloseTo(numpy, 8);
    }
  });

  it('agrees with numerical integration over the occulted disk on random planets, limb darkening and positions', () => {
    const rng = createRandom('mandel-agol-vs-integration');
    for (let trial = 0; trial < 300; trial += 1) {
      const p = trial % 10 === 0 ? rng.uniform(0.5, 1.5) : rng.logUniform(0.005, 0.5);
      const z = rng.uniform(0, 1 + p);
      const u1 = rng.uniform(0, 1);
      const u2 = rng.uniform(-u1 / 2, 1 - u1);
      expect(Math.abs(occultedFluxQuadratic(z, p, u1, u2) - fluxByIntegration(z, p, u1, u2))).toBeLessThan(
        2e-8,
      );
    }
  });

  it('is continuous through the special cases z = 0, z = p, z = 1 − p and p = z = 1/2', () => {
    const cases: [p: number, z: number][] = [
      [0.1, 0],
      [0.1, 0.1],
      [0.1, 0.9],
      [0.7, 0.7],
      [0.7, 0.3],
      [0.5, 0.5],
      [1.3, 1.3],
      [1.3, 0.3],
    ];
    for (const [p, z] of cases) {
      for (const offset of [-1e-6, -1e-10, 0, 1e-10, 1e-6]) {
        const zz = Math.max(0, z + offset);
        const model = occultedFluxQuadratic(zz, p, 0.4, 0.26);
        expect(Math.abs(model - fluxByIntegration(zz, p, 0.4, 0.26))).toBeLessThan(2e-8);
      }
    }
  });

  it('for a small planet at mid-transit matches the small-planet limit δ = k² I(μ)/(4Ω) (Mandel & Agol 2002 §5)', () => {
    // §5: for p ≪ 1 the blocked light is the planet's area times the intensity under it, πk² I(μ) with
    // μ = √(1 − b²), over the disk's total π(1 − u₁/3 − u₂/6) = 4πΩ; so δ ≈ k² I(μ)/(4Ω), to O(k²).
    const k = 0.01;
    const u1 = 0.4;
    const u2 = 0.26;
    for (const b of [0, 0.3, 0.6, 0.8]) {
      const limit = (k * k * quadraticIntensity(b, u1, u2)) / (1 - u1 / 3 - u2 / 6);
      const depth = 1 - occultedFluxQuadratic(b, k, u1, u2);
      expect(Math.abs(depth / limit - 1)).toBeLessThan(2e-4);
    }
  });

  it('blocks all the light when a body larger than the star covers it', () => {
    expect(occultedFluxQuadratic(0.2, 1.5, 0.4, 0.26)).toBe(0);
  });
});

// --- Light curves and durations --------------------------------------------------------------------

const hotJupiter = {
  periodDays: 3.5,
  t0Days: 100,
  radiusRatio: 0.12,
  aOverRstar: 8.8,
  impact: 0.5,
  u1: 0.4,
  u2: 0.26,
};

function grid(startDays: number, endDays: number, count: number): Float64Array {
  return Float64Array.from(
    { length: count },
    (_, i) => startDays + ((endDays - startDays) * i) / (count - 1),
  );
}

describe('transitFlux', () => {
  const t14 = totalDurationDays(hotJupiter);

  it('is exactly 1 outside the contact points and below 1 between them', () => {
    const times = grid(99, 101, 4001);
    const flux = transitFlux(times, hotJupiter);
    for (let i = 0; i < times.length; i += 1) {
      const offset = Math.abs(times[i]! - hotJupiter.t0Days);
      if (offset > t14 / 2 + 1e-9) expect(flux[i]).toBe(1);
      if (offset < t14 / 2 - 1e-6) expect(flux[i]).toBeLessThan(1);
    }
  });

  it('is symmetric about t0 and repeats every period', () => {
    const offsets = grid(0, t14, 301);
    const after = transitFlux(
      offsets.map((dt) => hotJupiter.t0Days + dt),
      hotJupiter,
    );
    const before = transitFlux(
      offsets.map((dt) => hotJupiter.t0Days - dt),
      hotJupiter,
    );
    const later = transitFlux(
      offsets.map((dt) => hotJupiter.t0Days + 7 * hotJupiter.periodDays + dt),
      hotJupiter,
    );
    for (let i = 0; i < offsets.length; i += 1) {
      expect(after[i]).toBeCloseTo(before[i]!, 12);
      expect(later[i]).toBeCloseTo(after[i]!, 9);
    }
  });

  it('at mid-transit equals the occultation at z = b, and shows no secondary eclipse half a period later', () => {
    const [mid, opposite] = transitFlux(Float64Array.of(100, 100 + 1.75), hotJupiter);
    expect(mid).toBeCloseTo(occultedFluxQuadratic(0.5, 0.12, 0.4, 0.26), 14);
    expect(opposite).toBe(1);
  });

  it('when supersampled equals the exposure mean of the instantaneous model (dense average)', () => {
    const exposureDays = 30 / 1440;
    const times = grid(99.8, 100.2, 97);
    const binned = transitFlux(times, { ...hotJupiter, supersample: 15, exposureDays });
    for (let i = 0; i < times.length; i += 1) {
      const dense = transitFlux(
        grid(times[i]! - exposureDays / 2, times[i]! + exposureDays / 2, 2001),
        hotJupiter,
      );
      const mean = dense.reduce((sum, value) => sum + value, 0) / dense.length;
      expect(Math.abs(binned[i]! - mean)).toBeLessThan(1e-5);
    }
    const instant = transitFlux(times, hotJupiter);
    expect(transitFlux(times, { ...hotJupiter, supersample: 1 })).toEqual(instant);
  });

  it('names the bad parameter and the allowed range', () => {
    const times = Float64Array.of(100);
    expect(() => transitFlux(times, { ...hotJupiter, periodDays: 0 })).toThrow(
      /periodDays must be > 0, got 0/,
    );
    expect(() => transitFlux(times, { ...hotJupiter, aOverRstar: 0.9 })).toThrow(/aOverRstar must be > 1/);
    expect(() => transitFlux(times, { ...hotJupiter, impact: 9 })).toThrow(
      /impact must be in \[0, aOverRstar\)/,
    );
    expect(() => transitFlux(times, { ...hotJupiter, radiusRatio: -0.1 })).toThrow(/radiusRatio must be > 0/);
    expect(() => transitFlux(times, { ...hotJupiter, u1: 0.9, u2: 0.3 })).toThrow(/u1, u2 must give/);
    expect(() => transitFlux(times, { ...hotJupiter, supersample: 3 })).toThrow(/exposureDays must be > 0/);
    expect(() => transitFlux(times, { ...hotJupiter, supersample: 2.5, exposureDays: 0.01 })).toThrow(
      /supersample must be an integer ≥ 1/,
    );
  });
});

describe('transit durations (Seager & Mallén-Ornelas 2003; Winn 2010 eq. 14–16)', () => {
  it('place the first and second contacts where the separation is 1 + k and 1 − k', () => {
    const t14 = totalDurationDays(hotJupiter);
    const t23 = fullDurationDays(hotJupiter);
    expect(projectedSeparation(hotJupiter.t0Days + t14 / 2, hotJupiter)).toBeCloseTo(1.12, 12);
    expect(projectedSeparation(hotJupiter.t0Days - t23 / 2, hotJupiter)).toBeCloseTo(0.88, 12);
  });

  it('for a wide orbit approach the small-angle form T ≈ (P/π) √((1 ± k)² − b²)/(a/R★) (Winn 2010 eq. 16)', () => {
    const wide = { periodDays: 365, radiusRatio: 0.01, aOverRstar: 215, impact: 0.3 };
    const approxT14 = (wide.periodDays / Math.PI) * (Math.sqrt(1.01 ** 2 - 0.09) / 215);
    const approxT23 = (wide.periodDays / Math.PI) * (Math.sqrt(0.99 ** 2 - 0.09) / 215);
    expect(totalDurationDays(wide) / approxT14 - 1).toBeLessThan(1e-4);
    expect(fullDurationDays(wide) / approxT23 - 1).toBeLessThan(1e-4);
  });

  it('give no full phase for a grazing transit and no transit beyond b = 1 + k', () => {
    expect(fullDurationDays({ ...hotJupiter, impact: 0.95 })).toBe(0);
    expect(totalDurationDays({ ...hotJupiter, impact: 0.95 })).toBeGreaterThan(0);
    expect(totalDurationDays({ ...hotJupiter, impact: 1.2 })).toBe(0);
  });
});
