// The Larkspur Transit Survey: an invented survey of invented stars, generated deterministically from a
// seed for the demo and the tests. Each target gets a light curve with white noise set by its magnitude,
// spot modulation and granulation-like red noise, instrumental ramps, jumps and gaps, and — for some —
// transiting planets or an eclipsing binary, with the truth recorded.

import {
  EARTH_EQUATORIAL_RADIUS_M,
  HOURS_PER_DAY,
  JUPITER_EQUATORIAL_RADIUS_M,
  MINUTES_PER_DAY,
  PPM_PER_UNIT,
  SOLAR_EFFECTIVE_TEMPERATURE_K,
  SOLAR_RADIUS_M,
} from './constants';
import { aOverRstarFromDensity, stellarDensityFromMassRadius } from './derived-parameters';
import { createRandom, type Random } from './random';
import { occultedFluxQuadratic, totalDurationDays, transitFlux } from './transit-model';
import { ScienceInputError } from './types';

export const SURVEY_NAME = 'Larkspur Transit Survey';

/** The survey's time origin: times are days since the invented survey reference epoch. */
export const SURVEY_START_DAYS = 1000;

/** Centre and radius of the survey's one (invented) field. */
export const SURVEY_FIELD = { raDeg: 243.2, decDeg: 52.7, radiusDeg: 6 } as const;

export interface SyntheticSurveyOptions {
  seed: number | string;
  /** Number of targets, 1–10 000. */
  targetCount: number;
  /** Length of the light curves (days), 2–400; default 27. */
  baselineDays?: number;
  /** Cadence (minutes): 2 or 10; default 10. */
  cadenceMinutes?: 2 | 10;
}

export interface SyntheticLightCurve {
  timeDays: Float64Array;
  /** Relative flux (about 1). */
  flux: Float64Array;
  /** Relative flux error: the white-noise σ per point. */
  fluxErr: Float64Array;
}

export interface SyntheticPlanet {
  periodDays: number;
  t0Days: number;
  radiusRatio: number;
  radiusEarth: number;
  aOverRstar: number;
  impact: number;
  u1: number;
  u2: number;
  /** Mid-transit depth, limb darkening included (ppm). */
  depthPpm: number;
  /** T₁₄ (hours). */
  durationHours: number;
  /** Mid-transit times that fall on data (days). */
  transitTimesDays: number[];
  /** depth/σ · √(points in transit), summed over the transits on data. */
  expectedSnr: number;
}

export interface SyntheticBinary {
  periodDays: number;
  /** Time of one primary eclipse (days); secondaries fall half a period later. */
  t0Days: number;
  primaryDepthPpm: number;
  secondaryDepthPpm: number;
  /** Eclipse duration T₁₄ (hours). */
  durationHours: number;
  /** Geometry used for the (grazing, V-shaped) eclipse profile. */
  radiusRatio: number;
  impact: number;
  aOverRstar: number;
  primaryTimesDays: number[];
  secondaryTimesDays: number[];
}

export interface SyntheticTruth {
  kind: 'planet' | 'eclipsing-binary' | 'quiet';
  /** White noise (ppm per point, and per hour). */
  noisePpmPerPoint: number;
  noisePpmPerHour: number;
  variability: {
    rotationPeriodDays: number;
    spotAmplitudePpm: number;
    /** Phase coherence time of the spot pattern (days). */
    spotEvolutionDays: number;
    granulationPpm: number;
    granulationTimescaleDays: number;
  };
  systematics: {
    gaps: { startDays: number; endDays: number }[];
    /** Exponential settling after the start of each data segment: flux × (1 − A e^{−Δt/τ}). */
    ramps: { startDays: number; amplitudePpm: number; timescaleDays: number }[];
    /** Steps in flux, lasting to the end of their segment. */
    jumps: { timeDays: number; sizePpm: number }[];
  };
  planets: SyntheticPlanet[];
  binary: SyntheticBinary | null;
}

