// A person cannot read or change another person's things by changing an id (or a field) in a request:
// each id-taking route a volunteer, moderator or scientist reaches, and what the other person holds
// read back from the database afterwards.
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCampaign } from '../../seeds/factories/campaigns';
import { createSnippetFixtures } from '../../seeds/factories/snippets';
import type { Role } from '../../server/auth/roles';
import { resolveSessionSecret } from '../../server/auth/session-secret';
import { insertMailMessage, mailMessagesTo } from '../../server/db/mail-messages';
import { type PersonRow, updatePerson } from '../../server/db/people';
import { nowIso } from '../../server/db/rows';
import { signUnsubscribeToken } from '../../server/mail/unsubscribe-token';
import { eventually } from '../support/eventually';
import { Browser, createTestApp, personWithRole, signedIn, type TestApp } from './support/test-app';

// A light curve from tests/reference/make_reference.py (an invented star, written by astropy 5.2.1).
const SHALLOW_CSV = path.resolve(import.meta.dirname, '../fixtures/reference/shallow-transit.csv');

let test: TestApp;
beforeAll(async () => {
  test = await createTestApp({ queues: true, env: { MAIL_RATE_PER_S: '50' } });
});

// A sign-in costs a full-strength scrypt, so tests that only act through a browser share one per name.
const sessions = new Map<string, ReturnType<typeof signedIn>>();
function session(role: Role, name: string = role) {
  if (!sessions.has(name)) sessions.set(name, signedIn(test, role));
  return sessions.get(name)!;
}

const personRow = (id: number) => test.db('people').where({ id }).first();
const withBearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });

async function auditOf(action: string, entityId: number | string) {
  return test.db('audit_log').where({ action, entity_id: String(entityId) });
}

describe('API tokens', () => {
  it('another scientist, an admin, or another token cannot list or revoke a token by its id (404); it keeps working', async () => {
    const { browser: owner, person: ownerPerson } = await session('scientist');
    const { token, secret } = (await owner.post('/api/tokens', { name: 'private' })).body;
    const { browser: other } = await session('scientist', 'another scientist');
    const otherSecret = (await other.post('/api/tokens', { name: 'mine' })).body.secret;
    const { browser: admin } = await session('admin');

    for (const browser of [other, admin]) {
      const listed = (await browser.get('/api/tokens')).body.tokens.map((t: { id: number }) => t.id);
      expect(listed).not.toContain(token.id);
      const revoked = await browser.delete(`/api/tokens/${token.id}`);
      expect(revoked.status).toBe(404);
      expect(revoked.body.error.code).toBe('not_found');
    }
    const byToken = await request(test.app).delete(`/api/tokens/${token.id}`).set(withBearer(otherSecret));
    expect(byToken.status).toBe(404);
    const listedByToken = await request(test.app).get('/api/tokens').set(withBearer(otherSecret));
    expect(listedByToken.body.tokens.map((t: { id: number }) => t.id)).not.toContain(token.id);

    expect((await test.db('api_tokens').where({ id: token.id }).first()).revoked_at).toBeNull();
    expect(await auditOf('token.revoked', token.id)).toEqual([]);
    const me = await request(test.app).get('/api/auth/me').set(withBearer(secret));
    expect(me.status).toBe(200);
    expect(me.body.person.id).toBe(ownerPerson.id);
    // The owner can revoke it: the 404s above were about whose token it is.
    expect((await owner.delete(`/api/tokens/${token.id}`)).status).toBe(204);
  });
});

describe('the outbox', () => {
  it('shows a message only to admins, not even to the person it was sent to', async () => {
    const { browser: recipient, person } = await session('volunteer');
    const messageId = await insertMailMessage(test.db, {
      messageId: `<${randomUUID()}@example.com>`,
      from: 'dipdeck@example.com',
      to: [person.email!],
      subject: 'Choose a new password',
      headers: [],
      text: 'A private link',
      html: null,
      sizeBytes: 14,
    });
    const { browser: moderator } = await session('moderator');
    const { browser: scientist } = await session('scientist');
    for (const browser of [recipient, moderator, scientist]) {
      for (const url of [`/api/admin/outbox/${messageId}`, '/api/admin/outbox']) {
        const answer = await browser.get(url);
        expect(answer.status, url).toBe(403);
        expect(answer.body.error.code).toBe('forbidden');
        expect(answer.text).not.toContain('A private link');
      }
    }
    const { browser: admin } = await session('admin');
    const read = await admin.get(`/api/admin/outbox/${messageId}`);
    expect(read.status).toBe(200);
    expect(read.body.message.to).toEqual([person.email]);
  });
});

