import { performance } from 'node:perf_hooks';
import autocannon from 'autocannon';
import { percentile } from '../../bench/figures';
import type { SignedInSession } from './sign-in';
import { moderatorPages, StaffClient, scientistPages } from './staff';
import { type AnsweredVerdict, type PlannedRequest, VolunteerClient } from './volunteer';

/** What one kind of request got: answers by status, their latencies, and runs of requests whose answer never came. */
export interface RouteStats {
  latenciesMs: number[];
  statuses: Map<number, number>;
  lost: number;
}

export interface LoadResult {
  elapsedS: number;
  routes: Map<string, RouteStats>;
  /** Every verdict's final answer: 200/201 acknowledged, other statuses refused. */
  verdicts: AnsweredVerdict[];
  /** Verdicts still unanswered when the load stopped, sent again (same clientId) until they had an answer. */
  finishedAfterStop: number;
}

export interface RunningLoad {
  /** Acknowledged verdicts so far. */
  acknowledged(): number;
  /** Requests that lost their answer so far, each run of failures on a connection once (refused or reset connections, timeouts). */
  lost(): number;
  /** Ends the load now rather than at its duration. */
  stop(): void;
  finished: Promise<LoadResult>;
}

export interface LoadOptions {
  baseUrl: string;
  campaignId: number;
  volunteers: SignedInSession[];
  /** Reads the Lab's pages and downloads exports, in this many tabs (connections). */
  scientist?: { session: SignedInSession; tabs: number };
  /** Reads the Desk's queue. */
  moderator?: SignedInSession;
  durationS: number;
}

interface Driver {
  next(): PlannedRequest;
  answer(status: number, body: string): void;
}

function routeStats(routes: Map<string, RouteStats>, route: string): RouteStats {
  let stats = routes.get(route);
  if (!stats) {
    stats = { latenciesMs: [], statuses: new Map(), lost: 0 };
    routes.set(route, stats);
  }
  return stats;
}

/** How long after the staff the volunteers connect. */
const STAFF_HEAD_START_MS = 250;

type Cannon = autocannon.Instance & PromiseLike<autocannon.Result>;

interface ClientInternals {
  _connect(): void;
  parser: { type: string; initialize(type: string): void };
  pipelinedRequests: { clear(): void };
}

/**
 * autocannon (9.0.0) keeps one HTTP parser and one queue of sent requests across reconnections, so after
 * an answer cut short (a timeout mid-body, a killed server) the new connection's first answer is read as
 * the rest of the old one: a status of undefined and another request's bytes as its body. Here each new
 * connection starts both afresh.
 */
function freshParserPerConnection(client: autocannon.Client): void {
  const internals = client as unknown as ClientInternals;
  const connect = internals._connect.bind(client);
  internals._connect = () => {
    internals.parser.initialize(internals.parser.type);
    internals.pipelinedRequests.clear();
    connect();
  };
}

// A synchronous pause: autocannon's setupRequest cannot wait, and nothing else can delay its next attempt.
const pauseCell = new Int32Array(new SharedArrayBuffer(4));
const pause = (ms: number) => Atomics.wait(pauseCell, 0, 0, ms);

/**
 * One autocannon connection per driver, each sending what its driver plans next. autocannon's own
 * request list is per connection here (setRequests in setupClient), so every volunteer keeps its own
 * state; its context object is not used because autocannon clears it after each pass of the list.
 *
 * A request whose answer never came (refused or reset connection, timeout) is counted once per run of
 * failures. autocannon reconnects at once after a refused connection, so while the server is down each
 * connection would knock tens of thousands of times a second and starve the server's own restart of
 * CPU; after a few failures in a row each further attempt first pauses a little, as a real client backs off.
 */
function cannon(
  baseUrl: string,
  drivers: Driver[],
  durationS: number,
  routes: Map<string, RouteStats>,
  onLost: () => void,
): Cannon {
  let nextDriver = 0;
  const instance = autocannon({
    url: baseUrl,
    connections: drivers.length,
    duration: durationS,
    timeout: 10,
    setupClient: (client: autocannon.Client) => {
      const driver = drivers[nextDriver]!;
      nextDriver += 1;
      freshParserPerConnection(client);
      let sentAt = 0;
      let route = '';
      let waiting = false;
      let failures = 0;
      client.setRequests([
        {
          setupRequest: (request: autocannon.Request) => {
            if (waiting) {
              if (failures === 0) {
                routeStats(routes, route).lost += 1;
                onLost();
              }
              failures += 1;
              if (failures > 3) pause(Math.min(20, failures));
            }
            const planned = driver.next();
            sentAt = performance.now();
            route = planned.route;
            waiting = true;
            return {
              ...request,
              method: planned.method,
              path: planned.path,
              headers: planned.headers,
              body: planned.body ?? '',
            };
          },
          onResponse: (status: number, body: string) => {
            waiting = false;
            failures = 0;
            const stats = routeStats(routes, route);
            stats.latenciesMs.push(performance.now() - sentAt);
            stats.statuses.set(status, (stats.statuses.get(status) ?? 0) + 1);
            driver.answer(status, body);
          },
        },
      ]);
    },
  });
  // Without a callback autocannon answers its instance, which is also a promise of the result.
  return instance as unknown as Cannon;
}