export interface SyntheticTarget {
  designation: string;
  raDeg: number;
  decDeg: number;
  magnitude: number;
  stellarRadiusRsun: number;
  stellarMassMsun: number;
  effectiveTemperatureK: number;
  lightCurve: SyntheticLightCurve;
  truth: SyntheticTruth;
}

export interface SyntheticSurvey {
  surveyName: typeof SURVEY_NAME;
  seed: number | string;
  baselineDays: number;
  cadenceMinutes: 2 | 10;
  startDays: number;
  /** The downlink gap shared by every target. */
  downlinkGap: { startDays: number; endDays: number };
  targets: SyntheticTarget[];
}

/**
 * White noise of the invented survey's photometry over one hour, by magnitude: photon noise
 * (σ ∝ 10^{0.2 m}, 200 ppm at magnitude 10), sky background (σ ∝ 10^{0.4 m}, 1500 ppm at magnitude 15)
 * and a 60 ppm systematic floor, added in quadrature. An approximation of the shape of space-photometry
 * noise curves, not a model of any instrument.
 *
 * @param magnitude - the target's magnitude (about 6–17)
 * @returns σ over one hour (ppm)
 */
export function noisePpmPerHour(magnitude: number): number {
  const photon = 200 * 10 ** (0.2 * (magnitude - 10));
  const sky = 1500 * 10 ** (0.4 * (magnitude - 15));
  const floor = 60;
  return Math.sqrt(photon * photon + sky * sky + floor * floor);
}

/**
 * A main-sequence star of a given mass, by power-law rules of thumb (common practice for roughly
 * 0.3–1.5 M☉): R ∝ M^0.8, L ∝ M^4, so T_eff = T☉ (L/R²)^{1/4} = T☉ M^0.6.
 *
 * @param stellarMassMsun - M★ (M☉), 0.1–2
 * @returns radius (R☉) and effective temperature (K)
 */
export function mainSequenceStar(stellarMassMsun: number): {
  stellarRadiusRsun: number;
  effectiveTemperatureK: number;
} {
  const radius = stellarMassMsun ** 0.8;
  const luminosity = stellarMassMsun ** 4;
  return {
    stellarRadiusRsun: radius,
    effectiveTemperatureK: SOLAR_EFFECTIVE_TEMPERATURE_K * (luminosity / (radius * radius)) ** 0.25,
  };
}

/**
 * Rough quadratic limb-darkening coefficients for a red-optical band by effective temperature: u₁ falls
 * from 0.6 at 3500 K to 0.3 at 7000 K, u₂ = 0.22. An approximation for invented stars (values of this size
 * are common practice), not a fit to model-atmosphere tables.
 */
export function approximateLimbDarkening(effectiveTemperatureK: number): { u1: number; u2: number } {
  const u1 = Math.min(0.6, Math.max(0.3, 0.6 - (0.3 * (effectiveTemperatureK - 3500)) / 3500));
  return { u1, u2: 0.22 };
}

const RADIUS_EARTH_IN_RSUN = EARTH_EQUATORIAL_RADIUS_M / SOLAR_RADIUS_M;
const RADIUS_JUPITER_IN_EARTH = JUPITER_EQUATORIAL_RADIUS_M / EARTH_EQUATORIAL_RADIUS_M;

interface Segment {
  startIndex: number;
  endIndex: number;
}

function buildTimes(
  startDays: number,
  baselineDays: number,
  cadenceDays: number,
  gaps: { startDays: number; endDays: number }[],
): { timeDays: Float64Array; segments: Segment[] } {
  const count = Math.floor(baselineDays / cadenceDays);
  const times: number[] = [];
  const segments: Segment[] = [];
  let inSegment = false;
  for (let i = 0; i < count; i += 1) {
    const t = startDays + i * cadenceDays;
    const inGap = gaps.some((gap) => t >= gap.startDays && t < gap.endDays);
    if (inGap) {
      if (inSegment) segments[segments.length - 1]!.endIndex = times.length;
      inSegment = false;
      continue;
    }
    if (!inSegment) segments.push({ startIndex: times.length, endIndex: times.length });
    inSegment = true;
    times.push(t);
  }
  if (inSegment) segments[segments.length - 1]!.endIndex = times.length;
  return { timeDays: Float64Array.from(times), segments };
}

