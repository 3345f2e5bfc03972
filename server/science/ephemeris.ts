// Ephemerides for the follow-up list: propagating a candidate's transit time and its uncertainty, the
// next transit windows, BJD_TDB ↔ UTC, and whether an observatory can watch a window. Pure; no I/O.
// Positions of the Earth, the Sun and the observer come from astronomy-engine (VSOP87 / NOVAS-style
// rotations; its own accuracy is about an arcminute for the Sun and better for the Earth's position).

import * as Astronomy from 'astronomy-engine';
import { ScienceInputError } from './types';

/** A window with the target closer than this to the Sun is never proposed, whatever the altitudes. */
export const MIN_SUN_SEPARATION_DEG = 30;

/** Default Sun altitude limit for observing: nautical twilight's end (Sun centre 12° below the horizon). */
export const DEFAULT_SUN_ALTITUDE_LIMIT_DEG = -12;

/** Default sampling step of {@link observability}, in minutes. */
export const DEFAULT_STEP_MINUTES = 5;

/** The light time for one astronomical unit, in days: 149 597 870 700 m / 299 792 458 m/s = 499.004 783 836 s. */
const AU_LIGHT_TIME_DAYS = 149_597_870_700 / 299_792_458 / 86_400;

/** TT − TAI, exactly (IAU 1991 Recommendation IV). */
const TT_MINUS_TAI_SECONDS = 32.184;

const UNIX_EPOCH_JD = 2_440_587.5;
const J2000_JD = 2_451_545.0;
const MS_PER_DAY = 86_400_000;
const DEG = Math.PI / 180;

/** At most this many samples per window in {@link observability}, to keep a typo from hanging a request. */
const MAX_SAMPLES = 20_000;

/**
 * TAI − UTC in whole seconds from each UTC date on (IERS Bulletin C; the table as shipped by ERFA /
 * astropy, checked by tests/reference/make_ephemeris_reference.py). UTC before 1972 had fractional
 * steps and rates and is not supported. A leap second announced after 2017-01-01 must be added here.
 */
const LEAP_SECONDS: ReadonlyArray<readonly [isoDate: string, taiMinusUtcSeconds: number]> = [
  ['1972-01-01', 10],
  ['1972-07-01', 11],
  ['1973-01-01', 12],
  ['1974-01-01', 13],
  ['1975-01-01', 14],
  ['1976-01-01', 15],
  ['1977-01-01', 16],
  ['1978-01-01', 17],
  ['1979-01-01', 18],
  ['1980-01-01', 19],
  ['1981-07-01', 20],
  ['1982-07-01', 21],
  ['1983-07-01', 22],
  ['1985-07-01', 23],
  ['1988-01-01', 24],
  ['1990-01-01', 25],
  ['1991-01-01', 26],
  ['1992-07-01', 27],
  ['1993-07-01', 28],
  ['1994-07-01', 29],
  ['1996-01-01', 30],
  ['1997-07-01', 31],
  ['1999-01-01', 32],
  ['2006-01-01', 33],
  ['2009-01-01', 34],
  ['2012-07-01', 35],
  ['2015-07-01', 36],
  ['2017-01-01', 37],
];

const LEAP_SECONDS_JD: ReadonlyArray<readonly [jdUtc: number, taiMinusUtcSeconds: number]> = LEAP_SECONDS.map(
  ([iso, seconds]) => [Date.parse(`${iso}T00:00:00Z`) / MS_PER_DAY + UNIX_EPOCH_JD, seconds] as const,
);

/** 1972-01-01T00:00 UTC as a Julian date: the first entry of the table, where whole leap seconds begin. */
const FIRST_LEAP_JD = 2_441_317.5;

/** A linear ephemeris: the mid-time of a reference transit and the period, each with its 1σ uncertainty. */
export interface Ephemeris {
  /** Mid-time of the reference transit (epoch 0), BJD_TDB. */
  t0BjdTdb: number;
  /** 1σ uncertainty of t0BjdTdb, days, ≥ 0. */
  t0SigmaDays: number;
  /** Orbital period, days, > 0. */
  periodDays: number;
  /** 1σ uncertainty of periodDays, days, ≥ 0. */
  periodSigmaDays: number;
}

