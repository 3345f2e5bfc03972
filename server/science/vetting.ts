// A candidate's derived parameters and its vetting diagnostics, each marked pass or warn with its
// number. Pure: a transit's measurements and its star in, numbers and verdicts out.
import {
  equilibriumTemperature,
  expectedDurationHours,
  planetRadiusFromDepth,
  scaledSemiMajorAxis,
  semiMajorAxisFromPeriod,
  singleTransitPeriodRange,
  stellarDensityFromMassRadius,
  transitProbability,
} from './derived-parameters';
import { FLAT_SHARE_MIN, type ShapeFit } from './transit-shape';

export interface TransitMeasurement {
  /** Null for a single transit. */
  periodDays: number | null;
  periodErrDays?: number | null;
  depthPpm: number;
  depthErrPpm?: number | null;
  durationHours: number;
  snr: number;
  /** |odd − even| in σ, from the period search; null when not measured. */
  oddEvenDifferenceSigma?: number | null;
  depthSecondaryPpm?: number | null;
  depthSecondaryErrPpm?: number | null;
  /** The fitted trapezoid (see transit-shape.ts); null when the data could not tell, absent when not fitted. */
  shape?: ShapeFit | null;
}

export interface Star {
  radiusRsun: number;
  massMsun: number;
  teffK: number;
}

export interface Diagnostic {
  code: 'snr' | 'radius' | 'odd_even' | 'secondary' | 'shape' | 'duration';
  label: string;
  value: number | null;
  verdict: 'pass' | 'warn';
  detail: string;
}

/** The campaign's SNR threshold when it has none: 7.1 (common practice, after the Kepler pipeline's). */
export const DEFAULT_SNR_THRESHOLD = 7.1;
/** Above two Jupiter radii an eclipsing binary is likely (common practice). */
export const MAX_PLANET_RADIUS_JUPITER = 2;
/** Odd and even depths, or a secondary eclipse, this many σ apart from nothing: our own threshold (3σ). */
export const SIGMA_WARN = 3;
/** A V must fit better than the best flat-bottomed trapezoid by this Δχ² to warn: 3σ for one parameter (common practice). */
export const SHAPE_DELTA_CHI_SQUARE = 9;
/** Observed over expected (central) duration outside this range: the star's density does not fit. Our own range. */
export const DURATION_RATIO_RANGE = [0.25, 1.5] as const;

const round = (value: number, digits = 2) => Number(value.toFixed(digits));

export function derivedParameters(transit: TransitMeasurement, star: Star) {
  const radius = planetRadiusFromDepth({
    depthPpm: transit.depthPpm,
    depthErrPpm: transit.depthErrPpm ?? 0,
    stellarRadiusRsun: star.radiusRsun,
  });
  const density = stellarDensityFromMassRadius({
    stellarMassMsun: star.massMsun,
    stellarRadiusRsun: star.radiusRsun,
  });
  if (transit.periodDays === null) {
    const range =
      radius.radiusRatio < 1
        ? singleTransitPeriodRange({
            durationHours: transit.durationHours,
            stellarDensityGcm3: density,
            radiusRatio: radius.radiusRatio,
          })
        : null;
    return { radius, stellarDensityGcm3: density, singleTransitPeriodRange: range, orbit: null };
  }
  const semiMajorAxis = semiMajorAxisFromPeriod({
    periodDays: transit.periodDays,
    periodErrDays: transit.periodErrDays ?? 0,
    stellarMassMsun: star.massMsun,
  });
  const scaled = scaledSemiMajorAxis({
    semiMajorAxisAu: semiMajorAxis.semiMajorAxisAu,
    stellarRadiusRsun: star.radiusRsun,
  });
  const probability = transitProbability({
    stellarRadiusRsun: star.radiusRsun,
    planetRadiusEarth: radius.radiusEarth,
    planetRadiusErrEarth: radius.radiusEarthErr,
    semiMajorAxisAu: semiMajorAxis.semiMajorAxisAu,
    semiMajorAxisErrAu: semiMajorAxis.semiMajorAxisErrAu,
  });
  const temperature = equilibriumTemperature({
    stellarTeffK: star.teffK,
    stellarRadiusRsun: star.radiusRsun,
    semiMajorAxisAu: semiMajorAxis.semiMajorAxisAu,
  });
  return {
    radius,
    stellarDensityGcm3: density,
    singleTransitPeriodRange: null,
    orbit: {
      semiMajorAxisAu: semiMajorAxis.semiMajorAxisAu,
      semiMajorAxisErrAu: semiMajorAxis.semiMajorAxisErrAu,
      aOverRstar: scaled.aOverRstar,
      equilibriumTemperatureK: temperature.temperatureK,
      transitProbability: probability.probability,
      transitProbabilityErr: probability.probabilityErr,
      statement: transitProbabilityStatement(probability.probability),
    },
  };
}

