import { enqueue, type Queues } from '../../../worker/queues';
import { appendAudit } from '../../db/audit-log';
import type { Db } from '../../db/knex';
import {
  type Audience,
  deliveryCounts,
  findNewsletter,
  insertNewsletter,
  listNewsletters,
  type NewsletterRow,
  updateNewsletter,
} from '../../db/newsletters';
import type { PersonRow } from '../../db/people';
import { AppError, notFound } from '../../errors';
import { unknownPlaceholders } from '../../mail/personal-fields';
import { renderNewsletterMessage } from '../../mail/render';
import { newsletterLinks } from './deliver';
import { audienceIds, personalFieldsOf } from './recipients';

export interface NewsletterInput {
  headline: string;
  bodyMarkdown: string;
  audience: Audience;
  allowRemoteImages: boolean;
}

const noQueues = () =>
  new AppError('queues_unavailable', 'Mail cannot be sent just now: try again in a minute', 'unavailable');

/** A newsletter with its progress: how many readers, and how many are queued, sent, failed, skipped or in doubt. */
async function view(db: Db, newsletter: NewsletterRow) {
  const counts = await deliveryCounts(db, newsletter.id);
  const recipients = newsletter.recipientIds?.length ?? null;
  const handled = counts.claimed + counts.sent + counts.failed + counts.skipped + counts.unknown;
  const { recipientIds: _ids, ...rest } = newsletter;
  // Before sending, how many the audience holds now (it is fixed when sending starts).
  const waiting = newsletter.status === 'draft' || newsletter.status === 'scheduled';
  return {
    ...rest,
    audienceSize: waiting ? (await audienceIds(db, newsletter.audience)).length : recipients,
    unknownPlaceholders: unknownPlaceholders(`${newsletter.headline}\n${newsletter.bodyMarkdown}`),
    progress: {
      recipients,
      queued: recipients === null ? 0 : Math.max(0, recipients - handled),
      sending: counts.claimed,
      sent: counts.sent,
      failed: counts.failed,
      skippedUnsubscribed: counts.skipped,
      unknown: counts.unknown,
    },
  };
}

async function existing(db: Db, id: number): Promise<NewsletterRow> {
  const newsletter = await findNewsletter(db, id);
  if (!newsletter) throw notFound('Newsletter');
  return newsletter;
}

export async function createNewsletter(db: Db, author: PersonRow, input: NewsletterInput) {
  const newsletter = await insertNewsletter(db, { authorId: author.id, ...input });
  await appendAudit(db, {
    actorId: author.id,
    action: 'newsletter.created',
    entityType: 'newsletter',
    entityId: newsletter.id,
    after: { headline: input.headline, audience: input.audience },
  });
  return { newsletter: await view(db, newsletter) };
}

export async function newsletters(db: Db) {
  const rows = await listNewsletters(db);
  return { newsletters: await Promise.all(rows.map((row) => view(db, row))) };
}

export async function oneNewsletter(db: Db, id: number) {
  return { newsletter: await view(db, await existing(db, id)) };
}

/** The composer's live preview: rendered for the person writing it, with their own fields. */
export async function previewNewsletter(
  db: Db,
  person: PersonRow,
  input: Omit<NewsletterInput, 'audience'>,
  ctx: { publicUrl: string; secret: string },
) {
  const links = newsletterLinks(ctx, person.id);
  const message = renderNewsletterMessage({
    headline: input.headline,
    bodyMarkdown: input.bodyMarkdown,
    fields: await personalFieldsOf(db, person),
    unsubscribeUrl: links.unsubscribeUrl,
    preferencesUrl: links.preferencesUrl,
    allowRemoteImages: input.allowRemoteImages,
  });
  return {
    preview: {
      ...message,
      unknownPlaceholders: unknownPlaceholders(`${input.headline}\n${input.bodyMarkdown}`),
    },
  };
}

export async function sendTestCopy(db: Db, queues: Queues | undefined, person: PersonRow, id: number) {
  await existing(db, id);
  if (!queues) throw noQueues();
  if (!person.email) throw new AppError('no_address', 'Your account has no e-mail address', 'conflict');
  await enqueue(queues, 'mail', 'newsletter-test', { newsletterId: id, personId: person.id });
  return { message: `A test copy is on its way to ${person.email}.` };
}

/** Sends now, or at `at`: the audience is counted now and fixed when sending starts. */
export async function sendNewsletter(
  db: Db,
  queues: Queues | undefined,
  person: PersonRow,
  id: number,
  at: string | undefined,
) {
  const newsletter = await existing(db, id);
  if (newsletter.status !== 'draft' && newsletter.status !== 'scheduled') {
    throw new AppError(
      'already_sent',
      `This newsletter is ${newsletter.status}; it cannot be sent again`,
      'conflict',
    );
  }
  if (!queues) throw noQueues();
  const delayMs = at ? Math.max(0, Date.parse(at) - Date.now()) : 0;
  const audienceSize = (await audienceIds(db, newsletter.audience)).length;
  await updateNewsletter(db, id, {
    status: delayMs > 0 ? 'scheduled' : 'sending',
    scheduledFor: delayMs > 0 ? new Date(Date.now() + delayMs).toISOString() : null,
  });
  await enqueue(
    queues,
    'mail',
    'newsletter',
    { newsletterId: id },
    // One job per newsletter; a second request finds it already queued.
    {
      jobId: `newsletter-${id}`,
      delay: delayMs,
      attempts: 5,
      backoff: { type: 'exponential', delay: 5_000 },
    },
  );
  await appendAudit(db, {
    actorId: person.id,
    action: delayMs > 0 ? 'newsletter.scheduled' : 'newsletter.sent',
    entityType: 'newsletter',
    entityId: id,
    after: { at: at ?? null, audienceSize },
  });
  return { ...(await oneNewsletter(db, id)), audienceSize };
}
