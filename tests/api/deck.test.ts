import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { updatePerson } from '../../server/db/people';
import { createRandom } from '../../server/science/random';
import { nextCards } from '../../server/services/deck/next-cards';
import { Browser, createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let campaignId: number;
let fixtures: Awaited<ReturnType<typeof createSnippetFixtures>>;

beforeAll(async () => {
  test = await createTestApp();
  campaignId = await createCampaign(test.db, { status: 'live' });
  await test
    .db('campaigns')
    .where({ id: campaignId })
    .update({ planted_share: 0.1, quiet_share: 0.05, feedback_rate: 1 });
  fixtures = await createSnippetFixtures(test.db, campaignId, {
    targets: 40,
    real: 400,
    planted: 120,
    quiet: 80,
  });
});

const verdict = (snippetId: number, answer = 'flat', extra: object = {}) => ({
  clientId: randomUUID(),
  snippetId,
  answer,
  ...extra,
});

describe('GET /api/deck/next', () => {
  it('answers only what a card needs: no kind, no truth, no target, no verdicts', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const response = await browser.get(`/api/deck/next?campaign=${campaignId}&count=5`);
    expect(response.status).toBe(200);
    expect(response.body.cards).toHaveLength(5);
    for (const card of response.body.cards) {
      expect(Object.keys(card).sort()).toEqual(
        [
          'campaign',
          'cadenceMinutes',
          'durationHours',
          'hours',
          'pointCount',
          'ppm',
          'snippetId',
          'timeStart',
        ].sort(),
      );
      expect(JSON.stringify(card)).not.toMatch(/planted|quiet|truth|kind|FIX-|verdict/);
      expect(card.hours).toHaveLength(card.ppm.length);
    }
  });

  it('never serves a snippet the person judged, nor the cards they hold, nor one target twice in a row', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const judged = new Set<number>();
    for (let round = 0; round < 10; round += 1) {
      const { cards } = (await browser.get(`/api/deck/next?campaign=${campaignId}&count=3`)).body;
      for (const card of cards) {
        expect(judged.has(card.snippetId)).toBe(false);
        judged.add(card.snippetId);
        expect((await browser.post('/api/verdicts', verdict(card.snippetId))).status).toBe(201);
      }
    }
    const held = (await browser.get(`/api/deck/next?campaign=${campaignId}&count=3`)).body.cards.map(
      (c: { snippetId: number }) => c.snippetId,
    );
    const more = (
      await browser.get(`/api/deck/next?campaign=${campaignId}&count=3&exclude=${held.join(',')}`)
    ).body.cards;
    for (const card of more) expect(held).not.toContain(card.snippetId);
    const sequence = await nextCards(test.db, {
      campaignId,
      count: 10,
      judge: { guestKey: 'sequence' },
      exclude: [],
    });
    const targets = await Promise.all(
      sequence.map(
        async (card) => (await test.db('snippets').where({ id: card.snippetId }).first()).target_id,
      ),
    );
    for (let i = 1; i < targets.length; i += 1) expect(targets[i]).not.toBe(targets[i - 1]);
  });

  it('mixes planted and quiet controls in at the campaign’s rates (10% and 5%, each within ±2 points over 2,000 cards)', async () => {
    const random = createRandom('deck-rates');
    const kinds = { real: 0, planted: 0, quiet: 0 };
    const kindOf = new Map<number, 'real' | 'planted' | 'quiet'>();
    for (const kind of ['real', 'planted', 'quiet'] as const)
      for (const id of fixtures.snippetIds[kind]) kindOf.set(id, kind);
    for (let i = 0; i < 2000; i += 1) {
      const [card] = await nextCards(test.db, {
        campaignId,
        count: 1,
        judge: { guestKey: `rates-${i}` },
        exclude: [],
        random: () => random.next(),
      });
      kinds[kindOf.get(card!.snippetId)!] += 1;
    }
    expect(Math.abs(kinds.planted / 2000 - 0.1)).toBeLessThanOrEqual(0.02);
    expect(Math.abs(kinds.quiet / 2000 - 0.05)).toBeLessThanOrEqual(0.02);
    console.info(`control rates over 2000 cards: planted ${kinds.planted / 20}%, quiet ${kinds.quiet / 20}%`);
  });

  it('never serves a paused or closed campaign, and gives a suspended account no cards', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    // A draft does not exist for the Deck: neither its status nor that it exists is told.
    const draft = await createCampaign(test.db, { status: 'draft' });
    await createSnippetFixtures(test.db, draft, { targets: 2, real: 4 });
    const unknown = await browser.get('/api/deck/next?campaign=999999');
    const drafted = await browser.get(`/api/deck/next?campaign=${draft}`);
    expect([drafted.status, unknown.status]).toEqual([404, 404]);
    expect(drafted.body).toEqual(unknown.body);
    for (const status of ['paused', 'closed']) {
      const other = await createCampaign(test.db, { status: status as 'paused' | 'closed' });
      await createSnippetFixtures(test.db, other, { targets: 2, real: 4 });
      const response = await browser.get(`/api/deck/next?campaign=${other}`);
      expect(response.status, status).toBe(409);
      expect(response.body.error.code).toBe('campaign_not_live');
    }
    await updatePerson(test.db, person.id, { suspendedAt: new Date().toISOString() });
    const suspended = await browser.get(`/api/deck/next?campaign=${campaignId}`);
    expect(suspended.body).toEqual({ cards: [], reason: 'suspended' });
    expect((await browser.post('/api/verdicts', verdict(fixtures.snippetIds.real[0]!))).status).toBe(403);
  });
});

