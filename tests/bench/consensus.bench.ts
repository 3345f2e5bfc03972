import { performance } from 'node:perf_hooks';
import v8 from 'node:v8';
import vm from 'node:vm';
import { dipTimeClusters } from '../../server/science/consensus/dip-time';
import { DEFAULT_PRIORS, estimateConsensus } from '../../server/science/consensus/em';
import { measureDip } from '../../server/science/consensus/measure-dip';
import { reliabilityFrom, scoreSnippet } from '../../server/science/consensus/posterior';
import { decideSettlement, reliableDisagreement } from '../../server/science/consensus/settle';
import {
  ANSWER_DIP,
  ANSWER_FLAT,
  ANSWER_UNSURE,
  type ConsensusData,
  TRUTH_DIP,
  TRUTH_FLAT,
  TRUTH_UNKNOWN,
  type WeightedVerdict,
} from '../../server/science/consensus/types';
import { createRandom } from '../../server/science/random';
import type { Figure } from './figures';

// A large campaign's full re-estimate: 1,000,000 verdicts (10 per snippet from distinct synthetic
// volunteers) on 100,000 snippets (10% controls) from 20,000 volunteers, of whom 10% answer at random and
// 5% always say dip. Timed as the median of 3 runs after one warm-up. Memory: heapUsed + arrayBuffers
// just after a run minus just before it (after a full GC), i.e. everything the run allocated and had
// not freed, which is its peak (it allocates only up front; the largest of the 3 runs is reported). RSS
// is not reported: memory freed while building the campaign stays resident and is reused, so an RSS
// delta here would understate the run.
// The incremental path: one snippet's scoreSnippet + reliableDisagreement + decideSettlement +
// dipTimeClusters with 15 verdicts, the mean over 20,000 repetitions cycling through 100 snippets.

const SNIPPETS = 100_000;
const JUDGES = 20_000;
const VERDICTS_PER_SNIPPET = 10;
const RUNS = 3;
const UPDATE_REPETITIONS = 20_000;

function campaign(): ConsensusData {
  const random = createRandom('consensus-bench');
  const sensitivity = new Float64Array(JUDGES);
  const specificity = new Float64Array(JUDGES);
  for (let j = 0; j < JUDGES; j += 1) {
    const u = random.next();
    sensitivity[j] = u < 0.1 ? 0.5 : u < 0.15 ? 1 : random.uniform(0.6, 0.95);
    specificity[j] = u < 0.1 ? 0.5 : u < 0.15 ? 0 : random.uniform(0.7, 0.99);
  }
  const total = SNIPPETS * VERDICTS_PER_SNIPPET;
  const verdictSnippet = new Int32Array(total);
  const verdictJudge = new Int32Array(total);
  const verdictAnswer = new Uint8Array(total);
  const knownTruth = new Int8Array(SNIPPETS).fill(TRUTH_UNKNOWN);
  const isControl = new Uint8Array(SNIPPETS);
  const chosen = new Int32Array(VERDICTS_PER_SNIPPET);
  let v = 0;
  for (let i = 0; i < SNIPPETS; i += 1) {
    let holdsDip: boolean;
    if (random.next() < 0.1) {
      isControl[i] = 1;
      holdsDip = random.next() < 2 / 3;
      knownTruth[i] = holdsDip ? TRUTH_DIP : TRUTH_FLAT;
    } else holdsDip = random.next() < 0.2;
    for (let k = 0; k < VERDICTS_PER_SNIPPET; k += 1) {
      let judge: number;
      do judge = random.int(0, JUDGES - 1);
      while (chosen.subarray(0, k).includes(judge));
      chosen[k] = judge;
      const said = random.next();
      verdictSnippet[v] = i;
      verdictJudge[v] = judge;
      if (said < 0.05) verdictAnswer[v] = ANSWER_UNSURE;
      else if (holdsDip) verdictAnswer[v] = random.next() < sensitivity[judge]! ? ANSWER_DIP : ANSWER_FLAT;
      else verdictAnswer[v] = random.next() < specificity[judge]! ? ANSWER_FLAT : ANSWER_DIP;
      v += 1;
    }
  }
  return {
    snippetCount: SNIPPETS,
    judgeCount: JUDGES,
    verdictSnippet,
    verdictJudge,
    verdictAnswer,
    knownTruth,
    isControl,
  };
}

