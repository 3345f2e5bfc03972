import { setTimeout as sleep } from 'node:timers/promises';
import type { Db } from '../../db/knex';
import {
  claimDelivery,
  deliveredPeople,
  findNewsletter,
  finishDelivery,
  markClaimedUnknown,
  type NewsletterRow,
  updateNewsletter,
} from '../../db/newsletters';
import { findPersonById } from '../../db/people';
import { nowIso } from '../../db/rows';
import type { Mailer } from '../../mail/mailer';
import { renderNewsletterMessage } from '../../mail/render';
import { signUnsubscribeToken } from '../../mail/unsubscribe-token';
import { audienceIds, personalFieldsOf } from './recipients';

export interface DeliveryContext {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
  /** Signs the unsubscribe links (the session secret). */
  secret: string;
  /** Messages per second at most (MAIL_RATE_PER_S, default 10). */
  ratePerSecond: number;
  /** Waits between messages; tests pass their own to act between two sends. */
  pace?: (ms: number) => Promise<void>;
}

/** Tries per message before it counts as failed, and the first wait (doubled each time): our own choice. */
const SEND_ATTEMPTS = 3;
const FIRST_RETRY_MS = 1_000;

/** The links and headers of one reader's copy (RFC 2369 List-Unsubscribe, RFC 8058 one-click). */
export function newsletterLinks(ctx: Pick<DeliveryContext, 'publicUrl' | 'secret'>, personId: number) {
  const unsubscribeUrl = `${ctx.publicUrl}/api/unsubscribe?token=${encodeURIComponent(signUnsubscribeToken(ctx.secret, personId))}`;
  return {
    unsubscribeUrl,
    preferencesUrl: `${ctx.publicUrl}/record`,
    headers: {
      'List-Unsubscribe': `<${unsubscribeUrl}>`,
      'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
    },
  };
}

export async function renderFor(
  ctx: Pick<DeliveryContext, 'db' | 'publicUrl' | 'secret'>,
  newsletter: NewsletterRow,
  person: { id: number; displayName: string },
) {
  const links = newsletterLinks(ctx, person.id);
  const message = renderNewsletterMessage({
    headline: newsletter.headline,
    bodyMarkdown: newsletter.bodyMarkdown,
    fields: await personalFieldsOf(ctx.db, person),
    unsubscribeUrl: links.unsubscribeUrl,
    preferencesUrl: links.preferencesUrl,
    allowRemoteImages: newsletter.allowRemoteImages,
  });
  return { ...message, headers: links.headers };
}

/**
 * Sends a newsletter, never twice to anyone: each reader's delivery row is claimed in its own
 * transaction before the message goes out and marked sent once the SMTP server accepted it. A claim
 * left by a run that stopped in between (a killed worker) becomes `unknown` and is never resent; the
 * Lab reports it. Whether someone may be mailed is checked again just before their message, so an
 * unsubscribe or a suspension after the send began still counts. Safe to run again: it carries on.
 */
export async function deliverNewsletter(ctx: DeliveryContext, newsletterId: number) {
  const newsletter = await findNewsletter(ctx.db, newsletterId);
  if (!newsletter || newsletter.status === 'cancelled' || newsletter.status === 'sent') {
    return { skipped: newsletter ? newsletter.status : 'gone' };
  }
  const unknown = await markClaimedUnknown(ctx.db, newsletter.id);
  // The readers are fixed when sending starts, so progress counts against the same list throughout.
  const recipients = newsletter.recipientIds ?? (await audienceIds(ctx.db, newsletter.audience));
  if (!newsletter.recipientIds || newsletter.status !== 'sending') {
    await updateNewsletter(ctx.db, newsletter.id, { status: 'sending', recipientIds: recipients });
  }
  const done = await deliveredPeople(ctx.db, newsletter.id);
  const pace = ctx.pace ?? ((ms: number) => sleep(ms));
  const gapMs = 1_000 / ctx.ratePerSecond;
  let sent = 0;
  for (const personId of recipients) {
    if (done.has(personId)) continue;
    if (!(await claimDelivery(ctx.db, newsletter.id, personId))) continue;
    const person = await findPersonById(ctx.db, personId);
    if (!person?.email || person.deletedAt || person.suspendedAt || !person.newsletterOptIn) {
      const why =
        !person?.email || person.deletedAt
          ? 'account deleted'
          : person.suspendedAt
            ? 'suspended'
            : 'unsubscribed';
      await finishDelivery(ctx.db, newsletter.id, personId, { status: 'skipped', error: why });
      continue;
    }
    const message = await renderFor(ctx, newsletter, person);
    let lastError = '';
    for (let attempt = 1; attempt <= SEND_ATTEMPTS; attempt += 1) {
      try {
        const { messageId } = await ctx.mailer.send({ to: person.email, ...message });
        await finishDelivery(ctx.db, newsletter.id, personId, { status: 'sent', messageId });
        lastError = '';
        sent += 1;
        break;
      } catch (error) {
        lastError = error instanceof Error ? error.message : String(error);
        if (attempt < SEND_ATTEMPTS) await pace(FIRST_RETRY_MS * 2 ** (attempt - 1));
      }
    }
    if (lastError)
      await finishDelivery(ctx.db, newsletter.id, personId, { status: 'failed', error: lastError });
    await pace(gapMs);
  }
  await updateNewsletter(ctx.db, newsletter.id, { status: 'sent', sentAt: nowIso() });
  return { newsletterId: newsletter.id, sent, unknownFromBefore: unknown };
}