export interface PropagatedTime {
  /** Predicted mid-time, BJD_TDB. */
  timeBjdTdb: number;
  /** 1σ uncertainty of the predicted mid-time, days. */
  sigmaDays: number;
}

/** One predicted transit: its epoch, mid-time with uncertainty, and the padded window to watch. */
export interface TransitWindow {
  /** Epoch n: the number of periods since t0BjdTdb. */
  epoch: number;
  midBjdTdb: number;
  sigmaDays: number;
  /** midBjdTdb − (duration/2 + sigmaDays), BJD_TDB. */
  startBjdTdb: number;
  /** midBjdTdb + (duration/2 + sigmaDays), BJD_TDB. */
  endBjdTdb: number;
}

/** A direction on the sky, ICRS (J2000 equator and equinox, to the 0.02″ the difference matters). */
export interface SkyPosition {
  /** Right ascension, degrees, [0, 360). */
  raDeg: number;
  /** Declination, degrees, [−90, 90]. */
  decDeg: number;
}

/** A place on the Earth, geodetic (WGS 84). */
export interface Site {
  /** Geodetic latitude, degrees north, [−90, 90]. */
  latitudeDeg: number;
  /** Longitude, degrees east, [−180, 180]. */
  longitudeDeg: number;
  /** Height above the ellipsoid, metres. */
  elevationM: number;
}

/** An observatory and its observing limits. */
export interface Observatory extends Site {
  /** The lowest altitude at which the target may be watched, degrees, [−90, 90]. */
  minTargetAltitudeDeg: number;
  /** The highest altitude of the Sun's centre that counts as dark, degrees, [−90, 90]; default −12. */
  sunAltitudeLimitDeg?: number;
}

export interface Observability {
  /** True when the Sun stays below its limit and the target above its minimum altitude at every sample. */
  observable: boolean;
  /** Why, in words, for the follow-up list. */
  reason: string;
  /** The target's lowest altitude over the samples, degrees, without refraction. */
  minTargetAltitudeDeg: number;
  /** The Sun's highest altitude over the samples, degrees, without refraction. */
  maxSunAltitudeDeg: number;
  /** The smallest angle between the target and the Sun over the samples, degrees. */
  sunSeparationDeg: number;
}

function requireFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) throw new ScienceInputError(`${name} must be a finite number, got ${value}`);
}

function requireRange(name: string, value: number, low: number, high: number): void {
  if (!(value >= low && value <= high)) {
    throw new ScienceInputError(`${name} must be in [${low}, ${high}], got ${value}`);
  }
}

function requireNonNegative(name: string, value: number): void {
  if (!(Number.isFinite(value) && value >= 0)) {
    throw new ScienceInputError(`${name} must be a finite number ≥ 0, got ${value}`);
  }
}

function requirePositive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new ScienceInputError(`${name} must be a finite number > 0, got ${value}`);
  }
}

function checkEphemeris(ephemeris: Ephemeris): void {
  requireFinite('t0BjdTdb', ephemeris.t0BjdTdb);
  requireNonNegative('t0SigmaDays', ephemeris.t0SigmaDays);
  requirePositive('periodDays', ephemeris.periodDays);
  requireNonNegative('periodSigmaDays', ephemeris.periodSigmaDays);
}

function checkTarget(target: SkyPosition): void {
  if (!(target.raDeg >= 0 && target.raDeg < 360)) {
    throw new ScienceInputError(`raDeg must be in [0, 360), got ${target.raDeg}`);
  }
  requireRange('decDeg', target.decDeg, -90, 90);
}

function checkSite(site: Site): void {
  requireRange('latitudeDeg', site.latitudeDeg, -90, 90);
  requireRange('longitudeDeg', site.longitudeDeg, -180, 180);
  requireRange('elevationM', site.elevationM, -500, 10_000);
}

function checkDate(name: string, date: Date): void {
  if (!(date instanceof Date) || Number.isNaN(date.getTime())) {
    throw new ScienceInputError(`${name} must be a valid Date, got ${String(date)}`);
  }
}

