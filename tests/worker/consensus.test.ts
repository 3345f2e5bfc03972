// The consensus jobs: verdicts become settled snippets and dips through the queue; a repeated job or
// re-estimate changes nothing; a re-estimate that would flip a settled snippet sends it to the Desk.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { loadConfig } from '../../server/config';
import { markCampaignForRescore } from '../../server/db/consensus';
import type { Db } from '../../server/db/knex';
import { createLogger } from '../../server/logger';
import { reestimateCampaign } from '../../server/services/consensus/reestimate-campaign';
import { createRescoreRequests } from '../../server/services/consensus/request-rescore';
import { rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import { sweepDirtySnippets } from '../../server/services/consensus/sweep-dirty';
import { recordVerdict } from '../../server/services/deck/verdicts';
import { myRecord } from '../../server/services/record/my-record';
import { consensusProcessor } from '../../worker/processors/consensus';
import { createQueues, type Queues } from '../../worker/queues';
import { createRedisConnection } from '../../worker/redis-connection';
import { testDatabases } from '../support/databases';
import { eventually } from '../support/eventually';

const config = loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent' });
const logger = createLogger(config);

describe.each(testDatabases)('the consensus jobs on $name', (database) => {
  let db: Db;
  let drop: () => Promise<void>;
  let queues: Queues;

  beforeAll(async () => {
    ({ db, drop } = await database.open());
    const connection = createRedisConnection({ redisUrl: undefined }, `consensus-${randomUUID()}`);
    queues = createQueues(connection, { prefix: `consensus-${randomUUID().slice(0, 8)}` });
    void queues.byKey.consensus.process('*', 1, consensusProcessor({ config, db, logger, queues }));
  });
  afterAll(async () => {
    await queues.close();
    await drop();
  });

  async function volunteers(count: number): Promise<number[]> {
    const ids: number[] = [];
    for (let i = 0; i < count; i += 1) ids.push((await createPerson(db, { reuseHash: true })).id);
    return ids;
  }

  async function judge(
    personId: number,
    snippetId: number,
    answer: 'dip' | 'flat' | 'unsure',
    markTime?: number,
  ) {
    return recordVerdict(
      db,
      { personId },
      { clientId: randomUUID(), snippetId, answer, markTime: markTime ?? null },
    );
  }

  const snippet = (id: number) => db('snippets').where({ id }).first();

  /** The consensus tables without their clocks, to compare two runs. */
  async function consensusState(campaignId: number) {
    const database = db;
    const snippets = await database('snippets')
      .where({ campaign_id: campaignId })
      .orderBy('id')
      .select('id', 'state', 'outcome', 'split_reason', 'consensus_score', 'dip_share', 'effective_votes');
    const dips = await database('dips')
      .where({ campaign_id: campaignId })
      .orderBy('id')
      .select(
        'id',
        'snippet_id',
        'cluster_index',
        'time_center',
        'time_sigma',
        'depth_ppm',
        'duration_hours',
        'snr',
      );
    const finders = await database('dip_finders').orderBy(['dip_id', 'person_id']);
    const reliability = await database('reliability')
      .where({ campaign_id: campaignId })
      .orderBy('person_id')
      .select(
        'person_id',
        'sensitivity',
        'specificity',
        'weight_dip',
        'weight_flat',
        'planted_seen',
        'quiet_seen',
      );
    const campaign = await database('campaigns')
      .where({ id: campaignId })
      .first('prior_dip_rate', 'typical_sensitivity_alpha', 'typical_specificity_alpha');
    return { snippets, dips, finders, reliability, campaign };
  }
  it('turn verdicts into settled snippets and credited dips, through the queue', async () => {
    const campaignId = await createCampaign(db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(db, campaignId, {
      targets: 4,
      real: 4,
      planted: 1,
      quiet: 1,
    });
    const [clearDip, clearFlat, mixed] = snippetIds.real as [number, number, number];
    const planted = snippetIds.planted[0]!;
    const people = await volunteers(15);
    const requests = createRescoreRequests(queues, logger);
    const dipRow = await snippet(clearDip);
    const middle = (Number(dipRow.time_start) + Number(dipRow.time_end)) / 2;

    for (const [index, personId] of people.slice(0, 6).entries()) {
      await judge(personId, clearDip, 'dip', middle + (index - 3) * 0.01);
      await judge(personId, clearFlat, 'flat');
      await judge(personId, planted, 'dip');
    }
    requests.request(campaignId);
    await eventually(async () => (await snippet(clearDip)).state === 'settled', 'the clear dip settles');
    await eventually(async () => (await snippet(clearFlat)).state === 'settled', 'the flat one settles');

    expect(await snippet(clearDip)).toMatchObject({
      state: 'settled',
      outcome: 'dip',
      needs_rescore: database.name === 'sqlite' ? 0 : false,
    });
    expect(Number((await snippet(clearDip)).consensus_score)).toBeGreaterThan(0.95);
    expect(await snippet(clearFlat)).toMatchObject({ state: 'settled', outcome: 'flat' });
    // A planted control settles like any snippet (that is how completeness is measured), but is no dip.
    expect(await snippet(planted)).toMatchObject({ state: 'settled', outcome: 'dip' });
    const dips = await db('dips').where({ campaign_id: campaignId });
    expect(dips.map((dip) => dip.snippet_id)).toEqual([clearDip]);
    expect(Number(dips[0].time_center)).toBeCloseTo(middle, 1);
    const finders = await db('dip_finders')
      .where({ dip_id: dips[0].id })
      .orderBy('person_id')
      .pluck('person_id');
    expect(finders).toEqual(people.slice(0, 6));
    // My record credits them; a volunteer who said flat there is not credited.
    expect((await myRecord(db, people[0]!)).dipsHelped).toBe(1);
    expect((await myRecord(db, people[7]!)).dipsHelped).toBe(0);
    // Their verdict on the planted control is now part of their record.
    const record = await db('reliability').where({ campaign_id: campaignId, person_id: people[0] }).first();
    expect(record).toMatchObject({ planted_seen: 1, planted_found: 1 });

    // Even votes all the way to the campaign's maximum go to the Desk.
    for (const [index, personId] of people.entries())
      await judge(personId, mixed, index % 2 ? 'dip' : 'flat');
    requests.request(campaignId);
    await eventually(async () => (await snippet(mixed)).state !== 'open', 'the mixed one leaves the Deck');
    expect(await snippet(mixed)).toMatchObject({
      state: 'split',
      split_reason: 'max_verdicts',
      outcome: null,
    });
    requests.close();
  });

  it('a repeated rescore changes nothing, and the sweep finds snippets no job took', async () => {
    const campaignId = await createCampaign(db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(db, campaignId, { targets: 2, real: 3, quiet: 1 });
    const people = await volunteers(6);
    for (const personId of people) {
      await judge(personId, snippetIds.real[0]!, 'dip');
      await judge(personId, snippetIds.real[1]!, 'flat');
      await judge(personId, snippetIds.quiet[0]!, 'flat');
    }
    // No request was made: the sweep queues the job.
    expect(await sweepDirtySnippets(db, queues)).toEqual([campaignId]);
    await eventually(
      async () =>
        Number(
          (await db('snippets').where({ campaign_id: campaignId, needs_rescore: true }).count({ n: '*' }))[0]!
            .n,
        ) === 0,
      'the swept campaign is rescored',
    );
    // Everything rescored once more (the snippet nobody judged gets its prior score), then again.
    await markCampaignForRescore(db, campaignId);
    await rescoreDirtySnippets(db, campaignId);
    const first = await consensusState(campaignId);
    await markCampaignForRescore(db, campaignId);
    await rescoreDirtySnippets(db, campaignId);
    expect(await consensusState(campaignId)).toEqual(first);
    expect(await sweepDirtySnippets(db, queues)).toEqual([]);
  });

  it('a re-estimate is deterministic, and one that would flip a settled snippet sends it to the Desk', async () => {
    const campaignId = await createCampaign(db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(db, campaignId, {
      targets: 6,
      real: 14,
      planted: 6,
      quiet: 8,
    });
    const careless = await volunteers(5); // say dip to everything
    const careful = await volunteers(6); // right on every control
    const settledEarly = snippetIds.real[0]!;
    for (const personId of careless) await judge(personId, settledEarly, 'dip');
    await rescoreDirtySnippets(db, campaignId);
    expect(await snippet(settledEarly)).toMatchObject({ state: 'settled', outcome: 'dip' });

    // The controls show the careless ones up: dip on every quiet control.
    for (const personId of careless) {
      for (const quiet of snippetIds.quiet) await judge(personId, quiet, 'dip');
    }
    for (const personId of careful) {
      for (const quiet of snippetIds.quiet) await judge(personId, quiet, 'flat');
      for (const plantedId of snippetIds.planted) await judge(personId, plantedId, 'dip');
      for (const realId of snippetIds.real.slice(1, 9)) await judge(personId, realId, 'flat');
    }
    const summary = await reestimateCampaign(db, campaignId);
    expect(summary.converged).toBe(true);
    expect(summary.volunteers).toBe(11);

    const flipped = await snippet(settledEarly);
    expect(flipped).toMatchObject({ state: 'split', split_reason: 'outcome_changed', outcome: 'dip' });
    const carelessWeight = await db('reliability')
      .where({ campaign_id: campaignId, person_id: careless[0] })
      .first();
    const carefulWeight = await db('reliability')
      .where({ campaign_id: campaignId, person_id: careful[0] })
      .first();
    expect(Number(carelessWeight.specificity)).toBeLessThan(Number(carefulWeight.specificity));
    expect(Number(carelessWeight.weight_dip)).toBeLessThan(Number(carefulWeight.weight_dip));

    const first = await consensusState(campaignId);
    await reestimateCampaign(db, campaignId);
    expect(await consensusState(campaignId)).toEqual(first);
  });
});