function timesOnData(
  t0Days: number,
  periodDays: number,
  timeDays: Float64Array,
  cadenceDays: number,
): number[] {
  const first = timeDays[0]!;
  const last = timeDays[timeDays.length - 1]!;
  const out: number[] = [];
  let n = Math.ceil((first - t0Days) / periodDays);
  for (let t = t0Days + n * periodDays; t <= last; n += 1, t = t0Days + n * periodDays) {
    if (hasDataNear(timeDays, t, cadenceDays)) out.push(t);
  }
  return out;
}

function hasDataNear(timeDays: Float64Array, t: number, cadenceDays: number): boolean {
  let lo = 0;
  let hi = timeDays.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (timeDays[mid]! < t) lo = mid + 1;
    else hi = mid;
  }
  const near = (i: number) => i >= 0 && i < timeDays.length && Math.abs(timeDays[i]! - t) <= cadenceDays;
  return near(lo) || near(lo - 1);
}

function drawMagnitude(rng: Random): number {
  // Star counts rising as N(<m) ∝ 10^{0.3 m} between 8 and 15 (a rule of thumb for star counts).
  const lo = 10 ** (0.3 * 8);
  const hi = 10 ** (0.3 * 15);
  return Math.log10(lo + rng.next() * (hi - lo)) / 0.3;
}

function drawPosition(rng: Random): { raDeg: number; decDeg: number } {
  const radius = SURVEY_FIELD.radiusDeg * Math.sqrt(rng.next());
  const angle = rng.uniform(0, 2 * Math.PI);
  const decDeg = SURVEY_FIELD.decDeg + radius * Math.sin(angle);
  const raDeg =
    (SURVEY_FIELD.raDeg + (radius * Math.cos(angle)) / Math.cos((decDeg * Math.PI) / 180) + 360) % 360;
  return { raDeg, decDeg };
}

interface DrawContext {
  rng: Random;
  timeDays: Float64Array;
  cadenceDays: number;
  noise: number;
  density: number;
  stellarRadiusRsun: number;
  u1: number;
  u2: number;
  supersample: number;
}

function drawPlanet(context: DrawContext, periodDays: number, singleTransit: boolean): SyntheticPlanet {
  const { rng, timeDays, cadenceDays } = context;
  const first = timeDays[0]!;
  const last = timeDays[timeDays.length - 1]!;
  const radiusEarth = rng.logUniform(1, RADIUS_JUPITER_IN_EARTH);
  const radiusRatio = (radiusEarth * RADIUS_EARTH_IN_RSUN) / context.stellarRadiusRsun;
  const impact = rng.uniform(0, 0.9);
  const aOverRstar = Math.max(aOverRstarFromDensity({ stellarDensityGcm3: context.density, periodDays }), 2);
  // A long period: t0 in [last − P, first + P], so exactly one transit falls within the baseline.
  let t0Days = singleTransit
    ? rng.uniform(last - periodDays, first + periodDays)
    : first + rng.next() * periodDays;
  let transitTimesDays = timesOnData(t0Days, periodDays, timeDays, cadenceDays);
  for (let attempt = 0; transitTimesDays.length === 0 && attempt < 50; attempt += 1) {
    t0Days = singleTransit
      ? rng.uniform(last - periodDays, first + periodDays)
      : first + rng.next() * periodDays;
    transitTimesDays = timesOnData(t0Days, periodDays, timeDays, cadenceDays);
  }
  const geometry = { periodDays, radiusRatio, aOverRstar, impact };
  const durationDays = totalDurationDays(geometry);
  const depth = 1 - occultedFluxQuadratic(impact, radiusRatio, context.u1, context.u2);
  const pointsInTransit = (durationDays / cadenceDays) * transitTimesDays.length;
  return {
    periodDays,
    t0Days,
    radiusRatio,
    radiusEarth,
    aOverRstar,
    impact,
    u1: context.u1,
    u2: context.u2,
    depthPpm: depth * PPM_PER_UNIT,
    durationHours: durationDays * HOURS_PER_DAY,
    transitTimesDays,
    expectedSnr: (depth / context.noise) * Math.sqrt(pointsInTransit),
  };
}