/** Sends a verdict that lost its answer again, as the outbox would, until the server answers it for good. */
async function finishVerdict(baseUrl: string, volunteer: VolunteerClient): Promise<void> {
  for (let attempt = 1; attempt <= 40; attempt += 1) {
    const request = volunteer.next();
    const response = await fetch(`${baseUrl}${request.path}`, {
      method: request.method,
      headers: request.headers,
      ...(request.body === undefined ? {} : { body: request.body }),
    }).catch(() => null);
    if (response) {
      const body = await response.text();
      volunteer.answer(response.status, body);
      if (volunteer.waitingVerdict() === null) return;
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  throw new Error(`verdict ${volunteer.waitingVerdict()?.clientId} never got an answer`);
}

/**
 * Volunteers judging cards while staff browse, for `durationS` or until stopped. When it ends, each
 * verdict still waiting for an answer is sent again until it has one, so that every verdict sent ends
 * acknowledged or refused — the test's record of what the server must have stored.
 */
export function startLoad(options: LoadOptions): RunningLoad {
  const routes = new Map<string, RouteStats>();
  const verdicts: AnsweredVerdict[] = [];
  let acknowledged = 0;
  let lost = 0;
  const onLost = () => {
    lost += 1;
  };
  const volunteers = options.volunteers.map(
    (session, index) =>
      new VolunteerClient(
        session,
        options.campaignId,
        (verdict) => {
          verdicts.push(verdict);
          if (verdict.status === 200 || verdict.status === 201) acknowledged += 1;
        },
        index + 1,
      ),
  );
  const staff: StaffClient[] = [];
  if (options.scientist) {
    for (let tab = 0; tab < options.scientist.tabs; tab += 1)
      staff.push(new StaffClient(options.scientist.session, scientistPages(options.campaignId)));
  }
  if (options.moderator) staff.push(new StaffClient(options.moderator, moderatorPages(options.campaignId)));

  // Staff connect first: with 200 connections opened at once the server left some in its accept queue
  // for over 10 s (autocannon's timeout, after which a connection joins the back of the queue again),
  // and the staff's, opened last, were those every time.
  const started = performance.now();
  const instances: Cannon[] = [];
  if (staff.length > 0) instances.push(cannon(options.baseUrl, staff, options.durationS, routes, onLost));
  let stopped = false;
  const arrivals = (async () => {
    if (staff.length > 0) await new Promise((resolve) => setTimeout(resolve, STAFF_HEAD_START_MS));
    if (!stopped) instances.push(cannon(options.baseUrl, volunteers, options.durationS, routes, onLost));
  })();
  const finished = (async (): Promise<LoadResult> => {
    await arrivals;
    await Promise.all(instances);
    const elapsedS = (performance.now() - started) / 1_000;
    const waiting = volunteers.filter((volunteer) => volunteer.waitingVerdict() !== null);
    await Promise.all(waiting.map((volunteer) => finishVerdict(options.baseUrl, volunteer)));
    return { elapsedS, routes, verdicts, finishedAfterStop: waiting.length };
  })();
  return {
    acknowledged: () => acknowledged,
    lost: () => lost,
    stop: () => {
      stopped = true;
      for (const instance of instances) instance.stop();
    },
    finished,
  };
}

export interface RouteFigures {
  route: string;
  answered: number;
  p50Ms: number;
  p99Ms: number;
  perSecond: number;
  non2xx: number;
  lost: number;
}

/** Per route and overall ('all'): answers, p50/p99 latency, answers per second, non-2xx answers, lost answers. */
export function routeFigures(result: LoadResult): RouteFigures[] {
  const figures = (route: string, stats: RouteStats[]): RouteFigures => {
    const latencies = stats.flatMap((s) => s.latenciesMs).sort((a, b) => a - b);
    let non2xx = 0;
    for (const s of stats)
      for (const [status, count] of s.statuses) if (status < 200 || status > 299) non2xx += count;
    return {
      route,
      answered: latencies.length,
      p50Ms: percentile(latencies, 50),
      p99Ms: percentile(latencies, 99),
      perSecond: latencies.length / result.elapsedS,
      non2xx,
      lost: stats.reduce((sum, s) => sum + s.lost, 0),
    };
  };
  const names = [...result.routes.keys()].sort();
  return [
    ...names.map((route) => figures(route, [result.routes.get(route)!])),
    figures('all', [...result.routes.values()]),
  ];
}
