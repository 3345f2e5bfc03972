import { ReaderError } from './reader-error';

/** Default cap on the bytes a reader accepts, or that a file's header may claim (200 MB). */
export const DEFAULT_MAX_BYTES = 200 * 1024 * 1024;
/** Default cap on the rows a light curve may have. */
export const DEFAULT_MAX_ROWS = 5_000_000;

/** Caps checked before anything is allocated. */
export interface ReaderLimits {
  /** Most bytes accepted in the input, and in any size a header claims; default 200 MB. */
  maxBytes?: number;
  /** Most rows accepted in a table; default 5,000,000. */
  maxRows?: number;
}

export interface ResolvedLimits {
  maxBytes: number;
  maxRows: number;
}

function positiveInteger(name: string, value: number | undefined, fallback: number): number {
  if (value === undefined) return fallback;
  if (!Number.isSafeInteger(value) || value < 1) {
    throw new ReaderError(`${name} must be a positive whole number, got ${value}`);
  }
  return value;
}

/** Checks the caller's caps (positive whole numbers) and fills in the defaults. */
export function resolveLimits(limits: ReaderLimits = {}): ResolvedLimits {
  return {
    maxBytes: positiveInteger('maxBytes', limits.maxBytes, DEFAULT_MAX_BYTES),
    maxRows: positiveInteger('maxRows', limits.maxRows, DEFAULT_MAX_ROWS),
  };
}

/** Refuses an input larger than the byte cap. */
export function checkInputSize(byteLength: number, limits: ResolvedLimits): void {
  if (byteLength > limits.maxBytes) {
    throw new ReaderError(`the file is ${byteLength} bytes; at most ${limits.maxBytes} bytes are allowed`);
  }
}
