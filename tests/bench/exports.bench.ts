import { performance } from 'node:perf_hooks';
import { Writable } from 'node:stream';
import v8 from 'node:v8';
import vm from 'node:vm';
import { type Column, type ExportRow, UCD, UNIT } from '../../server/formats/columns';
import { csvLines } from '../../server/formats/csv';
import { jsonChunks } from '../../server/formats/json';
import { writeExport } from '../../server/formats/stream';
import { votableChunks } from '../../server/formats/votable';
import type { Figure } from './figures';

// 100,000 follow-up-list rows (9 columns), generated lazily, streamed with writeExport into a Writable
// that discards its input after a setImmediate (so backpressure and 'drain' are exercised). Time: the
// median of 3 runs per format after one warm-up. Memory: one more untimed run per format in which the
// row source runs a full GC every 10,000 rows and reads heapUsed; the figure is the largest reading minus
// heapUsed after a GC before the run, i.e. what the streaming keeps alive mid-export (a whole buffered
// file would be ~15-25 MB here). Garbage between GCs is not counted: it depends on V8's heuristics.

const ROWS = 100_000;
const RUNS = 3;
const MB = 1024 * 1024;

const COLUMNS: Column[] = [
  { name: 'candidate_id', type: 'int', ucd: UCD.mainId, description: 'candidate id' },
  { name: 'designation', type: 'char', ucd: UCD.id, description: 'target designation' },
  {
    name: 'epoch',
    type: 'double',
    unit: UNIT.days,
    ucd: UCD.epoch,
    description: 'mid-transit time, BJD_TDB',
  },
  { name: 'period', type: 'double', unit: UNIT.days, ucd: UCD.period, description: 'orbital period' },
  { name: 'duration', type: 'double', unit: UNIT.hours, ucd: UCD.duration, description: 'transit duration' },
  { name: 'depth', type: 'double', unit: UNIT.ppm, ucd: UCD.depth, description: 'transit depth' },
  { name: 'consensus_score', type: 'double', ucd: UCD.probability, description: 'consensus score' },
  { name: 'dips', type: 'int', ucd: UCD.count, description: 'dips found' },
  { name: 'note', type: 'char', ucd: UCD.note, description: 'scientist note' },
];

let sample: (() => void) | null = null;

async function* rows(): AsyncGenerator<ExportRow> {
  for (let i = 0; i < ROWS; i += 1) {
    if (sample && i % 10_000 === 0) sample();
    yield {
      candidate_id: i + 1,
      designation: `TIC ${100_000_000 + i}`,
      epoch: 2459000 + i * 0.001234567,
      period: 0.5 + (i % 997) * 0.0123456789,
      duration: 1 + (i % 13) * 0.25,
      depth: 100 + (i % 5000) * 3.3,
      consensus_score: (i % 1000) / 1000,
      dips: i % 7,
      note: i % 3 === 0 ? `checked <${i}> & "fine", -ok` : null,
    };
  }
}

function discard(): Writable {
  return new Writable({
    highWaterMark: 64 * 1024,
    write(_chunk, _encoding, done) {
      setImmediate(done);
    },
  });
}

const HEAD = {
  tableName: 'follow_up_list',
  campaign: { id: 1, name: 'bench' },
  exportedAt: new Date('2026-01-01T00:00:00Z'),
};
const FORMATS: Record<string, () => AsyncIterable<string>> = {
  votable: () => votableChunks(COLUMNS, rows(), HEAD),
  csv: () => csvLines(COLUMNS, rows(), { preamble: ['campaign: bench'] }),
  json: () => jsonChunks(COLUMNS, rows(), HEAD),
};

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

export async function run(): Promise<Figure[]> {
  v8.setFlagsFromString('--expose-gc');
  const gc = vm.runInNewContext('gc') as () => void;
  for (const chunks of Object.values(FORMATS)) await writeExport(discard(), chunks());

  const seconds: Record<string, number> = {};
  for (const [name, chunks] of Object.entries(FORMATS)) {
    const times: number[] = [];
    for (let r = 0; r < RUNS; r += 1) {
      const start = performance.now();
      await writeExport(discard(), chunks());
      times.push((performance.now() - start) / 1000);
    }
    seconds[name] = median(times);
  }

  gc();
  const before = process.memoryUsage().heapUsed;
  let peak = Number.NEGATIVE_INFINITY;
  sample = () => {
    gc();
    peak = Math.max(peak, process.memoryUsage().heapUsed);
  };
  try {
    for (const chunks of Object.values(FORMATS)) await writeExport(discard(), chunks());
  } finally {
    sample = null;
  }

  return [
    { name: 'exports.votable_100k_rows_s', value: seconds.votable!, unit: 's' },
    { name: 'exports.csv_100k_rows_s', value: seconds.csv!, unit: 's' },
    { name: 'exports.json_100k_rows_s', value: seconds.json!, unit: 's' },
    { name: 'exports.peak_heap_growth_mb', value: (peak - before) / MB, unit: 'MB' },
  ];
}
