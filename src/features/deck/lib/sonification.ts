import { binSeries } from './binning';

/**
 * Listening to a light curve: time runs left to right over a few seconds and pitch follows brightness,
 * so a dip is heard as the tone falling and coming back. Pitch moves on a log scale (equal steps sound
 * equal) over two octaves.
 */

export const lowestHz = 220;
export const highestHz = 880;
export const defaultPlayS = 5;
/** Tones per second of playback: enough for a smooth glide, few enough that noise does not chatter. */
const tonesPerSecond = 24;

export interface Tone {
  atS: number;
  frequencyHz: number;
}

/** Brightness → pitch: the faintest value of the card is the lowest note, the brightest the highest. */
export function frequencyForPpm(ppm: number, minPpm: number, maxPpm: number): number {
  if (!(maxPpm > minPpm)) return Math.sqrt(lowestHz * highestHz);
  const share = Math.min(1, Math.max(0, (ppm - minPpm) / (maxPpm - minPpm)));
  return lowestHz * (highestHz / lowestHz) ** share;
}

/** The tones to play for a card: binned brightness, evenly over `playS` seconds in time order. */
export function sonify(hours: readonly number[], ppm: readonly number[], playS = defaultPlayS): Tone[] {
  if (hours.length === 0) return [];
  const spanHours = hours[hours.length - 1]! - hours[0]!;
  const steps = Math.max(2, Math.round(playS * tonesPerSecond));
  const binned =
    spanHours > 0 ? binSeries(hours, ppm, spanHours / steps) : { hours: [...hours], ppm: [...ppm] };
  const minPpm = Math.min(...binned.ppm);
  const maxPpm = Math.max(...binned.ppm);
  return binned.hours.map((at, index) => ({
    atS: spanHours > 0 ? ((at - hours[0]!) / spanHours) * playS : 0,
    frequencyHz: frequencyForPpm(binned.ppm[index]!, minPpm, maxPpm),
  }));
}
