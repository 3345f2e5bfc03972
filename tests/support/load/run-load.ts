import { eventually } from '../eventually';
import { auditVerdicts, type ConsensusComparison, compareWithRecompute, type VerdictAudit } from './checks';
import { type LoadResult, type RunningLoad, startLoad } from './load';
import { type ServerProcess, serverProcess } from './server-process';
import { type SignInReport, signInAll } from './sign-in';
import { createLoadWorld, type LoadWorld } from './world';

export interface LoadRunOptions {
  /** Names the data directory and the people's addresses. */
  name: string;
  port: number;
  volunteers: number;
  snippets: number;
  durationS: number;
  /** A scientist (in this many tabs) and a moderator browse while the volunteers judge. */
  scientistTabs: number;
  /** Runs beside the load (to restart the server, say); the load stops when it returns, if not before. */
  during?: (context: { server: ServerProcess; load: RunningLoad; world: LoadWorld }) => Promise<void>;
}

export interface LoadRunReport {
  signIn: Omit<SignInReport, 'sessions'>;
  load: LoadResult;
  /** From the end of the load until no snippet waited for its rescore. */
  drainMs: number;
  verdicts: VerdictAudit;
  consensus: ConsensusComparison;
  /** Everything that is wrong: verdicts lost, doubled or altered, consensus that differs from the recompute. */
  problems: string[];
}

async function countIn(world: LoadWorld, table: 'snippets' | 'dips', where: Record<string, unknown>) {
  const db = world.openDb();
  try {
    const [row] = await db(table)
      .where({ campaign_id: world.campaignId, ...where })
      .count<{ n: number }[]>({ n: '*' });
    return Number(row?.n ?? 0);
  } finally {
    await db.destroy();
  }
}

/** Dips found so far in the world's campaign. */
export const dipsFound = (world: LoadWorld) => countIn(world, 'dips', {});
const dirtySnippets = (world: LoadWorld) => countIn(world, 'snippets', { needs_rescore: true });

/**
 * The whole run: a fresh world, the real server, everyone signed in through the API, the load (and
 * whatever `during` does to the server meanwhile), the consensus queue left to drain, the server
 * stopped, then the verdicts audited and the consensus recomputed from the stored verdicts.
 */
export async function runLoadWithoutLoss(options: LoadRunOptions): Promise<LoadRunReport> {
  const world = await createLoadWorld({
    name: options.name,
    volunteers: options.volunteers,
    snippets: options.snippets,
  });
  const server = serverProcess({ port: options.port, dataDir: world.dataDir });
  try {
    await server.start();
    const { sessions, ...signIn } = await signInAll(
      server.baseUrl,
      [...world.volunteers, world.scientist, world.moderator],
      world.password,
    );
    const moderator = sessions.pop()!;
    const scientist = sessions.pop()!;
    const load = startLoad({
      baseUrl: server.baseUrl,
      campaignId: world.campaignId,
      volunteers: sessions,
      ...(options.scientistTabs > 0
        ? { scientist: { session: scientist, tabs: options.scientistTabs }, moderator }
        : {}),
      durationS: options.durationS,
    });
    if (options.during) {
      await options.during({ server, load, world }).finally(() => load.stop());
    }
    const result = await load.finished;
    const loadEnded = Date.now();
    await eventually(async () => (await dirtySnippets(world)) === 0, 'every judged snippet is rescored');
    const drainMs = Date.now() - loadEnded;
    const exitCode = await server.stop('SIGTERM');

    const db = world.openDb();
    try {
      const verdicts = await auditVerdicts(
        db,
        result.verdicts,
        world.volunteers.map((volunteer) => volunteer.id),
      );
      const consensus = await compareWithRecompute(db, world.campaignId);
      const problems = [...verdicts.problems, ...consensus.problems];
      if (exitCode !== 0) problems.push(`the server's graceful stop after the load exited with ${exitCode}`);
      return { signIn, load: result, drainMs, verdicts, consensus, problems };
    } finally {
      await db.destroy();
    }
  } catch (error) {
    throw new Error(
      `${error instanceof Error ? error.message : String(error)}\nserver output:\n${server.output()}`,
      {
        cause: error,
      },
    );
  } finally {
    await server.stop('SIGKILL');
    world.remove();
  }
}
