// Newsletters through the real local SMTP catcher: who gets one, what it says, the unsubscribe
// headers, never twice to anyone (even when the sender dies mid-way), and who may send.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { resolveSessionSecret } from '../../server/auth/session-secret';
import { mailMessagesTo } from '../../server/db/mail-messages';
import { deliveryCounts, insertNewsletter, updateNewsletter } from '../../server/db/newsletters';
import { updatePerson } from '../../server/db/people';
import type { Mailer } from '../../server/mail/mailer';
import { deliverNewsletter } from '../../server/services/newsletters/deliver';
import { eventually } from '../support/eventually';
import { createTestApp, personWithRole, signedIn, type TestApp } from './support/test-app';

let test: TestApp;
let secret: string;

beforeAll(async () => {
  test = await createTestApp({ queues: true, env: { MAIL_RATE_PER_S: '50' } });
  secret = resolveSessionSecret(test.config.sessionSecret, test.config.dataDir);
});

async function reader(displayName?: string) {
  const person = await personWithRole(test.db, 'volunteer');
  await updatePerson(test.db, person.id, { newsletterOptIn: true, ...(displayName ? { displayName } : {}) });
  return person;
}

const body = {
  headline: 'What you found in November, {{displayName}}',
  bodyMarkdown:
    'Hello **{{displayName}}**: you gave {{verdictsThisMonth}} verdicts.\n\n<script>alert(1)</script>\n\n[Our page](https://dipdeck.example.org)',
  audience: { kind: 'opted-in' },
};