function snippets(): WeightedVerdict[][] {
  const random = createRandom('consensus-bench-snippets');
  return Array.from({ length: 100 }, () =>
    Array.from({ length: 15 }, (_, k): WeightedVerdict => {
      const answer = k < 9 ? 'dip' : k < 14 ? 'flat' : 'unsure';
      return {
        answer,
        reliability: reliabilityFrom(random.uniform(0.55, 0.98), random.uniform(0.6, 0.99)),
        markTime: answer === 'dip' ? 1500.3 + random.normal(0, 0.02) + (k % 4 === 0 ? 0.6 : 0) : null,
      };
    }),
  );
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

const MB = 1024 * 1024;

export async function run(): Promise<Figure[]> {
  v8.setFlagsFromString('--expose-gc');
  const gc = vm.runInNewContext('gc') as () => void;
  const data = campaign();
  estimateConsensus(data, DEFAULT_PRIORS); // warm the JIT

  const seconds: number[] = [];
  const heapMb: number[] = [];
  let iterations = 0;
  let converged = true;
  for (let r = 0; r < RUNS; r += 1) {
    gc();
    const before = process.memoryUsage();
    const start = performance.now();
    const estimate = estimateConsensus(data, DEFAULT_PRIORS);
    seconds.push((performance.now() - start) / 1000);
    const after = process.memoryUsage();
    heapMb.push((after.heapUsed + after.arrayBuffers - before.heapUsed - before.arrayBuffers) / MB);
    iterations = estimate.iterations;
    converged &&= estimate.converged;
  }
  if (!converged) throw new Error(`the re-estimate did not converge within ${iterations} iterations`);

  const cases = snippets();
  const rules = { upper: 0.95, lower: 0.05, minVerdicts: 5, maxVerdicts: 15 };
  let settled = 0;
  const update = (verdicts: WeightedVerdict[]) => {
    const score = scoreSnippet(0.2, verdicts);
    const decision = decideSettlement({
      score: score.score,
      verdictCount: score.verdictCount,
      rules,
      reliableDisagreement: reliableDisagreement(verdicts),
    });
    const marks = [];
    for (const verdict of verdicts) {
      if (verdict.answer === 'dip' && verdict.markTime != null) {
        marks.push({ timeDays: verdict.markTime, weight: verdict.reliability.weightDip });
      }
    }
    const clusters = dipTimeClusters(marks, { separationDays: 0.25 });
    if (decision.state === 'settled') settled += clusters.length;
  };
  for (let k = 0; k < 2000; k += 1) update(cases[k % cases.length]!);
  const updateStart = performance.now();
  for (let k = 0; k < UPDATE_REPETITIONS; k += 1) update(cases[k % cases.length]!);
  const updateMs = (performance.now() - updateStart) / UPDATE_REPETITIONS;
  if (settled < 0) throw new Error('unreachable: keeps the work observable');

  // measureDip on a 2-day snippet at 2-minute cadence, up to 12-hour boxes.
  const random = createRandom('consensus-bench-dip');
  const timeDays = Float64Array.from({ length: 1440 }, (_, i) => 1500 + i / 720);
  const flux = Float64Array.from(
    timeDays,
    (t) => 1 + random.normal(0, 1e-3) - (Math.abs(t - 1501) < 0.1 ? 3e-3 : 0),
  );
  const series = { timeDays, flux, fluxErr: new Float64Array(1440).fill(1e-3) };
  for (let k = 0; k < 50; k += 1) measureDip(series, 1501.02, { maxDurationHours: 12 });
  const dipStart = performance.now();
  for (let k = 0; k < 500; k += 1) measureDip(series, 1501.02, { maxDurationHours: 12 });
  const dipMs = (performance.now() - dipStart) / 500;

  return [
    { name: 'consensus.em_1m_verdicts_s', value: median(seconds), unit: 's' },
    { name: 'consensus.em_iterations', value: iterations, unit: '' },
    { name: 'consensus.em_heap_mb', value: Math.max(...heapMb), unit: 'MB' },
    { name: 'consensus.snippet_update_ms', value: updateMs, unit: 'ms' },
    { name: 'consensus.measure_dip_ms', value: dipMs, unit: 'ms' },
  ];
}