describe('verdicts', () => {
  async function liveSnippets() {
    const campaignId = await createCampaign(test.db, { status: 'live' });
    const { snippetIds } = await createSnippetFixtures(test.db, campaignId, { targets: 2, real: 4 });
    return snippetIds.real;
  }
  const verdictOf = (clientId: string) =>
    test
      .db('verdicts')
      .join('verdict_receipts', 'verdict_receipts.verdict_id', 'verdicts.id')
      .where('verdict_receipts.client_id', clientId)
      .first('verdicts.*');

  it('another volunteer cannot undo or change a verdict by its client id, nor see it in their record', async () => {
    const [first, second] = await liveSnippets();
    const { browser: owner, person } = await signedIn(test, 'volunteer');
    const clientId = randomUUID();
    expect((await owner.post('/api/verdicts', { clientId, snippetId: first, answer: 'flat' })).status).toBe(
      201,
    );
    const before = await verdictOf(clientId);
    const countBefore = (await test.db('snippets').where({ id: first }).first()).verdict_count;

    const { browser: other } = await session('volunteer');
    const undone = await other.delete(`/api/verdicts/${clientId}`);
    expect(undone.status).toBe(404);
    for (const snippetId of [first, second]) {
      const changed = await other.post('/api/verdicts', { clientId, snippetId, answer: 'dip' });
      expect(changed.status).toBe(409);
      expect(changed.body.error.code).toBe('client_id_taken');
    }
    const theirRecord = (await other.get(`/api/record?personId=${person.id}`)).body.record;
    expect(theirRecord.recent.map((verdict: { snippetId: number }) => verdict.snippetId)).not.toContain(
      first,
    );

    expect(await verdictOf(clientId)).toEqual(before);
    expect(before).toMatchObject({ person_id: person.id, answer: 'flat', withdrawn_at: null });
    expect((await test.db('snippets').where({ id: first }).first()).verdict_count).toBe(countBefore);
    expect((await owner.get('/api/record')).body.record.verdicts.total).toBe(1);
    // The owner can take it back: the 404 above was about whose verdict it is.
    expect((await owner.delete(`/api/verdicts/${clientId}`)).status).toBe(204);
  });

  it('a visitor’s verdicts are kept by their session only: another visitor or person cannot undo, change or claim them', async () => {
    const [first, second] = await liveSnippets();
    const visitor = new Browser(test.app);
    const clientId = randomUUID();
    expect((await visitor.post('/api/verdicts', { clientId, snippetId: first, answer: 'dip' })).status).toBe(
      201,
    );
    const before = await verdictOf(clientId);
    expect(before.guest_key).toEqual(expect.any(String));

    const otherVisitor = new Browser(test.app);
    const { browser: person } = await session('volunteer');
    for (const browser of [otherVisitor, person]) {
      expect((await browser.delete(`/api/verdicts/${clientId}`)).status).toBe(404);
      const changed = await browser.post('/api/verdicts', { clientId, snippetId: first, answer: 'flat' });
      expect(changed.status).toBe(409);
    }
    // The guest key lives in the session; a request cannot name one.
    const named = await otherVisitor.post('/api/verdicts', {
      clientId: randomUUID(),
      snippetId: second,
      answer: 'flat',
      guestKey: before.guest_key,
    });
    expect(named.status).toBe(400);

    // The other visitor judges once and signs in: only their own verdict comes with them.
    const theirs = randomUUID();
    await otherVisitor.post('/api/verdicts', { clientId: theirs, snippetId: second, answer: 'flat' });
    const claimant = await personWithRole(test.db, 'volunteer');
    expect((await otherVisitor.signIn(claimant.email!)).status).toBe(200);
    expect((await verdictOf(theirs)).person_id).toBe(claimant.id);

    expect(await verdictOf(clientId)).toEqual(before);
    expect(before).toMatchObject({ person_id: null, answer: 'dip', withdrawn_at: null });
  });
});

