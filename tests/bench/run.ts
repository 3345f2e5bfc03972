// npm run bench [-- name-filter]: runs each benchmark module and prints one `name: value unit` per line.
import * as auth from './auth.bench';
import * as bls from './bls.bench';
import * as client from './client.bench';
import * as consensus from './consensus.bench';
import * as consensusJob from './consensus-job.bench';
import * as deck from './deck.bench';
import * as deckInp from './deck-inp.bench';
import * as exports from './exports.bench';
import { type Figure, formatFigure } from './figures';
import * as load from './load.bench';
import * as pipeline from './pipeline.bench';
import * as queue from './queue.bench';
import * as readers from './readers.bench';
import * as vetting from './vetting.bench';

const BENCHMARKS: [name: string, run: () => Promise<Figure[]>][] = [
  ['auth', auth.run],
  ['queue', queue.run],
  ['readers', readers.run],
  ['pipeline', pipeline.run],
  ['bls', bls.run],
  ['consensus', consensus.run],
  ['consensus-job', consensusJob.run],
  ['deck', deck.run],
  ['client', client.run],
  ['deck-inp', deckInp.run],
  ['exports', exports.run],
  ['vetting', vetting.run],
  ['load', load.run],
];

const filter = process.argv[2];
for (const [name, run] of BENCHMARKS) {
  if (filter && !name.includes(filter)) continue;
  for (const figure of await run()) console.info(formatFigure(figure));
}
