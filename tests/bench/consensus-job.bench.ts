import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { loadConfig } from '../../server/config';
import { markCampaignForRescore } from '../../server/db/consensus';
import { createDb } from '../../server/db/knex';
import { migrateLatest } from '../../server/db/migrate';
import { nowIso } from '../../server/db/rows';
import { createRandom } from '../../server/science/random';
import { rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import type { Figure } from './figures';

// The incremental update as the worker runs it, database included: 2,000 snippets with 10 verdicts each
// from 300 volunteers, all marked for rescoring, rescored in the job's batches; time per snippet.
const SNIPPETS = 2_000;
const VOLUNTEERS = 300;
const VERDICTS_PER_SNIPPET = 10;

export async function run(): Promise<Figure[]> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'dipdeck-consensus-job-bench-'));
  const config = loadConfig({ NODE_ENV: 'test', DATA_DIR: dataDir, DIPDECK_DEMO: '0' });
  const db = createDb(config);
  try {
    await migrateLatest(db);
    const campaignId = await createCampaign(db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(db, campaignId, {
      targets: 200,
      real: SNIPPETS * 0.85,
      planted: SNIPPETS * 0.1,
      quiet: SNIPPETS * 0.05,
    });
    const all = [...snippetIds.real, ...snippetIds.planted, ...snippetIds.quiet];
    const now = nowIso();
    const people = Array.from({ length: VOLUNTEERS }, (_, i) => ({
      email: `bench-${i}@example.com`,
      display_name: `Volunteer ${i}`,
      password_hash: 'unused',
      role: 'volunteer',
      created_at: now,
      updated_at: now,
    }));
    await db('people').insert(people);
    const personIds: number[] = await db('people').orderBy('id').pluck('id');
    const random = createRandom('consensus-job-bench');
    const verdicts: Record<string, unknown>[] = [];
    for (const snippetId of all) {
      const judges = new Set<number>();
      while (judges.size < VERDICTS_PER_SNIPPET)
        judges.add(personIds[Math.floor(random.next() * VOLUNTEERS)]!);
      for (const personId of judges) {
        verdicts.push({
          client_id: randomUUID(),
          snippet_id: snippetId,
          person_id: personId,
          answer: random.next() < 0.25 ? 'dip' : 'flat',
          created_at: now,
          updated_at: now,
        });
      }
    }
    for (let i = 0; i < verdicts.length; i += 500) await db('verdicts').insert(verdicts.slice(i, i + 500));

    const perSnippetMs: number[] = [];
    for (let run = 0; run < 3; run += 1) {
      await markCampaignForRescore(db, campaignId);
      await db('snippets').where({ campaign_id: campaignId }).update({ state: 'open', outcome: null });
      const started = performance.now();
      const summary = await rescoreDirtySnippets(db, campaignId);
      perSnippetMs.push((performance.now() - started) / summary.rescored);
    }
    perSnippetMs.sort((a, b) => a - b);
    return [{ name: 'consensus.rescore_db_per_snippet_ms', value: perSnippetMs[1]!, unit: 'ms' }];
  } finally {
    await db.destroy();
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}