/**
 * The mid-time of transit n of a linear ephemeris and its 1σ uncertainty, T0 and P taken as independent.
 *
 * @param ephemeris T0 (BJD_TDB) and P (days) with their 1σ uncertainties (days)
 * @param n epoch: a whole number, negative for transits before T0
 * @returns T_n = T0 + n·P (BJD_TDB) and σ_Tn = √(σ_T0² + n²·σ_P²) (days)
 * @throws ScienceInputError naming the argument when n is not a whole number, a time is not finite, the
 *   period is not > 0 or an uncertainty is negative
 * @see standard propagation of independent errors for T_n = T0 + n·P (e.g. Bevington & Robinson 2003, eq. 3.14)
 */
export function propagateEphemeris(ephemeris: Ephemeris, n: number): PropagatedTime {
  checkEphemeris(ephemeris);
  if (!Number.isSafeInteger(n)) throw new ScienceInputError(`n must be a whole number, got ${n}`);
  const { t0BjdTdb, t0SigmaDays, periodDays, periodSigmaDays } = ephemeris;
  return {
    timeBjdTdb: t0BjdTdb + n * periodDays,
    sigmaDays: Math.sqrt(t0SigmaDays * t0SigmaDays + n * n * periodSigmaDays * periodSigmaDays),
  };
}

/**
 * The next `count` transits whose mid-time falls strictly after `afterBjdTdb`, each with a window to
 * watch. Padding rule: the window runs from mid − (duration/2 + σ) to mid + (duration/2 + σ), so it holds
 * the whole transit (first to fourth contact) if the transit comes up to 1σ early or late. A transit
 * that has begun but whose mid-time is not yet reached is included; one past mid-time is not.
 *
 * @param ephemeris T0 (BJD_TDB) and P (days) with 1σ uncertainties (days)
 * @param options.afterBjdTdb the time after which to look, BJD_TDB
 * @param options.count how many windows, a whole number in [1, 10 000]
 * @param options.durationHours the transit's total duration (first to fourth contact), hours, > 0 and
 *   shorter than the period
 * @returns the windows in time order, epochs consecutive
 * @throws ScienceInputError naming the argument when one is out of range
 * @see propagateEphemeris for σ; the padding by 1σ is Dipdeck's rule (common practice is 1σ to 3σ)
 */
export function nextTransitWindows(
  ephemeris: Ephemeris,
  options: { afterBjdTdb: number; count: number; durationHours: number },
): TransitWindow[] {
  checkEphemeris(ephemeris);
  const { afterBjdTdb, count, durationHours } = options;
  requireFinite('afterBjdTdb', afterBjdTdb);
  if (!(Number.isInteger(count) && count >= 1 && count <= 10_000)) {
    throw new ScienceInputError(`count must be a whole number in [1, 10000], got ${count}`);
  }
  requirePositive('durationHours', durationHours);
  if (durationHours / 24 >= ephemeris.periodDays) {
    throw new ScienceInputError(
      `durationHours must be shorter than the period (${ephemeris.periodDays * 24} h), got ${durationHours}`,
    );
  }
  const halfDurationDays = durationHours / 48;
  let first = Math.floor((afterBjdTdb - ephemeris.t0BjdTdb) / ephemeris.periodDays) + 1;
  // Rounding can leave first one epoch off when afterBjdTdb sits on a mid-time; settle it exactly.
  while (ephemeris.t0BjdTdb + (first - 1) * ephemeris.periodDays > afterBjdTdb) first -= 1;
  while (ephemeris.t0BjdTdb + first * ephemeris.periodDays <= afterBjdTdb) first += 1;
  const windows: TransitWindow[] = [];
  for (let epoch = first; epoch < first + count; epoch += 1) {
    const { timeBjdTdb, sigmaDays } = propagateEphemeris(ephemeris, epoch);
    const pad = halfDurationDays + sigmaDays;
    windows.push({
      epoch,
      midBjdTdb: timeBjdTdb,
      sigmaDays,
      startBjdTdb: timeBjdTdb - pad,
      endBjdTdb: timeBjdTdb + pad,
    });
  }
  return windows;
}