function drawBinary(context: DrawContext): SyntheticBinary {
  const { rng, timeDays, cadenceDays } = context;
  const periodDays = rng.logUniform(0.6, 12);
  // A grazing geometry (1 − k < b < 1 + k) gives the V shape; the depths are then set freely, as if the
  // eclipsed light were diluted by the rest of the system.
  const radiusRatio = rng.uniform(0.4, 1);
  const impact = rng.uniform(1 - 0.5 * radiusRatio, 1 + 0.4 * radiusRatio);
  const massRatio = rng.uniform(0.3, 1);
  const aOverRstar = Math.max(
    aOverRstarFromDensity({ stellarDensityGcm3: context.density * (1 + massRatio), periodDays }),
    1.2 + impact,
  );
  const primaryDepthPpm = rng.logUniform(3000, 200_000);
  const secondaryDepthPpm = primaryDepthPpm * rng.uniform(0.1, 0.7);
  const t0Days = timeDays[0]! + rng.next() * periodDays;
  const durationDays = totalDurationDays({ periodDays, radiusRatio, aOverRstar, impact });
  return {
    periodDays,
    t0Days,
    primaryDepthPpm,
    secondaryDepthPpm,
    durationHours: durationDays * HOURS_PER_DAY,
    radiusRatio,
    impact,
    aOverRstar,
    primaryTimesDays: timesOnData(t0Days, periodDays, timeDays, cadenceDays),
    secondaryTimesDays: timesOnData(t0Days + periodDays / 2, periodDays, timeDays, cadenceDays),
  };
}

function multiplyEclipses(context: DrawContext, binary: SyntheticBinary, flux: Float64Array): void {
  const { timeDays } = context;
  const base = {
    periodDays: binary.periodDays,
    radiusRatio: binary.radiusRatio,
    aOverRstar: binary.aOverRstar,
    impact: binary.impact,
    u1: context.u1,
    u2: context.u2,
    supersample: context.supersample,
    exposureDays: context.cadenceDays,
  };
  const deepest = 1 - occultedFluxQuadratic(binary.impact, binary.radiusRatio, context.u1, context.u2);
  const primary = transitFlux(timeDays, { ...base, t0Days: binary.t0Days });
  const secondary = transitFlux(timeDays, { ...base, t0Days: binary.t0Days + binary.periodDays / 2 });
  const primaryScale = binary.primaryDepthPpm / PPM_PER_UNIT / deepest;
  const secondaryScale = binary.secondaryDepthPpm / PPM_PER_UNIT / deepest;
  for (let i = 0; i < flux.length; i += 1) {
    flux[i]! *= (1 - primaryScale * (1 - primary[i]!)) * (1 - secondaryScale * (1 - secondary[i]!));
  }
}

