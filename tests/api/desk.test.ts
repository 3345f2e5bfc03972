import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createPerson } from '../../seeds/factories/people';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import { reestimateCampaign } from '../../server/services/consensus/reestimate-campaign';
import { rescoreDirtySnippets } from '../../server/services/consensus/rescore-snippets';
import { recordVerdict } from '../../server/services/deck/verdicts';
import { createTestApp, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp();
});

async function volunteers(count: number): Promise<number[]> {
  const ids: number[] = [];
  for (let i = 0; i < count; i += 1) ids.push((await createPerson(test.db, { reuseHash: true })).id);
  return ids;
}

const judge = (personId: number, snippetId: number, answer: 'dip' | 'flat', markTime: number | null = null) =>
  recordVerdict(test.db, { personId }, { clientId: randomUUID(), snippetId, answer, markTime });

const snippet = (id: number) => test.db('snippets').where({ id }).first();

async function auditCount(action: string): Promise<number> {
  const [row] = await test.db('audit_log').where({ action }).count({ n: '*' });
  return Number(row!.n);
}

/** A campaign with one split snippet (even votes at the maximum), and the volunteers who split it. */
async function splitSnippet() {
  const campaignId = await createCampaign(test.db, { status: 'live' });
  const { snippetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 3, real: 6, quiet: 2 });
  const people = await volunteers(15);
  const split = snippetIds.real[0]!;
  for (const [index, personId] of people.entries()) await judge(personId, split, index % 2 ? 'dip' : 'flat');
  await rescoreDirtySnippets(test.db, campaignId);
  expect(await snippet(split)).toMatchObject({ state: 'split', split_reason: 'max_verdicts' });
  return { campaignId, snippetIds, people, split };
}

describe('Desk routes', () => {
  it('refuse volunteers (403) and visitors (401)', async () => {
    const { browser } = await signedIn(test, 'volunteer');
    const paths: [method: 'get' | 'post', path: string, body?: object][] = [
      ['get', '/api/desk/splits'],
      ['get', '/api/desk/splits/1'],
      ['post', '/api/snippets/1/ruling', { ruling: 'dip' }],
      ['get', '/api/desk/volunteers'],
      ['post', '/api/desk/volunteers/1/suspend', { reason: 'x' }],
      ['post', '/api/desk/volunteers/1/restore', {}],
      ['post', '/api/desk/volunteers/1/flags/burst/clear', { note: 'x' }],
      ['post', '/api/desk/volunteers/1/warning', { note: 'x' }],
      ['get', '/api/audit'],
    ];
    for (const [method, path, body] of paths) {
      const answer = method === 'get' ? await browser.get(path) : await browser.post(path, body);
      expect(answer.status, `${method} ${path}`).toBe(403);
      const anonymous = await request(test.app)[method](path);
      expect(anonymous.status, `${method} ${path} signed out`).toBe(method === 'get' ? 401 : 403);
    }
  });
});

