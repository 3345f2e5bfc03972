// Shared shapes of the science modules. Plain data: typed arrays for series, units in the names.

/** Time-system keywords carried from the file into the light curve's metadata (FITS Standard 4.0 §9). */
export interface TimeSystem {
  /** TIMESYS, e.g. 'TDB', 'UTC'; null when the file does not say. */
  timesys: string | null;
  /** TIMEREF, e.g. 'SOLARSYSTEM' (barycentric), 'LOCAL'. */
  timeref: string | null;
  /** TIMEUNIT, e.g. 'd'. Times in a LightCurve are always days. */
  timeunit: string | null;
  /** BJDREFI + BJDREFF: the reference added to the time column to give a full BJD (days). */
  bjdRefDays: number | null;
}

/** A light curve as read: one target's flux time series, times in days, not yet cleaned. */
export interface LightCurve {
  timeDays: Float64Array;
  flux: Float64Array;
  /** Null when the file has no flux error column. */
  fluxErr: Float64Array | null;
  /** Quality flags (non-zero means bad), when a flag column was chosen. */
  quality: Int32Array | null;
  timeSystem: TimeSystem;
  /** Target name from the file (FITS OBJECT keyword or a CSV column), when it has one. */
  objectName: string | null;
}

/** A cleaned light curve: finite, sorted, unique times, flux normalised to median 1. */
export interface CleanLightCurve {
  timeDays: Float64Array;
  /** Relative flux (median 1). */
  flux: Float64Array;
  /** Relative flux error; estimated from the scatter when the file had none. */
  fluxErr: Float64Array;
  timeSystem: TimeSystem;
}

/** The error every reader and kernel throws for bad input; its message is shown to the uploader. */
export class ScienceInputError extends Error {
  override name = 'ScienceInputError';
}