function generateTarget(
  rng: Random,
  designation: string,
  kind: SyntheticTruth['kind'],
  startDays: number,
  baselineDays: number,
  cadenceDays: number,
  downlinkGap: { startDays: number; endDays: number },
): SyntheticTarget {
  const { raDeg, decDeg } = drawPosition(rng);
  const magnitude = drawMagnitude(rng);
  const stellarMassMsun = rng.logUniform(0.35, 1.4);
  const star = mainSequenceStar(stellarMassMsun);
  const stellarRadiusRsun = star.stellarRadiusRsun * (1 + rng.normal(0, 0.03));
  const effectiveTemperatureK = star.effectiveTemperatureK * (1 + rng.normal(0, 0.015));
  const density = stellarDensityFromMassRadius({ stellarMassMsun, stellarRadiusRsun });
  const { u1, u2 } = approximateLimbDarkening(effectiveTemperatureK);
  const hourly = noisePpmPerHour(magnitude);
  const noisePpmPerPoint = hourly * Math.sqrt(60 / (cadenceDays * MINUTES_PER_DAY));
  const noise = noisePpmPerPoint / PPM_PER_UNIT;
  const supersample = cadenceDays * MINUTES_PER_DAY > 5 ? 5 : 1;

  // Gaps: the shared downlink gap, and in a third of the targets a short extra loss of data.
  const gaps = [downlinkGap];
  if (rng.next() < 1 / 3) {
    const gapStart = rng.uniform(startDays + 1, startDays + baselineDays - 1);
    gaps.push({ startDays: gapStart, endDays: gapStart + rng.uniform(0.1, 0.4) });
  }
  gaps.sort((a, b) => a.startDays - b.startDays);
  const { timeDays, segments } = buildTimes(startDays, baselineDays, cadenceDays, gaps);
  const count = timeDays.length;

  // Stellar variability: most stars quiet and slow, one in ten young and spotted.
  const active = rng.next() < 0.1;
  const rotationPeriodDays = active ? rng.logUniform(0.8, 6) : rng.logUniform(3, 35);
  const spotAmplitudePpm = active ? rng.logUniform(2000, 15_000) : rng.logUniform(20, 1500);
  const spotEvolutionDays = rotationPeriodDays * rng.uniform(2, 8);
  const granulationPpm = rng.logUniform(10, 60);
  const granulationTimescaleDays = rng.uniform(0.05, 0.25);
  const secondHarmonic = rng.uniform(0.1, 0.5);

  // Systematics: a settling ramp at the start of each data segment (after every gap) and up to two jumps.
  const ramps = segments.map((segment) => ({
    startDays: timeDays[segment.startIndex]!,
    amplitudePpm: rng.uniform(-1, 1) * rng.logUniform(100, 2000),
    timescaleDays: rng.uniform(0.1, 0.6),
  }));
  const jumpCount = rng.int(0, 2);
  const jumps: { timeDays: number; sizePpm: number }[] = [];
  for (let j = 0; j < jumpCount; j += 1) {
    jumps.push({
      timeDays: timeDays[rng.int(1, count - 2)]!,
      sizePpm: (rng.next() < 0.5 ? -1 : 1) * rng.logUniform(80, 600),
    });
  }
  jumps.sort((a, b) => a.timeDays - b.timeDays);

  // Spots: two harmonics of the rotation with phases that random-walk (coherence time spotEvolutionDays)
  // and an amplitude that breathes; granulation as an Ornstein–Uhlenbeck process, exact for uneven steps.
  const flux = new Float64Array(count);
  let phase1 = rng.uniform(0, 2 * Math.PI);
  let phase2 = rng.uniform(0, 2 * Math.PI);
  const breathDays = spotEvolutionDays * rng.uniform(1, 3);
  const breathPhase = rng.uniform(0, 2 * Math.PI);
  const spotAmplitude = spotAmplitudePpm / PPM_PER_UNIT;
  const granulationSd = granulationPpm / PPM_PER_UNIT;
  let granulation = rng.normal(0, granulationSd);
  let segmentIndex = 0;
  let jumpLevel = 0;
  let jumpIndex = 0;
  for (let i = 0; i < count; i += 1) {
    const t = timeDays[i]!;
    const dt = i === 0 ? 0 : t - timeDays[i - 1]!;
    if (dt > 0) {
      const step = Math.sqrt(dt / spotEvolutionDays);
      phase1 += rng.normal(0, step);
      phase2 += rng.normal(0, step);
      // Ornstein–Uhlenbeck exact update: x ← x e^{−Δt/τ} + σ √(1 − e^{−2Δt/τ}) N(0, 1).
      const decay = Math.exp(-dt / granulationTimescaleDays);
      granulation = granulation * decay + granulationSd * Math.sqrt(1 - decay * decay) * rng.normal();
    }
    while (segmentIndex + 1 < segments.length && i >= segments[segmentIndex + 1]!.startIndex) {
      segmentIndex += 1;
      jumpLevel = 0;
    }
    while (jumpIndex < jumps.length && t >= jumps[jumpIndex]!.timeDays) {
      jumpLevel += jumps[jumpIndex]!.sizePpm / PPM_PER_UNIT;
      jumpIndex += 1;
    }
    const omega = (2 * Math.PI * (t - startDays)) / rotationPeriodDays;
    const breath = 1 + 0.3 * Math.sin((2 * Math.PI * t) / breathDays + breathPhase);
    const spots =
      spotAmplitude * breath * (Math.sin(omega + phase1) + secondHarmonic * Math.sin(2 * omega + phase2));
    const ramp = ramps[segmentIndex]!;
    const settle =
      1 - (ramp.amplitudePpm / PPM_PER_UNIT) * Math.exp(-(t - ramp.startDays) / ramp.timescaleDays);
    flux[i] = (1 + spots + granulation) * settle * (1 + jumpLevel);
  }

  const context: DrawContext = {
    rng,
    timeDays,
    cadenceDays,
    noise,
    density,
    stellarRadiusRsun,
    u1,
    u2,
    supersample,
  };
  const planets: SyntheticPlanet[] = [];
  let binary: SyntheticBinary | null = null;
  if (kind === 'planet') {
    const planetCount = rng.next() < 0.2 ? 2 : 1;
    let lastPeriod = 0;
    for (let n = 0; n < planetCount; n += 1) {
      const singleTransit = rng.next() < 0.25;
      let periodDays = singleTransit
        ? baselineDays * rng.uniform(1.05, 3)
        : rng.logUniform(0.7, Math.max(1, baselineDays / 2));
      // Keep two planets' periods apart (ratio ≥ 1.5).
      if (lastPeriod > 0 && Math.abs(Math.log(periodDays / lastPeriod)) < Math.log(1.5)) periodDays *= 1.7;
      lastPeriod = periodDays;
      const planet = drawPlanet(context, periodDays, periodDays > baselineDays);
      planets.push(planet);
      const model = transitFlux(timeDays, {
        periodDays: planet.periodDays,
        t0Days: planet.t0Days,
        radiusRatio: planet.radiusRatio,
        aOverRstar: planet.aOverRstar,
        impact: planet.impact,
        u1,
        u2,
        supersample,
        exposureDays: cadenceDays,
      });
      for (let i = 0; i < count; i += 1) flux[i]! *= model[i]!;
    }
  } else if (kind === 'eclipsing-binary') {
    binary = drawBinary(context);
    multiplyEclipses(context, binary, flux);
  }
  for (let i = 0; i < count; i += 1) flux[i]! += noise * rng.normal();
  return {
    designation,
    raDeg,
    decDeg,
    magnitude,
    stellarRadiusRsun,
    stellarMassMsun,
    effectiveTemperatureK,
    lightCurve: { timeDays, flux, fluxErr: new Float64Array(count).fill(noise) },
    truth: {
      kind,
      noisePpmPerPoint,
      noisePpmPerHour: hourly,
      variability: {
        rotationPeriodDays,
        spotAmplitudePpm,
        spotEvolutionDays,
        granulationPpm,
        granulationTimescaleDays,
      },
      systematics: { gaps, ramps, jumps },
      planets,
      binary,
    },
  };
}

