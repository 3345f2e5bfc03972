// One entry point for uploaded light curves: FITS when the file starts with "SIMPLE  =", else text.
import type { LightCurve } from '../types';
import type { ColumnChoice } from './columns';
import { readCsvLightCurve } from './csv';
import { looksLikeFits, readFitsLightCurve } from './fits';
import { ReaderError } from './reader-error';

/** The formats readLightCurve reads. */
export type LightCurveFormat = 'csv' | 'fits';

/** Options of readLightCurve. */
export interface ReadLightCurveOptions {
  /** Read as this format instead of detecting it. */
  format?: LightCurveFormat;
  /** The uploader's column choice, by name or 0-based index. */
  columns?: ColumnChoice;
  /** FITS only: read the binary table with this EXTNAME. */
  extname?: string;
  /** Most bytes accepted, and most data a FITS header may claim; default 200 MB. */
  maxBytes?: number;
  /** Most rows accepted; default 5,000,000. */
  maxRows?: number;
}

/**
 * The format of a file: 'fits' when it starts with the card "SIMPLE  =", else 'csv'.
 *
 * @param bytes - the file, or at least its first 9 bytes
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group), §4.4.1.1
 */
export function detectLightCurveFormat(bytes: Uint8Array): LightCurveFormat {
  return looksLikeFits(bytes) ? 'fits' : 'csv';
}

/**
 * Reads an uploaded light curve from a FITS binary table or a delimited text table.
 *
 * @param bytes - the whole file, at most maxBytes
 * @param options - format (detected when left out), column choice, EXTNAME (FITS), caps
 * @returns the light curve: times in days, flux and flux error as read, time system from the file
 * @throws ReaderError for anything wrong with the file or the options, with a message for the uploader;
 *   a gzip-compressed file is refused with a message saying so
 * @see FITS Standard 4.0, 2018 (IAU FITS Working Group); RFC 4180 (CSV)
 */
export function readLightCurve(bytes: Uint8Array, options: ReadLightCurveOptions = {}): LightCurve {
  const { format, extname, ...rest } = options;
  if (format !== undefined && format !== 'csv' && format !== 'fits') {
    throw new ReaderError(`format must be 'csv' or 'fits', got '${String(format)}'`);
  }
  // RFC 1952 §2.3.1: a gzip member starts with the bytes 1f 8b.
  if (bytes[0] === 0x1f && bytes[1] === 0x8b) {
    throw new ReaderError('the file is gzip-compressed; upload it uncompressed (FITS or CSV)');
  }
  const chosen = format ?? detectLightCurveFormat(bytes);
  if (chosen === 'fits')
    return readFitsLightCurve(bytes, extname === undefined ? rest : { ...rest, extname });
  if (extname !== undefined)
    throw new ReaderError('extname applies to FITS files only; this file is read as text');
  return readCsvLightCurve(bytes, rest);
}