/** TAI − UTC at a UTC Julian date, seconds. */
function taiMinusUtcSeconds(jdUtc: number): number {
  if (!(jdUtc >= FIRST_LEAP_JD)) {
    throw new ScienceInputError(
      `dateUtc must be on or after 1972-01-01 (start of whole leap seconds), got JD ${jdUtc}`,
    );
  }
  let seconds = Number.NaN;
  for (const [jd, value] of LEAP_SECONDS_JD) {
    if (jdUtc >= jd) seconds = value;
    else break;
  }
  return seconds;
}

/**
 * TDB − TT, seconds: the leading periodic terms, accurate to about 30 µs (from memory; checked against
 * astropy/ERFA dtdb to 0.05 ms in the tests; found ≤ 27 µs), far below the second this module promises.
 * @see Explanatory Supplement to the Astronomical Almanac (1992) eq. 2.222-1; USNO Circular 179 (Kaplan 2005) eq. 2.6
 */
export function tdbMinusTtSeconds(jdTt: number): number {
  const g = (357.53 + 0.98560028 * (jdTt - J2000_JD)) * DEG;
  return 0.001657 * Math.sin(g) + 0.000014 * Math.sin(2 * g);
}

/** TT − UTC at a UTC Julian date, seconds: TAI − UTC (leap seconds) + 32.184 s. */
export function ttMinusUtcSeconds(dateUtc: Date): number {
  checkDate('dateUtc', dateUtc);
  return taiMinusUtcSeconds(dateUtc.getTime() / MS_PER_DAY + UNIX_EPOCH_JD) + TT_MINUS_TAI_SECONDS;
}

function unitVector(target: SkyPosition): Astronomy.Vector {
  const ra = target.raDeg * DEG;
  const dec = target.decDeg * DEG;
  // The time tag is not used by the rotations below; J2000 keeps the vector self-describing.
  const time = Astronomy.MakeTime(new Date(Date.UTC(2000, 0, 1, 12)));
  return new Astronomy.Vector(
    Math.cos(dec) * Math.cos(ra),
    Math.cos(dec) * Math.sin(ra),
    Math.sin(dec),
    time,
  );
}

function observerOf(site: Site): Astronomy.Observer {
  return new Astronomy.Observer(site.latitudeDeg, site.longitudeDeg, site.elevationM);
}

/** BJD_TDB for a UTC Julian date (kernel: inputs already checked). */
function jdUtcToBjdTdb(
  jdUtc: number,
  direction: Astronomy.Vector,
  observer: Astronomy.Observer | null,
): number {
  const jdTt = jdUtc + (taiMinusUtcSeconds(jdUtc) + TT_MINUS_TAI_SECONDS) / 86_400;
  const jdTdb = jdTt + tdbMinusTtSeconds(jdTt) / 86_400;
  const time = Astronomy.AstroTime.FromTerrestrialTime(jdTt - J2000_JD);
  const earth = Astronomy.BaryState(Astronomy.Body.Earth, time);
  let x = earth.x;
  let y = earth.y;
  let z = earth.z;
  if (observer) {
    const o = Astronomy.ObserverVector(time, observer, false);
    x += o.x;
    y += o.y;
    z += o.z;
  }
  // Rømer delay: the observer's barycentric position projected on the target direction, over c.
  const romerDays = (x * direction.x + y * direction.y + z * direction.z) * AU_LIGHT_TIME_DAYS;
  return jdTdb + romerDays;
}

/**
 * The barycentric Julian date in TDB of a UTC instant for a target: UTC → TT by leap seconds
 * (TT = UTC + (TAI − UTC) + 32.184 s), TT → TDB by the periodic term, plus the Rømer delay (the observer's
 * barycentric position, from astronomy-engine, projected on the target direction, over c). Neglects the
 * Shapiro delay (≤ 0.1 ms), the Einstein delay's topocentric part (≤ 2 µs) and proper motion and parallax
 * of the target. Accuracy: a few milliseconds, dominated by astronomy-engine's Earth position (checked
 * against astropy to 1e-5 d ≈ 0.9 s in the tests; agreement found is better than 0.01 s).
 *
 * @param dateUtc the instant, UTC, on or after 1972-01-01
 * @param target ICRS RA/Dec, degrees
 * @param site where the light was received; without it, the geocentre (the difference is ≤ 21 ms)
 * @returns BJD_TDB, days (double precision resolves about 40 µs at JD 2.46e6)
 * @throws ScienceInputError naming the argument when the date is invalid or before 1972, or a coordinate
 *   is out of range
 * @see Eastman, Siverd & Gaudi 2010, PASP 122, 935 (BJD_TDB); astropy Time.light_travel_time (same Rømer term)
 */