describe('PATCH /api/auth/me', () => {
  const unchanged = (row: Record<string, unknown>) => ({
    role: row.role,
    suspended_at: row.suspended_at,
    email: row.email,
    display_name: row.display_name,
    email_confirmed_at: row.email_confirmed_at,
    newsletter_opt_in: row.newsletter_opt_in,
    deleted_at: row.deleted_at,
  });

  it('sets no role, suspension, address or other person, whatever the body holds (400), in a session or with a token', async () => {
    const { browser, person } = await session('scientist');
    const other = await personWithRole(test.db, 'volunteer');
    const secret = (await browser.post('/api/tokens', { name: 'script' })).body.secret;
    const mine = unchanged(await personRow(person.id));
    const theirs = unchanged(await personRow(other.id));
    const attempts = [
      { role: 'admin' },
      { displayName: 'Still me', role: 'admin' },
      { suspended: true },
      { suspendedAt: null },
      { email: 'someone-else@example.com' },
      { emailConfirmedAt: nowIso() },
      { id: other.id, displayName: 'Renamed' },
      { personId: other.id, newsletterOptIn: true },
      { deletedAt: nowIso() },
    ];
    for (const body of attempts) {
      const inSession = await browser.patch('/api/auth/me', body);
      expect(inSession.status, JSON.stringify(body)).toBe(400);
      const byToken = await request(test.app).patch('/api/auth/me').set(withBearer(secret)).send(body);
      expect(byToken.status, JSON.stringify(body)).toBe(400);
    }
    // Nor can an id elsewhere in the request point the change at someone else.
    const elsewhere = await browser.patch(`/api/auth/me?id=${other.id}&personId=${other.id}`, {
      displayName: 'Renamed',
    });
    expect(elsewhere.status).toBe(200);
    expect(elsewhere.body.person.id).toBe(person.id);

    expect(unchanged(await personRow(person.id))).toEqual({ ...mine, display_name: 'Renamed' });
    expect(unchanged(await personRow(other.id))).toEqual(theirs);
    // No admin route either, for anyone below an admin.
    const promoted = await browser.patch(`/api/admin/people/${person.id}`, { role: 'admin' });
    expect(promoted.status).toBe(403);
    expect((await personRow(person.id)).role).toBe('scientist');
  });

  it('lets a suspended person change their name but never lift their own suspension', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    await updatePerson(test.db, person.id, { suspendedAt: nowIso(), suspendedReason: 'spam' });
    const suspendedAt = (await personRow(person.id)).suspended_at;
    for (const body of [{ suspended: false }, { suspendedAt: null }, { suspendedReason: null }]) {
      expect((await browser.patch('/api/auth/me', body)).status, JSON.stringify(body)).toBe(400);
    }
    expect((await browser.patch('/api/auth/me', { displayName: 'Quiet now' })).status).toBe(200);
    expect(await personRow(person.id)).toMatchObject({
      suspended_at: suspendedAt,
      suspended_reason: 'spam',
      display_name: 'Quiet now',
    });
  });
});

describe('DELETE /api/auth/me', () => {
  it('deletes only the caller, whichever id the body names', async () => {
    const { browser, person } = await signedIn(test, 'volunteer');
    const other = await personWithRole(test.db, 'volunteer');
    const answer = await browser.delete('/api/auth/me', {
      password: 'a long test passphrase',
      id: other.id,
      personId: other.id,
    });
    expect(answer.status).toBe(200);
    expect((await personRow(person.id)).deleted_at).not.toBeNull();
    expect(await personRow(other.id)).toMatchObject({ deleted_at: null, email: other.email });
  });
});

describe('jobs', () => {
  it('the job of another scientist’s upload is refused (403 not_your_job), and cannot be retried', async () => {
    const { browser: uploader, person } = await session('scientist');
    const campaignId = (await uploader.post('/api/campaigns', { name: 'Object access uploads' })).body
      .campaign.id;
    const token = await uploader.csrf();
    const uploaded = await uploader.agent
      .post(`/api/campaigns/${campaignId}/light-curves`)
      .set('X-CSRF-Token', token)
      .attach('files', SHALLOW_CSV);
    expect(uploaded.status).toBe(202);
    const uploadId = uploaded.body.uploads[0].id as number;
    const upload = await test.db('uploads').where({ id: uploadId }).first();
    expect(upload.job_id).toEqual(expect.any(String));
    const ref = upload.job_id as string;

    const { browser: otherScientist } = await session('scientist', 'another scientist');
    const { browser: moderator } = await session('moderator');
    for (const browser of [otherScientist, moderator]) {
      const answer = await browser.get(`/api/jobs/${ref}`);
      expect(answer.status).toBe(403);
      expect(answer.body.error.code).toBe('not_your_job');
      expect(answer.body).not.toHaveProperty('job');
      expect((await browser.post(`/api/admin/jobs/${ref}/retry`)).status).toBe(403);
    }
    const { browser: volunteer } = await session('volunteer');
    expect((await volunteer.get(`/api/jobs/${ref}`)).body.error.code).toBe('forbidden');
    expect((await uploader.get(`/api/jobs/${ref}`)).status).toBe(200);

    await eventually(
      async () =>
        ['done', 'failed'].includes((await test.db('uploads').where({ id: uploadId }).first()).status),
      'the upload to finish',
    );
    expect(await test.db('uploads').where({ id: uploadId }).first()).toMatchObject({
      uploaded_by: person.id,
      job_id: ref,
    });
    expect(await auditOf('job.retried', ref)).toEqual([]);
  });
});

