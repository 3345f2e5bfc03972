// The server stopped and started again under load, on the same port and database: once killed (SIGKILL),
// once stopped gracefully (SIGTERM). The volunteers send each verdict until they have an answer, again
// with the same clientId after an answer that never came, as the web client's outbox does. Afterwards
// nothing acknowledged is lost, nothing is stored twice, and the consensus equals a recompute.
import { describe, expect, it } from 'vitest';
import { eventually } from '../support/eventually';
import type { RunningLoad } from '../support/load/load';
import { runLoadWithoutLoss } from '../support/load/run-load';

const moreVerdicts = async (load: RunningLoad, count: number, what: string) => {
  const from = load.acknowledged();
  await eventually(async () => load.acknowledged() >= from + count, what);
};

describe('restarting the server under load', () => {
  it('loses no acknowledged verdict, stores none twice, and its consensus equals a recompute', async () => {
    const exitCodes: Record<string, number | null> = {};
    const report = await runLoadWithoutLoss({
      name: 'server-restart',
      port: 3452,
      volunteers: 30,
      snippets: 600,
      durationS: 120,
      scientistTabs: 1,
      during: async ({ server, load }) => {
        await moreVerdicts(load, 60, 'verdicts before the kill');
        exitCodes.kill = await server.stop('SIGKILL');
        await server.start();
        await moreVerdicts(load, 60, 'verdicts after the first restart');
        exitCodes.term = await server.stop('SIGTERM');
        await server.start();
        await moreVerdicts(load, 60, 'verdicts after the second restart');
      },
    });
    expect(report.problems.slice(0, 20)).toEqual([]);
    // The restarts happened under load: verdicts lost their answers and were sent again.
    expect(exitCodes.kill).toBeNull();
    expect(report.load.routes.get('verdicts')?.lost ?? 0).toBeGreaterThan(0);
    expect(report.verdicts.sentAgain).toBeGreaterThan(0);
    // A graceful stop under load finishes what it took on and exits cleanly.
    expect(exitCodes.term).toBe(0);
  }, 240_000);
});