describe('POST /api/verdicts', () => {
  it('stores one verdict for two posts with the same client id, and reveals the target and control feedback', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    const snippetId = fixtures.snippetIds.planted[3]!;
    const body = verdict(snippetId, 'dip', { markTime: 1 });
    const first = await browser.post('/api/verdicts', body);
    const again = await browser.post('/api/verdicts', body);
    expect(first.status).toBe(201);
    expect(again.status).toBe(200);
    expect(again.body.verdict).toEqual(first.body.verdict);
    expect(await test.db('verdicts').where({ snippet_id: snippetId, person_id: person.id })).toHaveLength(1);
    expect(first.body.reveal.designation).toMatch(/^FIX-/);
    expect(first.body.reveal.feedback).toMatchObject({ kind: 'planted', durationHours: 3 }); // feedback rate 1 here
    const row = await test.db('snippets').where({ id: snippetId }).first();
    expect(row.verdict_count).toBeGreaterThanOrEqual(1);
  });

  it('a later verdict on the same snippet changes it while the snippet is open; an older retried one changes nothing', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    const snippetId = fixtures.snippetIds.real[7]!;
    const older = verdict(snippetId, 'flat');
    await browser.post('/api/verdicts', older);
    await browser.post('/api/verdicts', verdict(snippetId, 'dip'));
    expect((await browser.post('/api/verdicts', older)).status).toBe(200);
    const rows = await test.db('verdicts').where({ snippet_id: snippetId, person_id: person.id });
    expect(rows.map((r) => r.answer)).toEqual(['dip']);
  });

  it('answers 400 naming the field for a bad answer, a mark outside the snippet, or a missing client id', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const snippetId = fixtures.snippetIds.real[8]!;
    const badAnswer = await browser.post('/api/verdicts', verdict(snippetId, 'maybe'));
    expect(badAnswer.status).toBe(400);
    expect(badAnswer.body.error.fields.answer).toBeDefined();
    const outside = await browser.post('/api/verdicts', verdict(snippetId, 'dip', { markTime: 99 }));
    expect(outside.status).toBe(400);
    expect(outside.body.error.fields.markTime).toBeDefined();
    const noId = await browser.post('/api/verdicts', { snippetId, answer: 'flat' });
    expect(noId.body.error.fields.clientId).toBeDefined();
    const unknown = await browser.post('/api/verdicts', verdict(99_999_999));
    expect(unknown.body.error.fields.snippetId).toBeDefined();
  });

  it('takes back a verdict within 15 seconds, and not after', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const snippetId = fixtures.snippetIds.real[9]!;
    const body = verdict(snippetId, 'dip');
    await browser.post('/api/verdicts', body);
    const before = (await test.db('snippets').where({ id: snippetId }).first()).verdict_count;
    expect((await browser.delete(`/api/verdicts/${body.clientId}`)).status).toBe(204);
    expect((await test.db('snippets').where({ id: snippetId }).first()).verdict_count).toBe(before - 1);
    const late = verdict(fixtures.snippetIds.real[10]!, 'flat');
    await browser.post('/api/verdicts', late);
    await test
      .db('verdicts')
      .where({ client_id: late.clientId })
      .update({ updated_at: new Date(Date.now() - 20_000).toISOString() });
    expect((await browser.delete(`/api/verdicts/${late.clientId}`)).status).toBe(409);
    const { browser: other } = await signedIn(test, 'volunteer');
    expect((await other.delete(`/api/verdicts/${late.clientId}`)).status).toBe(404);
  });
});

