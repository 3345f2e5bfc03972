// Verdicts posted to the API are scored in the background: the app asks for a rescore, the embedded
// worker settles the snippet, and the snippet leaves the Deck.
import { randomUUID } from 'node:crypto';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { eventually } from '../support/eventually';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp({ queues: true });
});

describe('consensus behind POST /api/verdicts', () => {
  it('settles a snippet once enough volunteers agree, and the Deck stops serving it', async () => {
    const campaignId = await createCampaign(test.db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 2, real: 2 });
    const [target, other] = snippetIds.real as [number, number];
    const browsers = [];
    for (let i = 0; i < 6; i += 1) browsers.push((await signedIn(test, 'volunteer')).browser);
    for (const browser of browsers.slice(0, 5)) {
      const response = await browser.post('/api/verdicts', {
        clientId: randomUUID(),
        snippetId: target,
        answer: 'flat',
      });
      expect(response.status).toBe(201);
    }
    await eventually(
      async () => (await test.db('snippets').where({ id: target }).first()).state === 'settled',
      'the snippet settles',
    );
    const settled = await test.db('snippets').where({ id: target }).first();
    expect(settled.outcome).toBe('flat');
    expect(Boolean(settled.needs_rescore)).toBe(false);
    const next = await browsers[5]!.get(`/api/deck/next?campaign=${campaignId}&count=5`);
    expect(next.body.cards.map((card: { snippetId: number }) => card.snippetId)).toEqual([other]);
    const late = await browsers[5]!.post('/api/verdicts', {
      clientId: randomUUID(),
      snippetId: target,
      answer: 'dip',
    });
    expect(late.status).toBe(409);
    expect(late.body.error.code).toBe('snippet_not_open');
  });
});
