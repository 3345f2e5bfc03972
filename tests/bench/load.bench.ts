import { routeFigures } from '../support/load/load';
import { runLoadWithoutLoss } from '../support/load/run-load';
import type { Figure } from './figures';

// The real server (its own process, SQLite, embedded queues so the consensus worker runs inside it)
// with 200 volunteers signed in through the API, each on its own autocannon connection fetching cards
// and posting verdicts as the web client does, while a scientist (two tabs) reads the Lab's pages and
// downloads exports and a moderator reads the Desk. Per route: p50/p99 latency and answers per second.
// Then, once the consensus queue has drained, it fails unless every acknowledged verdict is stored
// exactly once and the stored consensus equals a from-scratch recompute (tests/support/load/checks.ts).
const VOLUNTEERS = 200;
const SNIPPETS = 6_000;
const DURATION_S = 25;
const PORT = 3450;

export async function run(): Promise<Figure[]> {
  const report = await runLoadWithoutLoss({
    name: 'load-bench',
    port: PORT,
    volunteers: VOLUNTEERS,
    snippets: SNIPPETS,
    durationS: DURATION_S,
    scientistTabs: 2,
  });
  if (report.problems.length > 0) {
    throw new Error(
      `load without loss failed with ${report.problems.length} problem(s):\n  ${report.problems.slice(0, 20).join('\n  ')}`,
    );
  }
  const figures: Figure[] = [
    { name: 'load.sign_in_s', value: report.signIn.elapsedMs / 1_000, unit: 's' },
    { name: 'load.sign_in_429', value: report.signIn.rateLimited, unit: '' },
  ];
  for (const route of routeFigures(report.load)) {
    figures.push({ name: `load.${route.route}.answered`, value: route.answered, unit: '' });
    if (route.answered > 0) {
      figures.push(
        { name: `load.${route.route}.p50_ms`, value: route.p50Ms, unit: 'ms' },
        { name: `load.${route.route}.p99_ms`, value: route.p99Ms, unit: 'ms' },
      );
    }
    figures.push(
      { name: `load.${route.route}.req_per_s`, value: route.perSecond, unit: 'requests/s' },
      { name: `load.${route.route}.non_2xx`, value: route.non2xx, unit: '' },
      // Runs of requests whose answer never came (10 s timeouts, reset connections), per connection.
      { name: `load.${route.route}.lost`, value: route.lost, unit: '' },
    );
  }
  const { verdicts, consensus } = report;
  const refusals = new Map<string, number>();
  for (const verdict of report.load.verdicts) {
    if (verdict.status === 200 || verdict.status === 201) continue;
    const reason = `${verdict.status}_${verdict.code ?? 'unknown'}`;
    refusals.set(reason, (refusals.get(reason) ?? 0) + 1);
  }
  figures.push(
    { name: 'load.verdicts_acknowledged', value: verdicts.acknowledged, unit: '' },
    {
      name: 'load.verdicts_acknowledged_per_s',
      value: verdicts.acknowledged / report.load.elapsedS,
      unit: 'verdicts/s',
    },
    { name: 'load.verdicts_refused', value: verdicts.refused, unit: '' },
    ...[...refusals].map(([reason, count]) => ({
      name: `load.verdicts_refused.${reason}`,
      value: count,
      unit: '',
    })),
    { name: 'load.verdicts_stored', value: verdicts.stored, unit: '' },
    // Zero, or the bench has failed above: verdicts missing, doubled or altered, consensus mismatches.
    { name: 'load.problems', value: report.problems.length, unit: '' },
    { name: 'load.snippets_judged', value: consensus.judged, unit: '' },
    { name: 'load.snippets_settled', value: consensus.settled, unit: '' },
    { name: 'load.snippets_split', value: consensus.split, unit: '' },
    { name: 'load.dips', value: consensus.dips, unit: '' },
    { name: 'load.drain_ms', value: report.drainMs, unit: 'ms' },
  );
  return figures;
}