describe('newsletters', () => {
  it('can be written and sent only by scientists and admins', async () => {
    for (const role of ['volunteer', 'moderator'] as const) {
      const { browser } = await signedIn(test, role);
      expect((await browser.post('/api/newsletters', body)).status).toBe(403);
      expect((await browser.get('/api/newsletters')).status).toBe(403);
      expect((await browser.post('/api/newsletters/1/send', {})).status).toBe(403);
    }
    expect((await request(test.app).get('/api/newsletters')).status).toBe(401);
    const { browser } = await signedIn(test, 'scientist');
    const bad = await browser.post('/api/newsletters', {
      ...body,
      headline: '',
      audience: { kind: 'everyone' },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('headline');
  });

  it('previews as the writer would receive it, sanitised, naming unknown fields', async () => {
    const { browser } = await signedIn(test, 'scientist');
    const preview = await browser.post('/api/newsletters/preview', {
      headline: body.headline,
      bodyMarkdown: `${body.bodyMarkdown}\n\n{{favouriteStar}}`,
    });
    expect(preview.status).toBe(200);
    expect(preview.body.preview.html).not.toMatch(/<script/i);
    expect(preview.body.preview.unknownPlaceholders).toEqual(['{{favouriteStar}}']);
    expect(preview.body.preview.text).toContain('Our page (https://dipdeck.example.org)');
  });

  it('goes once to each opted-in reader, with their fields and both unsubscribe headers, and to nobody else', async () => {
    const readers = [await reader('Ada <script>x</script>'), await reader(), await reader()];
    const notOptedIn = await personWithRole(test.db, 'volunteer');
    const suspended = await reader();
    await updatePerson(test.db, suspended.id, { suspendedAt: new Date().toISOString() });
    const { browser } = await signedIn(test, 'scientist');
    const created = await browser.post('/api/newsletters', body);
    expect(created.status).toBe(201);
    // Before sending, the page can say how many the audience holds.
    expect(created.body.newsletter.audienceSize).toBe(readers.length);
    const id = created.body.newsletter.id;
    const sent = await browser.post(`/api/newsletters/${id}/send`, {});
    expect(sent.status).toBe(202);
    await eventually(
      async () => (await browser.get(`/api/newsletters/${id}`)).body.newsletter.status === 'sent',
      'sent',
    );
    const { newsletter } = (await browser.get(`/api/newsletters/${id}`)).body;
    expect(newsletter.progress).toMatchObject({ queued: 0, sent: readers.length, failed: 0, unknown: 0 });

    for (const person of readers) {
      const messages = await mailMessagesTo(test.db, person.email!);
      expect(messages, person.email!).toHaveLength(1);
      const [message] = messages;
      const header = (key: string) => message!.headers.find((h) => h.key === key)?.value;
      expect(header('list-unsubscribe')).toMatch(/^<http:\/\/localhost:\d+\/api\/unsubscribe\?token=/);
      expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe=One-Click');
      expect(message!.html).not.toMatch(/<script/i);
      expect(message!.text).toContain('verdicts');
      // The one-click link in the header works, without signing in.
      const link = header('list-unsubscribe')!.slice(1, -1);
      const url = new URL(link);
      const clicked = await request(test.app)
        .post(`${url.pathname}${url.search}`)
        .set('Accept', 'application/json');
      expect(clicked.body).toEqual({ unsubscribed: true });
    }
    expect((await mailMessagesTo(test.db, readers[0]!.email!))[0]!.text).toContain('Ada <script>x</script>');
    expect(await mailMessagesTo(test.db, notOptedIn.email!)).toEqual([]);
    expect(await mailMessagesTo(test.db, suspended.email!)).toEqual([]);
    expect((await browser.post(`/api/newsletters/${id}/send`, {})).status).toBe(409);
  });

  it('waits until the time it was scheduled for, then goes out', async () => {
    const person = await reader();
    const { browser } = await signedIn(test, 'scientist');
    const { body: created } = await browser.post('/api/newsletters', body);
    const id = created.newsletter.id;
    const at = new Date(Date.now() + 1_500).toISOString();
    const scheduled = await browser.post(`/api/newsletters/${id}/send`, { at });
    expect(scheduled.status).toBe(202);
    expect(scheduled.body.newsletter.status).toBe('scheduled');
    expect(Date.parse(scheduled.body.newsletter.scheduledFor)).toBeGreaterThan(Date.now());
    expect(await mailMessagesTo(test.db, person.email!)).toHaveLength(0);
    await eventually(
      async () => (await browser.get(`/api/newsletters/${id}`)).body.newsletter.status === 'sent',
      'sent',
    );
    expect(await mailMessagesTo(test.db, person.email!)).toHaveLength(1);
    const bad = await browser.post(`/api/newsletters/${id}/send`, { at: 'tomorrow' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('at');
  });

  it('sends a test copy to the writer only', async () => {
    const { browser, person } = await signedIn(test, 'scientist');
    const { body: created } = await browser.post('/api/newsletters', body);
    expect((await browser.post(`/api/newsletters/${created.newsletter.id}/test`)).status).toBe(202);
    await eventually(
      async () => (await mailMessagesTo(test.db, person.email!)).length === 1,
      'the test copy',
    );
    expect((await mailMessagesTo(test.db, person.email!))[0]!.subject).toMatch(/^\[Test\]/);
    expect((await browser.get(`/api/newsletters/${created.newsletter.id}`)).body.newsletter.status).toBe(
      'draft',
    );
  });
});

describe('delivery', () => {
  async function draft(audienceIds: number[]) {
    const author = await personWithRole(test.db, 'scientist');
    const newsletter = await insertNewsletter(test.db, {
      authorId: author.id,
      headline: 'Delivery test',
      bodyMarkdown: 'Hello {{displayName}}',
      audience: { kind: 'opted-in' },
      allowRemoteImages: false,
    });
    // The readers fixed as if sending had started with exactly these.
    await updateNewsletter(test.db, newsletter.id, { status: 'sending', recipientIds: audienceIds });
    return newsletter.id;
  }
  const ctx = (mailer: Mailer, pace: (ms: number) => Promise<void> = async () => {}) => ({
    db: test.db,
    mailer,
    publicUrl: 'http://localhost:3000',
    secret,
    ratePerSecond: 1_000,
    pace,
  });

  it('after a sender died between sending and confirming, mails nobody twice and everyone not in doubt once', async () => {
    const readers = [await reader(), await reader(), await reader(), await reader()];
    const id = await draft(readers.map((person) => person.id));
    const real = test.mailer!;
    let sends = 0;
    // The first run's sender accepts the 2nd message at the SMTP server and then never answers again:
    // as if its process had been killed between the server's acceptance and marking the row sent.
    const dying: Mailer = {
      ...real,
      send: async (mail) => {
        sends += 1;
        const accepted = await real.send(mail);
        if (sends === 2) return new Promise<never>(() => {});
        return accepted;
      },
    };
    void deliverNewsletter(ctx(dying), id);
    await eventually(
      async () => (await mailMessagesTo(test.db, readers[1]!.email!)).length === 1,
      'the 2nd mail',
    );
    expect((await deliveryCounts(test.db, id)).claimed).toBe(1);

    const restarted = await deliverNewsletter(ctx(real), id);
    expect(restarted.unknownFromBefore).toBe(1);
    for (const person of readers)
      expect(await mailMessagesTo(test.db, person.email!), person.email!).toHaveLength(1);
    expect(await deliveryCounts(test.db, id)).toEqual({
      claimed: 0,
      sent: 3,
      failed: 0,
      skipped: 0,
      unknown: 1,
    });
    const doubt = await test
      .db('deliveries')
      .where({ newsletter_id: id, status: 'unknown' })
      .first('person_id');
    expect(Number(doubt.person_id)).toBe(readers[1]!.id);
    // A third run changes nothing: the one in doubt is reported, never resent.
    await deliverNewsletter(ctx(real), id);
    expect(await mailMessagesTo(test.db, readers[1]!.email!)).toHaveLength(1);
  });

  it('skips someone who unsubscribed or was suspended after sending began', async () => {
    const readers = [await reader(), await reader(), await reader()];
    const id = await draft(readers.map((person) => person.id));
    let paused = false;
    await deliverNewsletter(
      ctx(test.mailer!, async () => {
        if (paused) return;
        paused = true;
        // Between the first and the second message: one unsubscribes, one is suspended.
        await updatePerson(test.db, readers[1]!.id, { newsletterOptIn: false });
        await updatePerson(test.db, readers[2]!.id, { suspendedAt: new Date().toISOString() });
      }),
      id,
    );
    expect(await mailMessagesTo(test.db, readers[0]!.email!)).toHaveLength(1);
    expect(await mailMessagesTo(test.db, readers[1]!.email!)).toHaveLength(0);
    expect(await mailMessagesTo(test.db, readers[2]!.email!)).toHaveLength(0);
    expect(await deliveryCounts(test.db, id)).toMatchObject({ sent: 1, skipped: 2 });
  });

  it('counts a message the SMTP server keeps refusing as failed, after its retries', async () => {
    const [person] = [await reader()];
    const id = await draft([person!.id]);
    let tries = 0;
    const refusing: Mailer = {
      ...test.mailer!,
      send: async () => {
        tries += 1;
        throw new Error('550 mailbox unavailable');
      },
    };
    const waits: number[] = [];
    await deliverNewsletter(
      ctx(refusing, async (ms) => void waits.push(ms)),
      id,
    );
    expect(tries).toBe(3);
    expect(waits.slice(0, 2)).toEqual([1_000, 2_000]);
    const row = await test.db('deliveries').where({ newsletter_id: id }).first();
    expect(row).toMatchObject({ status: 'failed', error: '550 mailbox unavailable' });
  });
});
