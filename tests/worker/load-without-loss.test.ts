// The short form of `npm run bench -- load`: the real server under 30 volunteers judging cards while a
// scientist and a moderator browse; afterwards every acknowledged verdict is stored exactly once and the
// consensus equals a from-scratch recompute over the stored verdicts. The load runs until it has done
// enough to check (verdicts acknowledged, a dip found), not for a set time; nothing is timed.
import { describe, expect, it } from 'vitest';
import { eventually } from '../support/eventually';
import { dipsFound, runLoadWithoutLoss } from '../support/load/run-load';

describe('the server under load', () => {
  it('stores every acknowledged verdict exactly once, and its consensus equals a recompute from the verdicts', async () => {
    const report = await runLoadWithoutLoss({
      name: 'load-without-loss',
      port: 3451,
      volunteers: 30,
      snippets: 600,
      durationS: 60,
      scientistTabs: 1,
      during: async ({ load, world }) => {
        await eventually(
          async () => load.acknowledged() >= 250 && (await dipsFound(world)) > 0,
          '250 verdicts acknowledged and a dip found',
        );
      },
    });
    expect(report.problems.slice(0, 20)).toEqual([]);
    expect(report.signIn.rateLimited).toBe(0);
    expect(report.verdicts.acknowledged).toBeGreaterThanOrEqual(250);
    expect(report.consensus.settled).toBeGreaterThan(0);
    expect(report.consensus.dips).toBeGreaterThan(0);
  }, 240_000);
});