/**
 * Generates the invented Larkspur Transit Survey: targets with designations `LTS-<6 digits>`, positions
 * in one field, magnitudes 8–15, main-sequence stellar parameters, and a light curve each. 15% of targets
 * (rounded) host one or two transiting planets (1 R⊕ to 1 R_J, periods 0.7 d to half the baseline, a
 * quarter longer than the baseline so a single transit shows), 4% are eclipsing binaries (V-shaped, with
 * secondaries of 10–70% of the primary depth), the rest are quiet. Every target has white noise by
 * magnitude (noisePpmPerHour), spots and granulation, ramps, jumps and the shared mid-baseline downlink
 * gap. The same options always give the same survey; each target depends only on the seed and its index.
 *
 * @param options.seed - any number or string
 * @param options.targetCount - 1–10 000
 * @param options.baselineDays - 2–400, default 27
 * @param options.cadenceMinutes - 2 or 10, default 10 (10-minute points are averaged over the exposure)
 * @returns the survey, its targets and their truth
 * @throws ScienceInputError naming the bad option
 */
export function generateSurvey(options: SyntheticSurveyOptions): SyntheticSurvey {
  const { seed, targetCount } = options;
  const baselineDays = options.baselineDays ?? 27;
  const cadenceMinutes = options.cadenceMinutes ?? 10;
  if (!Number.isInteger(targetCount) || targetCount < 1 || targetCount > 10_000) {
    throw new ScienceInputError(`targetCount must be an integer from 1 to 10000, got ${targetCount}`);
  }
  if (!(baselineDays >= 2 && baselineDays <= 400)) {
    throw new ScienceInputError(`baselineDays must be from 2 to 400, got ${baselineDays}`);
  }
  if (cadenceMinutes !== 2 && cadenceMinutes !== 10) {
    throw new ScienceInputError(`cadenceMinutes must be 2 or 10, got ${cadenceMinutes}`);
  }
  const root = createRandom(typeof seed === 'number' ? seed : `lts:${seed}`);
  const layout = root.fork('layout');
  const cadenceDays = cadenceMinutes / MINUTES_PER_DAY;
  const startDays = SURVEY_START_DAYS;
  const gapCentre = startDays + baselineDays / 2 + layout.uniform(-0.5, 0.5);
  const gapLength = Math.min(layout.uniform(0.8, 1.4), baselineDays / 10);
  const downlinkGap = { startDays: gapCentre - gapLength / 2, endDays: gapCentre + gapLength / 2 };

  const planetHosts = Math.round(0.15 * targetCount);
  const binaries = Math.max(targetCount >= 10 ? 1 : 0, Math.round(0.04 * targetCount));
  const kinds: SyntheticTruth['kind'][] = Array.from({ length: targetCount }, (_, i) =>
    i < planetHosts ? 'planet' : i < planetHosts + binaries ? 'eclipsing-binary' : 'quiet',
  );
  for (let i = kinds.length - 1; i > 0; i -= 1) {
    const j = layout.int(0, i);
    [kinds[i], kinds[j]] = [kinds[j]!, kinds[i]!];
  }
  const used = new Set<number>();
  const targets: SyntheticTarget[] = [];
  for (let index = 0; index < targetCount; index += 1) {
    let number = layout.int(0, 999_999);
    while (used.has(number)) number = layout.int(0, 999_999);
    used.add(number);
    const designation = `LTS-${String(number).padStart(6, '0')}`;
    const rng = root.fork(`target:${index}`);
    targets.push(
      generateTarget(rng, designation, kinds[index]!, startDays, baselineDays, cadenceDays, downlinkGap),
    );
  }
  return { surveyName: SURVEY_NAME, seed, baselineDays, cadenceMinutes, startDays, downlinkGap, targets };
}
