// The personal fields of a newsletter reader, counted from the database.
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { nowIso } from '../../server/db/rows';
import { personalFieldsOf } from '../../server/services/newsletters/recipients';
import { createTestApp, personWithRole, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

describe('personal fields', () => {
  it('count this month’s verdicts (UTC), the dips and candidates credited, and the busiest campaign', async () => {
    const person = await personWithRole(test.db, 'volunteer');
    const busy = await createCampaign(test.db, { status: 'live', name: 'Busy field' });
    const quiet = await createCampaign(test.db, { status: 'live', name: 'Quiet field' });
    const busySnippets = (await createSnippetFixtures(test.db, busy, { targets: 2, real: 4 })).snippetIds
      .real;
    const quietSnippets = (await createSnippetFixtures(test.db, quiet, { targets: 1, real: 2 })).snippetIds
      .real;
    const verdict = (snippetId: number, createdAt: string, withdrawn = false) => ({
      client_id: randomUUID(),
      snippet_id: snippetId,
      person_id: person.id,
      answer: 'dip',
      withdrawn_at: withdrawn ? createdAt : null,
      created_at: createdAt,
      updated_at: createdAt,
    });
    const now = new Date('2026-12-15T12:00:00Z');
    await test.db('verdicts').insert([
      verdict(busySnippets[0]!, '2026-12-01T00:00:00.000Z'),
      verdict(busySnippets[1]!, '2026-12-10T08:00:00.000Z'),
      verdict(busySnippets[2]!, '2026-11-30T23:59:59.000Z'), // last month
      verdict(busySnippets[3]!, '2026-12-11T08:00:00.000Z', true), // undone
      verdict(quietSnippets[0]!, '2026-12-12T08:00:00.000Z'),
    ]);
    // Two dips credited to the person, one of them on a candidate.
    const snippet = await test.db('snippets').where({ id: busySnippets[0] }).first('target_id');
    const dipIds: number[] = [];
    for (const [index, snippetId] of busySnippets.slice(0, 2).entries()) {
      const [row] = await test
        .db('dips')
        .insert({
          snippet_id: snippetId,
          target_id: snippet.target_id,
          campaign_id: busy,
          cluster_index: 0,
          mark_count: 1,
          time_center: 0.5 + index,
          created_at: nowIso(),
          updated_at: nowIso(),
        })
        .returning('id');
      const id = Number(typeof row === 'object' ? row.id : row);
      dipIds.push(id);
      await test.db('dip_finders').insert({ dip_id: id, person_id: person.id });
    }
    const [candidate] = await test
      .db('candidates')
      .insert({
        campaign_id: busy,
        target_id: snippet.target_id,
        state: 'promoted',
        disposition: 'planet candidate',
        created_at: nowIso(),
        updated_at: nowIso(),
      })
      .returning('id');
    const candidateId = Number(typeof candidate === 'object' ? candidate.id : candidate);
    await test
      .db('candidate_dips')
      .insert(dipIds.map((dipId) => ({ candidate_id: candidateId, dip_id: dipId })));

    expect(await personalFieldsOf(test.db, person, now)).toEqual({
      displayName: person.displayName,
      verdictsThisMonth: 3,
      dipsCredited: 2,
      candidatesCredited: 1,
      topCampaign: 'Busy field',
    });
    const newcomer = await personWithRole(test.db, 'volunteer');
    expect(await personalFieldsOf(test.db, newcomer, now)).toMatchObject({
      verdictsThisMonth: 0,
      dipsCredited: 0,
      candidatesCredited: 0,
      topCampaign: null,
    });
  });
});