describe('the split queue and a ruling', () => {
  it('lists the split snippet, shows it for review, and a ruling moves it to ruled, on the record', async () => {
    const { split, people, campaignId } = await splitSnippet();
    const { browser, person: moderator } = await signedIn(test, 'moderator');
    const list = await browser.get(`/api/desk/splits?campaign=${campaignId}&order=needed`);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(1);
    expect(list.body.splits[0]).toMatchObject({
      snippetId: split,
      splitReason: 'max_verdicts',
      verdictCount: 15,
    });

    const review = await browser.get(`/api/desk/splits/${split}`);
    expect(review.status).toBe(200);
    const { verdicts, scoreHistory, series, neighbours } = review.body.review;
    expect(verdicts).toHaveLength(15);
    expect(verdicts[0]).toMatchObject({ personId: people[0], answer: 'flat' });
    expect(verdicts[0].weight).toBeLessThan(0); // a flat verdict lowers the log-odds
    expect(scoreHistory).toHaveLength(15);
    expect(series.hours.length).toBeGreaterThan(10);
    expect(series.hours.length).toBe(series.ppm.length);
    expect(neighbours.length).toBeGreaterThan(0);

    const ruled = await browser.post(`/api/snippets/${split}/ruling`, {
      ruling: 'systematic',
      note: 'A jump after the gap',
    });
    expect(ruled.status).toBe(201);
    expect(ruled.body).toMatchObject({
      snippet: { id: split, state: 'ruled', outcome: 'flat' },
      ruling: { ruling: 'systematic' },
    });
    expect(await snippet(split)).toMatchObject({ state: 'ruled', outcome: 'flat' });
    const [entry] = await test.db('audit_log').where({ action: 'snippet.ruled', entity_id: String(split) });
    expect(entry).toMatchObject({ actor_id: moderator.id, note: 'A jump after the gap' });
    expect((await browser.get(`/api/desk/splits?campaign=${campaignId}`)).body.total).toBe(0);
  });

  it('makes the ruling a known truth: those who voted against it lose reliability at the next re-estimate', async () => {
    const { split, people, campaignId } = await splitSnippet();
    // Some reliability history on quiet controls first, the same for everyone.
    await reestimateCampaign(test.db, campaignId);
    const weightOf = async (personId: number) =>
      Number(
        (await test.db('reliability').where({ campaign_id: campaignId, person_id: personId }).first())
          .specificity,
      );
    const dipVoter = people[1]!; // said dip
    const flatVoter = people[0]!; // said flat
    const before = { dip: await weightOf(dipVoter), flat: await weightOf(flatVoter) };
    const { browser } = await signedIn(test, 'moderator');
    expect((await browser.post(`/api/snippets/${split}/ruling`, { ruling: 'flat' })).status).toBe(201);
    await reestimateCampaign(test.db, campaignId);
    expect(await weightOf(dipVoter)).toBeLessThan(before.dip);
    expect(await weightOf(flatVoter)).toBeGreaterThan(before.flat);
  });

  it('answers 400 for a bad ruling or note and 404 for an unknown snippet, changing nothing', async () => {
    const { split } = await splitSnippet();
    const { browser } = await signedIn(test, 'moderator');
    const bad = await browser.post(`/api/snippets/${split}/ruling`, { ruling: 'maybe' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('ruling');
    const long = await browser.post(`/api/snippets/${split}/ruling`, {
      ruling: 'dip',
      note: 'x'.repeat(2_001),
    });
    expect(long.status).toBe(400);
    expect(long.body.error.fields).toHaveProperty('note');
    expect((await browser.post('/api/snippets/999999/ruling', { ruling: 'dip' })).status).toBe(404);
    expect((await browser.get('/api/desk/splits/999999')).status).toBe(404);
    expect((await browser.get('/api/desk/splits?order=newest')).status).toBe(400);
    expect(await snippet(split)).toMatchObject({ state: 'split' });
  });
});

describe('the volunteer audit', () => {
  it('suspending a volunteer changes the consensus where their verdict was decisive, and restoring brings it back', async () => {
    const campaignId = await createCampaign(test.db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 2, real: 3 });
    const [decided] = snippetIds.real as [number];
    const people = await volunteers(5);
    for (const personId of people) await judge(personId, decided, 'flat');
    await rescoreDirtySnippets(test.db, campaignId);
    expect(await snippet(decided)).toMatchObject({ state: 'settled', outcome: 'flat' });
    const scoreBefore = Number((await snippet(decided)).consensus_score);

    const { browser } = await signedIn(test, 'moderator');
    const suspended = await browser.post(`/api/desk/volunteers/${people[0]}/suspend`, {
      reason: 'Testing the rules',
    });
    expect(suspended.status).toBe(200);
    expect(suspended.body).toMatchObject({ volunteer: { id: people[0], suspended: true }, rescoring: 1 });
    await rescoreDirtySnippets(test.db, campaignId);
    // Four flat verdicts are short of the five a settled outcome rests on, so it goes to the Desk.
    const without = await snippet(decided);
    expect(Number(without.consensus_score)).toBeGreaterThan(scoreBefore);
    expect(without).toMatchObject({ state: 'split', split_reason: 'outcome_changed' });

    const restored = await browser.post(`/api/desk/volunteers/${people[0]}/restore`, { note: 'Cleared' });
    expect(restored.status).toBe(200);
    expect(restored.body.volunteer.suspended).toBe(false);
    await rescoreDirtySnippets(test.db, campaignId);
    const back = await snippet(decided);
    expect(Number(back.consensus_score)).toBeCloseTo(scoreBefore, 12);
    expect(back).toMatchObject({ state: 'settled', outcome: 'flat', split_reason: null });
    expect(await auditCount('volunteer.suspended')).toBeGreaterThanOrEqual(1);
    expect(await auditCount('volunteer.restored')).toBeGreaterThanOrEqual(1);
  });

  it('flags an automated account with its reason, and a careful one not; a cleared flag says who and why', async () => {
    const campaignId = await createCampaign(test.db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 10, real: 120 });
    const [bot, careful] = await volunteers(2);
    const now = Date.now();
    const rows = snippetIds.real.flatMap((snippetId, i) => [
      // The automated account answers every 0.4 s, always flat.
      { person: bot!, snippetId, answer: 'flat', elapsed: 300, at: now - 60_000 + i * 400 },
      {
        person: careful!,
        snippetId,
        answer: i % 7 ? 'flat' : 'dip',
        elapsed: 4_000,
        at: now - 3_600_000 + i * 6_000,
      },
    ]);
    for (const row of rows) {
      await test.db('verdicts').insert({
        client_id: randomUUID(),
        snippet_id: row.snippetId,
        person_id: row.person,
        answer: row.answer,
        elapsed_ms: row.elapsed,
        created_at: new Date(row.at).toISOString(),
        updated_at: new Date(row.at).toISOString(),
      });
    }
    const { browser } = await signedIn(test, 'moderator');
    const audit = await browser.get(
      `/api/desk/volunteers?campaign=${campaignId}&flagged=true&sort=verdicts&order=desc`,
    );
    expect(audit.status).toBe(200);
    const found = audit.body.volunteers.find((v: { id: number }) => v.id === bot);
    expect(found.flags.map((flag: { code: string }) => flag.code).sort()).toEqual([
      'burst',
      'one_answer',
      'too_fast',
    ]);
    expect(found.flags[0].reason).toMatch(/\d/);
    expect(audit.body.volunteers.some((v: { id: number }) => v.id === careful)).toBe(false);

    const cleared = await browser.post(`/api/desk/volunteers/${bot}/flags/burst/clear`, {
      note: 'A school class, one laptop',
    });
    expect(cleared.status).toBe(200);
    const burst = cleared.body.volunteer.flags.find((flag: { code: string }) => flag.code === 'burst');
    expect(burst.cleared).toMatchObject({ note: 'A school class, one laptop' });
    expect(await auditCount('volunteer.flag_cleared')).toBe(1);

    const warned = await browser.post(`/api/desk/volunteers/${bot}/warning`, {
      note: 'Please take your time',
    });
    expect(warned.status).toBe(201);
    // The bare test app has no queues, so nothing is mailed (tests/api/mail.test.ts sends one).
    expect(warned.body).toEqual({ recorded: true, emailed: false });
    expect(await auditCount('volunteer.warned')).toBe(1);

    expect((await browser.post(`/api/desk/volunteers/${bot}/flags/slow/clear`, { note: 'x' })).status).toBe(
      400,
    );
    expect((await browser.post(`/api/desk/volunteers/${bot}/warning`, { note: '  ' })).status).toBe(400);
    expect((await browser.get('/api/desk/volunteers?sort=shoe')).status).toBe(400);
  });

  it('will not suspend staff from the Desk (that is an admin’s job)', async () => {
    const { browser } = await signedIn(test, 'moderator');
    const scientist = await createPerson(test.db, { role: 'scientist', reuseHash: true });
    const answer = await browser.post(`/api/desk/volunteers/${scientist.id}/suspend`, { reason: 'x' });
    expect(answer.status).toBe(409);
    expect(answer.body.error.code).toBe('cannot_suspend_staff');
    expect((await browser.post('/api/desk/volunteers/999999/suspend', { reason: 'x' })).status).toBe(404);
  });
});

describe('the audit log', () => {
  it('lists entries newest first with who did it, filters them, and has no way to change them', async () => {
    const { browser, person } = await signedIn(test, 'moderator');
    const list = await browser.get('/api/audit?action=snippet.ruled&limit=5');
    expect(list.status).toBe(200);
    expect(list.body.total).toBeGreaterThanOrEqual(1);
    for (const entry of list.body.entries) expect(entry.action).toBe('snippet.ruled');
    const ids = list.body.entries.map((entry: { id: number }) => entry.id);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
    expect((await browser.get('/api/audit?from=yesterday')).status).toBe(400);
    const future = new Date(Date.now() + 86_400_000).toISOString();
    expect((await browser.get(`/api/audit?from=${encodeURIComponent(future)}`)).body.total).toBe(0);
    const id = ids[0];
    expect(
      (await browser.agent.delete(`/api/audit/${id}`).set('X-CSRF-Token', await browser.csrf())).status,
    ).toBe(404);
    expect(
      (await browser.agent.patch(`/api/audit/${id}`).set('X-CSRF-Token', await browser.csrf())).status,
    ).toBe(404);
    expect(person.role).toBe('moderator');
  });
});