describe('trying before signing up', () => {
  it('a visitor judges up to 20 cards; the verdicts do not count until they sign up, then they do', async () => {
    const visitor = new Browser(test.app);
    const ids = fixtures.snippetIds.real.slice(100, 121);
    for (const id of ids.slice(0, 20))
      expect((await visitor.post('/api/verdicts', verdict(id))).status).toBe(201);
    const refused = await visitor.post('/api/verdicts', verdict(ids[20]!));
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('guest_limit');
    const counts = async () =>
      (await test.db('snippets').whereIn('id', ids.slice(0, 20)).sum({ n: 'verdict_count' }))[0]?.n;
    const uncounted = Number(await counts());
    const signUp = await visitor.post('/api/auth/sign-up', {
      email: `guest-${Date.now()}@example.com`,
      displayName: 'Former Guest',
      password: 'a long enough passphrase',
    });
    expect(signUp.status).toBe(201);
    const person = signUp.body.person;
    expect(await test.db('verdicts').where({ person_id: person.id })).toHaveLength(20);
    expect(Number(await counts())).toBe(uncounted + 20);
  });

  it('a visitor without a session gets cards too (the deck is public)', async () => {
    const response = await request(test.app).get(`/api/deck/next?campaign=${campaignId}&count=2`);
    expect(response.status).toBe(200);
    expect(response.body.cards).toHaveLength(2);
  });
});

describe('GET /api/record', () => {
  it('counts a person’s verdicts and their accuracy on controls once they have seen enough', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    for (const id of fixtures.snippetIds.planted.slice(40, 46))
      await browser.post('/api/verdicts', verdict(id, 'dip', { markTime: undefined }));
    for (const id of fixtures.snippetIds.quiet.slice(40, 44))
      await browser.post('/api/verdicts', verdict(id, 'flat'));
    await browser.post('/api/verdicts', verdict(fixtures.snippetIds.planted[46]!, 'flat'));
    const { record } = (await browser.get('/api/record')).body;
    expect(record.verdicts).toMatchObject({ total: 11, dip: 6, flat: 5, unsure: 0, last30Days: 11 });
    expect(record.controls).toMatchObject({ plantedSeen: 7, plantedFound: 6, quietSeen: 4, quietCorrect: 4 });
    expect(record.controls.sensitivity).toBeCloseTo(6 / 7, 10);
    expect(record.controls.specificity).toBeNull(); // fewer than 5 quiet controls so far
    expect(record.recent).toHaveLength(11);
    expect((await request(test.app).get('/api/record')).status).toBe(401);
  });
});