export function utcToBjdTdb(dateUtc: Date, target: SkyPosition, site?: Site): number {
  checkDate('dateUtc', dateUtc);
  checkTarget(target);
  if (site) checkSite(site);
  const jdUtc = dateUtc.getTime() / MS_PER_DAY + UNIX_EPOCH_JD;
  return jdUtcToBjdTdb(jdUtc, unitVector(target), site ? observerOf(site) : null);
}

/** UTC Julian date for a BJD_TDB, by fixed-point iteration on the forward conversion (kernel). */
function bjdTdbToJdUtc(
  bjdTdb: number,
  direction: Astronomy.Vector,
  observer: Astronomy.Observer | null,
): number {
  // First guess: no Rømer delay, TDB − UTC ≈ 69.184 s; the delay is ≤ 8.4 min and changes by < 0.01 s
  // per minute, so each step gains about four digits.
  let jdUtc = bjdTdb - 69.184 / 86_400;
  for (let i = 0; i < 6; i += 1) {
    const step = bjdTdb - jdUtcToBjdTdb(jdUtc, direction, observer);
    jdUtc += step;
    if (Math.abs(step) < 1e-10) break;
  }
  return jdUtc;
}

/**
 * The UTC instant at which light from a target that reached the barycentre at `bjdTdb` reached the
 * site: the inverse of {@link utcToBjdTdb}, to the millisecond of a Date. During a leap second UTC is
 * ambiguous; the answer then may be off by up to 1 s.
 *
 * @param bjdTdb BJD_TDB, days, giving a UTC date on or after 1972-01-01
 * @param target ICRS RA/Dec, degrees
 * @param site where the light is received; without it, the geocentre
 * @returns the UTC instant, rounded to the millisecond
 * @throws ScienceInputError naming the argument when bjdTdb is not finite or before 1972, or a
 *   coordinate is out of range
 * @see utcToBjdTdb
 */
export function bjdTdbToUtc(bjdTdb: number, target: SkyPosition, site?: Site): Date {
  requireFinite('bjdTdb', bjdTdb);
  checkTarget(target);
  if (site) checkSite(site);
  if (!(bjdTdb >= FIRST_LEAP_JD)) {
    throw new ScienceInputError(`bjdTdb must be on or after JD ${FIRST_LEAP_JD} (1972-01-01), got ${bjdTdb}`);
  }
  const jdUtc = bjdTdbToJdUtc(bjdTdb, unitVector(target), site ? observerOf(site) : null);
  return new Date(Math.round((jdUtc - UNIX_EPOCH_JD) * MS_PER_DAY));
}

/** Geometric (airless) altitude of a fixed ICRS direction, degrees: precession, nutation, Earth rotation. */
function targetAltitudeDeg(
  time: Astronomy.AstroTime,
  observer: Astronomy.Observer,
  direction: Astronomy.Vector,
): number {
  const horizontal = Astronomy.RotateVector(Astronomy.Rotation_EQJ_HOR(time, observer), direction);
  return Astronomy.HorizonFromVector(horizontal, '').lat;
}

/** Topocentric apparent Sun: airless altitude and J2000 direction. */
function sunAt(
  time: Astronomy.AstroTime,
  observer: Astronomy.Observer,
): { altitudeDeg: number; j2000: Astronomy.Vector } {
  const ofDate = Astronomy.Equator(Astronomy.Body.Sun, time, observer, true, true);
  const altitudeDeg = Astronomy.Horizon(time, observer, ofDate.ra, ofDate.dec).altitude;
  const j2000 = Astronomy.Equator(Astronomy.Body.Sun, time, observer, false, true).vec;
  return { altitudeDeg, j2000 };
}

