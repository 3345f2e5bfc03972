import type { Knex } from 'knex';
import type { Db } from './knex';
import { fromJson, nowIso, toBool, toIso, toIsoOrNull } from './rows';

type Q = Db | Knex.Transaction;

export type Audience =
  | { kind: 'opted-in' }
  | { kind: 'active'; days: number }
  | { kind: 'campaign'; campaignId: number };

export type NewsletterStatus = 'draft' | 'scheduled' | 'sending' | 'sent' | 'cancelled';
export type DeliveryStatus = 'claimed' | 'sent' | 'failed' | 'skipped' | 'unknown';

export interface NewsletterRow {
  id: number;
  authorId: number | null;
  headline: string;
  bodyMarkdown: string;
  audience: Audience;
  allowRemoteImages: boolean;
  status: NewsletterStatus;
  scheduledFor: string | null;
  sentAt: string | null;
  recipientIds: number[] | null;
  lastError: string | null;
  createdAt: string;
  updatedAt: string;
}

const toRow = (row: Record<string, unknown>): NewsletterRow => ({
  id: Number(row.id),
  authorId: row.author_id === null ? null : Number(row.author_id),
  headline: String(row.headline),
  bodyMarkdown: String(row.body_markdown),
  audience: fromJson<Audience>(row.audience, { kind: 'opted-in' }),
  allowRemoteImages: toBool(row.allow_remote_images),
  status: row.status as NewsletterStatus,
  scheduledFor: toIsoOrNull(row.scheduled_for),
  sentAt: toIsoOrNull(row.sent_at),
  recipientIds: fromJson<number[] | null>(row.recipient_ids, null),
  lastError: (row.last_error as string | null) ?? null,
  createdAt: toIso(row.created_at),
  updatedAt: toIso(row.updated_at),
});

export async function insertNewsletter(
  db: Q,
  input: {
    authorId: number;
    headline: string;
    bodyMarkdown: string;
    audience: Audience;
    allowRemoteImages: boolean;
  },
): Promise<NewsletterRow> {
  const now = nowIso();
  const [row] = await db('newsletters')
    .insert({
      author_id: input.authorId,
      headline: input.headline,
      body_markdown: input.bodyMarkdown,
      audience: JSON.stringify(input.audience),
      allow_remote_images: input.allowRemoteImages,
      status: 'draft',
      created_at: now,
      updated_at: now,
    })
    .returning('*');
  return toRow(row);
}

export async function findNewsletter(db: Q, id: number): Promise<NewsletterRow | undefined> {
  const row = await db('newsletters').where({ id }).first();
  return row ? toRow(row) : undefined;
}

export async function listNewsletters(db: Q): Promise<NewsletterRow[]> {
  return (await db('newsletters').orderBy('id', 'desc')).map(toRow);
}

export async function updateNewsletter(
  db: Q,
  id: number,
  changes: Partial<Pick<NewsletterRow, 'status' | 'scheduledFor' | 'sentAt' | 'recipientIds' | 'lastError'>>,
): Promise<void> {
  const update: Record<string, unknown> = { updated_at: nowIso() };
  if (changes.status !== undefined) update.status = changes.status;
  if (changes.scheduledFor !== undefined) update.scheduled_for = changes.scheduledFor;
  if (changes.sentAt !== undefined) update.sent_at = changes.sentAt;
  if (changes.recipientIds !== undefined) update.recipient_ids = JSON.stringify(changes.recipientIds);
  if (changes.lastError !== undefined) update.last_error = changes.lastError;
  await db('newsletters').where({ id }).update(update);
}

/** Counts of the newsletter's deliveries by status. */
export async function deliveryCounts(db: Q, newsletterId: number): Promise<Record<DeliveryStatus, number>> {
  const rows: { status: DeliveryStatus; n: number | string }[] = await db('deliveries')
    .where({ newsletter_id: newsletterId })
    .groupBy('status')
    .select('status')
    .count({ n: '*' });
  const counts: Record<DeliveryStatus, number> = { claimed: 0, sent: 0, failed: 0, skipped: 0, unknown: 0 };
  for (const row of rows) counts[row.status] = Number(row.n);
  return counts;
}

/**
 * Claims the delivery of a newsletter to a person, in its own transaction, before anything is sent:
 * true when this call made the row (so it may send), false when a row already existed.
 */
export async function claimDelivery(db: Db, newsletterId: number, personId: number): Promise<boolean> {
  return db.transaction(async (trx) => {
    const now = nowIso();
    const inserted = await trx('deliveries')
      .insert({
        newsletter_id: newsletterId,
        person_id: personId,
        status: 'claimed',
        claimed_at: now,
        created_at: now,
        updated_at: now,
      })
      .onConflict(['newsletter_id', 'person_id'])
      .ignore()
      .returning('id');
    return inserted.length === 1;
  });
}

export async function finishDelivery(
  db: Q,
  newsletterId: number,
  personId: number,
  outcome: { status: 'sent'; messageId: string } | { status: 'failed' | 'skipped'; error: string },
): Promise<void> {
  const now = nowIso();
  await db('deliveries')
    .where({ newsletter_id: newsletterId, person_id: personId, status: 'claimed' })
    .update({
      status: outcome.status,
      message_id: outcome.status === 'sent' ? outcome.messageId : null,
      error: outcome.status === 'sent' ? null : outcome.error,
      sent_at: outcome.status === 'sent' ? now : null,
      updated_at: now,
    });
}

/** Claims a run before this one left and never finished: whether they were mailed is not known. */
export async function markClaimedUnknown(db: Q, newsletterId: number): Promise<number> {
  return db('deliveries').where({ newsletter_id: newsletterId, status: 'claimed' }).update({
    status: 'unknown',
    error: 'the sender stopped between claiming and confirming',
    updated_at: nowIso(),
  });
}

export async function deliveredPeople(db: Q, newsletterId: number): Promise<Set<number>> {
  return new Set(
    (await db('deliveries').where({ newsletter_id: newsletterId }).pluck('person_id')).map(Number),
  );
}