/** What a transit probability p implies, in plain words (the geometric argument: 1/p systems per transiting one). */
export function transitProbabilityStatement(probability: number): string {
  const others = Math.max(0, Math.round(1 / probability) - 1);
  return `The chance that such an orbit transits from our view is ${round(probability * 100, 2)} %: for each such planet seen transiting, about ${others} more exist around stars like this that do not transit from our view.`;
}

/** The vetting diagnostics: a planet passes them all; an eclipsing binary or a systematic warns on some. */
export function vettingDiagnostics(
  transit: TransitMeasurement,
  star: Star,
  snrThreshold = DEFAULT_SNR_THRESHOLD,
): Diagnostic[] {
  const derived = derivedParameters(transit, star);
  const diagnostics: Diagnostic[] = [];
  diagnostics.push({
    code: 'snr',
    label: 'Signal-to-noise ratio',
    value: round(transit.snr, 1),
    verdict: transit.snr >= snrThreshold ? 'pass' : 'warn',
    detail: `SNR ${round(transit.snr, 1)} against the campaign's threshold ${snrThreshold}`,
  });
  diagnostics.push({
    code: 'radius',
    label: 'Planet radius',
    value: round(derived.radius.radiusJupiter, 2),
    verdict: derived.radius.radiusJupiter <= MAX_PLANET_RADIUS_JUPITER ? 'pass' : 'warn',
    detail: `${round(derived.radius.radiusJupiter, 2)} RJ (${round(derived.radius.radiusEarth, 1)} R⊕); above ${MAX_PLANET_RADIUS_JUPITER} RJ an eclipsing binary is likely`,
  });
  if (transit.oddEvenDifferenceSigma !== undefined && transit.oddEvenDifferenceSigma !== null) {
    const sigma = transit.oddEvenDifferenceSigma;
    diagnostics.push({
      code: 'odd_even',
      label: 'Odd and even depths',
      value: round(sigma, 1),
      verdict: sigma < SIGMA_WARN ? 'pass' : 'warn',
      detail: `Odd and even transits differ by ${round(sigma, 1)}σ (warn from ${SIGMA_WARN}σ: a binary at twice the period)`,
    });
  }
  if (typeof transit.depthSecondaryPpm === 'number' && typeof transit.depthSecondaryErrPpm === 'number') {
    const significance =
      transit.depthSecondaryErrPpm > 0 ? transit.depthSecondaryPpm / transit.depthSecondaryErrPpm : 0;
    diagnostics.push({
      code: 'secondary',
      label: 'Secondary eclipse at phase 0.5',
      value: round(significance, 1),
      verdict: significance < SIGMA_WARN ? 'pass' : 'warn',
      detail: `A dip of ${round(transit.depthSecondaryPpm, 0)} ppm at phase 0.5 (${round(significance, 1)}σ; warn from ${SIGMA_WARN}σ)`,
    });
  }
  if (transit.shape !== undefined) diagnostics.push(shapeDiagnostic(transit.shape));
  if (transit.periodDays !== null && derived.radius.radiusRatio < 1) {
    const expected = expectedDurationHours({
      periodDays: transit.periodDays,
      stellarDensityGcm3: derived.stellarDensityGcm3,
      radiusRatio: derived.radius.radiusRatio,
    });
    const ratio = transit.durationHours / expected;
    diagnostics.push({
      code: 'duration',
      label: 'Duration against the star’s density',
      value: round(ratio, 2),
      verdict: ratio >= DURATION_RATIO_RANGE[0] && ratio <= DURATION_RATIO_RANGE[1] ? 'pass' : 'warn',
      detail: `${round(transit.durationHours, 1)} h observed, ${round(expected, 1)} h expected for a central transit (ratio ${round(ratio, 2)}; warn outside ${DURATION_RATIO_RANGE.join('–')})`,
    });
  }
  return diagnostics;
}

function shapeDiagnostic(shape: ShapeFit | null): Diagnostic {
  const label = 'V-shape or flat bottom';
  if (shape === null) {
    return {
      code: 'shape',
      label,
      value: null,
      verdict: 'warn',
      detail: 'Too few points in the transit to tell a V from a flat bottom: look at the fold',
    };
  }
  const share = round(shape.flatShare * 100, 0);
  const preference = shape.flatChiSquare - shape.chiSquare;
  const vShaped = shape.flatShare < FLAT_SHARE_MIN && preference > SHAPE_DELTA_CHI_SQUARE;
  return {
    code: 'shape',
    label,
    value: round(shape.flatShare, 2),
    verdict: vShaped ? 'warn' : 'pass',
    detail: vShaped
      ? `V-shaped: flat for ${share} % of the ${round(shape.totalDurationHours, 1)} h transit, and the best flat-bottomed fit is worse by Δχ² = ${round(preference, 1)} (a grazing eclipsing binary is likely)`
      : `Flat for ${share} % of the ${round(shape.totalDurationHours, 1)} h transit (warn below ${FLAT_SHARE_MIN * 100} % when a flat bottom fits worse by Δχ² > ${SHAPE_DELTA_CHI_SQUARE})`,
  };
}
