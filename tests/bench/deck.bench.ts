import { spawn } from 'node:child_process';
import { createHmac, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import autocannon from 'autocannon';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { resolveSessionSecret } from '../../server/auth/session-secret';
import { loadConfig } from '../../server/config';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { nowIso } from '../../server/db/rows';
import { type Figure, percentile } from './figures';

// The Deck under load: 100,000 snippets and 20,000 volunteers in SQLite; GET /api/deck/next latency,
// then POST /api/verdicts from 200 concurrent connections (autocannon), and a count that every
// acknowledged verdict is stored once.
const SNIPPETS = 100_000;
const VOLUNTEERS = 20_000;
const CONNECTIONS = 200;
const DURATION_S = 8;

// A signed session cookie as express-session makes it (cookie-signature: HMAC-SHA256, base64, no padding).
const signedCookie = (sid: string, secret: string) =>
  `dipdeck.sid=${encodeURIComponent(`s:${sid}.${createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '')}`)}`;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
    probe.on('error', reject);
  });
}

export async function run(): Promise<Figure[]> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-deck-bench-'));
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DIPDECK_DEMO: '0' });
  const db = createDb(config);
  await migrateLatest(db);
  const campaignId = await createCampaign(db, { status: 'live' });
  const { snippetIds } = await createSnippetFixtures(db, campaignId, {
    targets: 2_000,
    real: SNIPPETS * 0.85,
    planted: SNIPPETS * 0.1,
    quiet: SNIPPETS * 0.05,
  });
  const now = nowIso();
  const people = Array.from({ length: VOLUNTEERS }, (_, i) => ({
    email: `bench-volunteer-${i}@example.com`,
    display_name: `Volunteer ${i}`,
    password_hash: 'scrypt$17$8$1$unused$unused',
    role: 'volunteer',
    created_at: now,
    updated_at: now,
  }));
  for (let i = 0; i < people.length; i += 400) await db('people').insert(people.slice(i, i + 400));
  const personIds: number[] = await db('people').orderBy('id').limit(CONNECTIONS).pluck('id');

  // Signed-in sessions made directly: sign-in itself (scrypt) is measured in auth.bench.ts.
  const secret = resolveSessionSecret(undefined, dataDir);
  const sessions = personIds.map((personId) => {
    const sid = randomUUID();
    const csrfToken = randomUUID().replaceAll('-', '');
    const expires = new Date(Date.now() + 86_400_000).toISOString();
    return {
      row: {
        sid,
        expired: expires,
        sess: JSON.stringify({
          cookie: {
            originalMaxAge: 86_400_000,
            expires,
            httpOnly: true,
            path: '/',
            sameSite: 'lax',
            secure: false,
          },
          passport: { user: { id: personId, signedInAt: now } },
          csrfToken,
        }),
      },
      cookie: signedCookie(sid, secret),
      csrfToken,
    };
  });
  await db('sessions').insert(sessions.map((session) => session.row));

  await db.destroy();

  // The server runs as its own process, as in production, so that the load generator does not share
  // its event loop.
  const port = await freePort();
  const server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: path.resolve(import.meta.dirname, '../..'),
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATA_DIR: dataDir,
      DIPDECK_DEMO: '0',
      PORT: String(port),
      LOG_LEVEL: 'silent',
    },
    stdio: 'ignore',
  });
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; i < 300; i += 1) {
    const up = await fetch(`${base}/api/health`).then(
      (response) => response.ok,
      () => false,
    );
    if (up) break;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }

  try {
    const latencies: number[] = [];
    for (let i = 0; i < 1_000; i += 1) {
      const session = sessions[i % sessions.length]!;
      const start = performance.now();
      const response = await fetch(`${base}/api/deck/next?campaign=${campaignId}&count=3`, {
        headers: { cookie: session.cookie },
      });
      await response.arrayBuffer();
      if (i >= 100) latencies.push(performance.now() - start); // after warm-up
    }
    latencies.sort((a, b) => a - b);

    const allSnippets = [...snippetIds.real, ...snippetIds.planted, ...snippetIds.quiet];
    const acknowledged = new Set<string>();
    let clientIndex = 0;
    const result = await autocannon({
      url: base,
      connections: CONNECTIONS,
      duration: DURATION_S,
      setupClient: (client: { setHeaders: (headers: Record<string, string>) => void }) => {
        const session = sessions[clientIndex % sessions.length]!;
        clientIndex += 1;
        client.setHeaders({
          cookie: session.cookie,
          'x-csrf-token': session.csrfToken,
          'content-type': 'application/json',
        });
      },
      requests: [
        {
          method: 'POST',
          path: '/api/verdicts',
          setupRequest: (request: Record<string, unknown>, context: Record<string, unknown>) => {
            const clientId = randomUUID();
            context.clientId = clientId;
            const snippetId = allSnippets[Math.floor(Math.random() * allSnippets.length)];
            return {
              ...request,
              body: JSON.stringify({ clientId, snippetId, answer: Math.random() < 0.2 ? 'dip' : 'flat' }),
            };
          },
          onResponse: (status: number, _body: string, context: Record<string, unknown>) => {
            if (status === 201 || status === 200) acknowledged.add(context.clientId as string);
          },
        },
      ],
    } as unknown as autocannon.Options);
    // The same connections asking who they are: a signed-in request that writes nothing, the ceiling
    // of what any signed-in route can answer with this server's middleware on this machine.
    let signedInAnswers = 0;
    clientIndex = 0;
    await autocannon({
      url: base,
      connections: CONNECTIONS,
      duration: DURATION_S / 2,
      setupClient: (client: { setHeaders: (headers: Record<string, string>) => void }) => {
        client.setHeaders({ cookie: sessions[clientIndex++ % sessions.length]!.cookie });
      },
      requests: [
        {
          method: 'GET',
          path: '/api/auth/me',
          onResponse: (status: number) => {
            if (status === 200) signedInAnswers += 1;
          },
        },
      ],
    } as unknown as autocannon.Options);
    server.kill('SIGTERM');
    await new Promise((resolve) => server.once('exit', resolve));
    const check = createDb(config);
    const receipts = new Set<string>(await check('verdict_receipts').pluck('client_id'));
    await check.destroy();
    const lost = [...acknowledged].filter((clientId) => !receipts.has(clientId)).length;
    return [
      { name: 'deck.next_p50_ms', value: percentile(latencies, 50), unit: 'ms' },
      { name: 'deck.next_p99_ms', value: percentile(latencies, 99), unit: 'ms' },
      { name: 'deck.verdicts_per_s', value: acknowledged.size / DURATION_S, unit: 'verdicts/s' },
      { name: 'deck.verdict_errors', value: result.non2xx + result.errors, unit: '' },
      { name: 'deck.signed_in_get_per_s', value: signedInAnswers / (DURATION_S / 2), unit: 'requests/s' },
      { name: 'deck.verdicts_lost', value: lost, unit: '' },
    ];
  } finally {
    if (server.exitCode === null) server.kill('SIGKILL');
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}