/**
 * The geometric (airless) altitude of a target at a site: ICRS direction, precession and nutation to the
 * true equator of date, Earth rotation; no aberration (≤ 20″) and no refraction.
 *
 * @param dateUtc the instant, UTC
 * @param target ICRS RA/Dec, degrees
 * @param site the observer
 * @returns altitude, degrees, [−90, 90]
 * @throws ScienceInputError naming the argument when the date is invalid or a coordinate out of range
 * @see astronomy-engine Rotation_EQJ_HOR and HorizonFromVector
 */
export function targetAltitudeAt(dateUtc: Date, target: SkyPosition, site: Site): number {
  checkDate('dateUtc', dateUtc);
  checkTarget(target);
  checkSite(site);
  return targetAltitudeDeg(Astronomy.MakeTime(dateUtc), observerOf(site), unitVector(target));
}

/**
 * The geometric (airless) altitude of the Sun's centre at a site, topocentric, with aberration. At an
 * almanac's sunrise or sunset it is −0.833° (refraction 34′ and semidiameter 16′).
 *
 * @param dateUtc the instant, UTC
 * @param site the observer
 * @returns altitude, degrees, [−90, 90]
 * @throws ScienceInputError naming the argument when the date is invalid or a coordinate out of range
 * @see astronomy-engine Equator and Horizon
 */
export function sunAltitudeAt(dateUtc: Date, site: Site): number {
  checkDate('dateUtc', dateUtc);
  checkSite(site);
  return sunAt(Astronomy.MakeTime(dateUtc), observerOf(site)).altitudeDeg;
}

/**
 * The angle between a target and the Sun at an instant, as seen from the geocentre (the topocentric
 * value differs by < 0.003°).
 *
 * @param dateUtc the instant, UTC
 * @param target ICRS RA/Dec, degrees
 * @returns the separation, degrees, [0, 180]
 * @throws ScienceInputError naming the argument when the date is invalid or a coordinate out of range
 * @see astronomy-engine GeoVector (apparent Sun, with aberration) and AngleBetween
 */
export function sunSeparationDeg(dateUtc: Date, target: SkyPosition): number {
  checkDate('dateUtc', dateUtc);
  checkTarget(target);
  const time = Astronomy.MakeTime(dateUtc);
  // GeoVector: the geocentric Sun, J2000 equator, corrected for aberration.
  const sun = Astronomy.GeoVector(Astronomy.Body.Sun, time, true);
  return Astronomy.AngleBetween(sun, unitVector(target));
}

/**
 * Whether an observatory can watch a whole transit window: the window is sampled every `stepMinutes`
 * from start to end (both ends included) and is observable when, at every sample, the Sun's centre is
 * below `sunAltitudeLimitDeg` and the target at or above `minTargetAltitudeDeg`. A target closer than
 * {@link MIN_SUN_SEPARATION_DEG} to the Sun at any sample is never observable ("target within 30° of the
 * Sun"), whatever the altitudes. Altitudes are geometric (no refraction, which raises objects by ≤ 0.6°
 * at the horizon and ≤ 0.03° above 30°), the target's from precession and nutation without aberration
 * (≤ 20″). Light from the target and the window's ends are taken at the site: the window's BJD_TDB ends
 * are turned into UTC for this site first.
 *
 * @param window startBjdTdb ≤ endBjdTdb, BJD_TDB, at most 2 days apart
 * @param target ICRS RA/Dec, degrees
 * @param observatory site and limits; sunAltitudeLimitDeg defaults to −12 (nautical twilight)
 * @param options.stepMinutes sampling step, minutes, > 0 (default 5)
 * @returns observable, a reason in words, the target's lowest and the Sun's highest altitude (degrees)
 *   and the smallest Sun separation (degrees) over the samples
 * @throws ScienceInputError naming the argument when one is out of range
 * @see astronomy-engine Rotation_EQJ_HOR, Equator, Horizon (Cross, https://github.com/cosinekitty/astronomy)
 */
