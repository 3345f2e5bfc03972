import { performance } from 'node:perf_hooks';
import { createRandom } from '../../server/science/random';
import { readCsvLightCurve } from '../../server/science/readers/csv';
import { readFitsLightCurve } from '../../server/science/readers/fits';
import { lightCurveFits } from '../unit/server/science/readers/support/fits-writer';
import { type Figure, percentile } from './figures';

// What reading an upload costs: a 20,000-point light curve (2-minute cadence, about 27.8 days, the
// size of one TESS sector) as CSV text and as a FITS binary table, each read several times; the
// figure is the median. Target: under 20 ms each.
const POINTS = 20_000;
const CADENCE_DAYS = 2 / 1440;
const RUNS = 15;

function medianMs(read: () => unknown): number {
  for (let i = 0; i < 3; i += 1) read(); // warm up the JIT
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    read();
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return percentile(times, 50);
}

export async function run(): Promise<Figure[]> {
  const random = createRandom('readers.bench');
  const timeDays = new Float64Array(POINTS);
  const flux = new Float64Array(POINTS);
  const fluxErr = new Float64Array(POINTS).fill(4e-4);
  for (let i = 0; i < POINTS; i += 1) {
    timeDays[i] = 1325.5 + i * CADENCE_DAYS;
    flux[i] = random.normal(1, 4e-4);
  }
  const lines = ['time,flux,flux_err,quality'];
  for (let i = 0; i < POINTS; i += 1) {
    lines.push(`${timeDays[i]!.toFixed(8)},${flux[i]!.toFixed(7)},${fluxErr[i]!.toFixed(7)},0`);
  }
  const csvBytes = new TextEncoder().encode(`${lines.join('\n')}\n`);
  const fitsBytes = lightCurveFits(timeDays, flux, fluxErr, { objectName: 'Invented Bench Star' });
  const csvMs = medianMs(() => readCsvLightCurve(csvBytes));
  const fitsMs = medianMs(() => readFitsLightCurve(fitsBytes));
  return [
    { name: 'readers.fits_read_20k', value: fitsMs, unit: 'ms' },
    { name: 'readers.csv_read_20k', value: csvMs, unit: 'ms' },
  ];
}