describe('unsubscribe links', () => {
  it('a link changes only the person it was made for, whoever is signed in; one cannot be made for another', async () => {
    const secret = resolveSessionSecret(test.config.sessionSecret, test.config.dataDir);
    const { browser, person: signedInPerson } = await session('volunteer');
    const linkOwner = await personWithRole(test.db, 'volunteer');
    for (const id of [signedInPerson.id, linkOwner.id])
      await updatePerson(test.db, id, { newsletterOptIn: true });
    const token = signUnsubscribeToken(secret, linkOwner.id);
    const [, mac] = token.split('.');

    const forged = await browser.agent
      .post(`/api/unsubscribe?token=${encodeURIComponent(`${signedInPerson.id}.${mac}`)}`)
      .set('Accept', 'application/json');
    expect(forged.status).toBe(400);
    expect(forged.body.error.code).toBe('token_invalid');
    expect((await personRow(signedInPerson.id)).newsletter_opt_in).toBeTruthy();

    const used = await browser.agent
      .post(`/api/unsubscribe?token=${encodeURIComponent(token)}`)
      .set('Accept', 'application/json');
    expect(used.status).toBe(200);
    expect((await personRow(linkOwner.id)).newsletter_opt_in).toBeFalsy();
    expect((await personRow(signedInPerson.id)).newsletter_opt_in).toBeTruthy();
  });
});

describe('newsletter test copies', () => {
  it('go to the scientist who asks, never to the author or an address in the request', async () => {
    const { browser: author, person: authorPerson } = await session('scientist');
    const created = await author.post('/api/newsletters', {
      headline: 'Object access news',
      bodyMarkdown: 'Hello {{displayName}}',
      audience: { kind: 'opted-in' },
    });
    expect(created.status).toBe(201);
    const id = created.body.newsletter.id as number;
    const before = await test.db('newsletters').where({ id }).first();
    const { browser: other, person: otherPerson } = await session('scientist', 'another scientist');
    const victim = await personWithRole(test.db, 'volunteer');

    const asked = await other.post(`/api/newsletters/${id}/test`, {
      personId: victim.id,
      email: victim.email,
      to: victim.email,
    });
    expect(asked.status).toBe(202);
    await eventually(
      async () => (await mailMessagesTo(test.db, otherPerson.email!)).length === 1,
      'the test copy to the scientist who asked',
    );
    expect(await mailMessagesTo(test.db, victim.email!)).toEqual([]);
    expect(await mailMessagesTo(test.db, authorPerson.email!)).toEqual([]);
    expect(await test.db('newsletters').where({ id }).first()).toEqual(before);
  });
});

describe('the Desk acts on volunteers only', () => {
  async function staff(): Promise<PersonRow[]> {
    return [
      await personWithRole(test.db, 'moderator'),
      await personWithRole(test.db, 'scientist'),
      await personWithRole(test.db, 'admin'),
    ];
  }

  it('a moderator cannot warn staff or clear their flags by id (404, nothing recorded or mailed, no address shown)', async () => {
    const { browser: moderator } = await session('moderator');
    const staffPeople = await staff();
    for (const person of staffPeople) {
      const warned = await moderator.post(`/api/desk/volunteers/${person.id}/warning`, { note: 'Be nicer' });
      expect(warned.status, person.role).toBe(404);
      const cleared = await moderator.post(`/api/desk/volunteers/${person.id}/flags/burst/clear`, {
        note: 'Fine',
      });
      expect(cleared.status, person.role).toBe(404);
      expect(cleared.text).not.toContain(person.email!);
      const suspended = await moderator.post(`/api/desk/volunteers/${person.id}/suspend`, { reason: 'x' });
      expect(suspended.body.error.code, person.role).toBe('cannot_suspend_staff');

      expect(await auditOf('volunteer.warned', person.id)).toEqual([]);
      expect(await auditOf('volunteer.flag_cleared', person.id)).toEqual([]);
      expect(await test.db('flag_clearances').where({ person_id: person.id })).toEqual([]);
      expect((await personRow(person.id)).suspended_at).toBeNull();
    }
    // A volunteer is warned as before: the 404s were about who it is.
    const volunteer = await personWithRole(test.db, 'volunteer');
    expect(
      (await moderator.post(`/api/desk/volunteers/${volunteer.id}/warning`, { note: 'Slow down' })).status,
    ).toBe(201);
    await eventually(
      async () => (await mailMessagesTo(test.db, volunteer.email!)).length === 1,
      'the warning to the volunteer',
    );
    for (const person of staffPeople) expect(await mailMessagesTo(test.db, person.email!)).toEqual([]);
  });
});