export function observability(
  window: Pick<TransitWindow, 'startBjdTdb' | 'endBjdTdb'>,
  target: SkyPosition,
  observatory: Observatory,
  options: { stepMinutes?: number } = {},
): Observability {
  requireFinite('startBjdTdb', window.startBjdTdb);
  requireFinite('endBjdTdb', window.endBjdTdb);
  if (!(window.endBjdTdb >= window.startBjdTdb)) {
    throw new ScienceInputError(
      `endBjdTdb must not be before startBjdTdb (${window.startBjdTdb}), got ${window.endBjdTdb}`,
    );
  }
  if (window.endBjdTdb - window.startBjdTdb > 2) {
    throw new ScienceInputError(
      `the window must be at most 2 days long, got ${window.endBjdTdb - window.startBjdTdb} d (endBjdTdb − startBjdTdb)`,
    );
  }
  checkTarget(target);
  checkSite(observatory);
  requireRange('minTargetAltitudeDeg', observatory.minTargetAltitudeDeg, -90, 90);
  const sunLimitDeg = observatory.sunAltitudeLimitDeg ?? DEFAULT_SUN_ALTITUDE_LIMIT_DEG;
  requireRange('sunAltitudeLimitDeg', sunLimitDeg, -90, 90);
  const stepMinutes = options.stepMinutes ?? DEFAULT_STEP_MINUTES;
  requirePositive('stepMinutes', stepMinutes);
  if (!(window.startBjdTdb >= FIRST_LEAP_JD)) {
    throw new ScienceInputError(
      `startBjdTdb must be on or after JD ${FIRST_LEAP_JD} (1972-01-01), got ${window.startBjdTdb}`,
    );
  }

  const direction = unitVector(target);
  const observer = observerOf(observatory);
  const startMs = (bjdTdbToJdUtc(window.startBjdTdb, direction, observer) - UNIX_EPOCH_JD) * MS_PER_DAY;
  const endMs = (bjdTdbToJdUtc(window.endBjdTdb, direction, observer) - UNIX_EPOCH_JD) * MS_PER_DAY;
  const stepMs = stepMinutes * 60_000;
  const steps = Math.ceil((endMs - startMs) / stepMs);
  if (steps + 1 > MAX_SAMPLES) {
    throw new ScienceInputError(
      `stepMinutes must give at most ${MAX_SAMPLES} samples over the window, got ${stepMinutes}`,
    );
  }

  let minTargetAltitudeDeg = Number.POSITIVE_INFINITY;
  let maxSunAltitudeDeg = Number.NEGATIVE_INFINITY;
  let minSeparationDeg = Number.POSITIVE_INFINITY;
  for (let i = 0; i <= steps; i += 1) {
    const time = Astronomy.MakeTime(new Date(Math.min(startMs + i * stepMs, endMs)));
    minTargetAltitudeDeg = Math.min(minTargetAltitudeDeg, targetAltitudeDeg(time, observer, direction));
    const sun = sunAt(time, observer);
    maxSunAltitudeDeg = Math.max(maxSunAltitudeDeg, sun.altitudeDeg);
    minSeparationDeg = Math.min(minSeparationDeg, Astronomy.AngleBetween(sun.j2000, direction));
  }

  const measured = { minTargetAltitudeDeg, maxSunAltitudeDeg, sunSeparationDeg: minSeparationDeg };
  if (minSeparationDeg < MIN_SUN_SEPARATION_DEG) {
    return { observable: false, reason: `target within ${MIN_SUN_SEPARATION_DEG}° of the Sun`, ...measured };
  }
  const problems: string[] = [];
  if (!(maxSunAltitudeDeg < sunLimitDeg)) {
    problems.push(`Sun above ${sunLimitDeg}° during the window (highest ${maxSunAltitudeDeg.toFixed(1)}°)`);
  }
  if (!(minTargetAltitudeDeg >= observatory.minTargetAltitudeDeg)) {
    problems.push(
      `target below ${observatory.minTargetAltitudeDeg}° during the window (lowest ${minTargetAltitudeDeg.toFixed(1)}°)`,
    );
  }
  if (problems.length > 0) return { observable: false, reason: problems.join('; '), ...measured };
  return {
    observable: true,
    reason: `Sun below ${sunLimitDeg}° and target above ${observatory.minTargetAltitudeDeg}° throughout the window`,
    ...measured,
  };
}
