import { z } from 'zod';

/**
 * The placeholders a newsletter may use, in the order the composer lists them. A copy of PERSONAL_FIELDS
 * in server/mail/personal-fields.ts (the client never imports server code): keep the two in step.
 */
export const PERSONAL_FIELDS = [
  { name: 'displayName', description: 'The name the volunteer shows on Dipdeck.' },
  { name: 'verdictsThisMonth', description: 'How many verdicts the volunteer gave this calendar month.' },
  { name: 'dipsCredited', description: 'How many dips the volunteer is credited with finding.' },
  {
    name: 'candidatesCredited',
    description: 'How many candidates hold a dip the volunteer is credited with.',
  },
  {
    name: 'topCampaign',
    description: 'The campaign the volunteer gave most verdicts to ("none yet" before any).',
  },
] as const;

export type PersonalFieldName = (typeof PERSONAL_FIELDS)[number]['name'];

export function placeholderOf(name: PersonalFieldName): string {
  return `{{${name}}}`;
}

/**
 * `text` with `insert` put in place of the selection from `start` to `end`, and where the caret goes
 * after it, so a chip inserts a field where the writer was typing rather than at the end.
 */
export function insertAtSelection(
  text: string,
  start: number,
  end: number,
  insert: string,
): { text: string; caret: number } {
  const from = Math.max(0, Math.min(start, text.length));
  const to = Math.max(from, Math.min(end, text.length));
  return { text: text.slice(0, from) + insert + text.slice(to), caret: from + insert.length };
}

export const newsletterStatuses = ['draft', 'scheduled', 'sending', 'sent', 'cancelled'] as const;
export type NewsletterStatus = (typeof newsletterStatuses)[number];

export const newsletterStatusLabels: Record<NewsletterStatus, string> = {
  draft: 'Draft',
  scheduled: 'Scheduled',
  sending: 'Sending',
  sent: 'Sent',
  cancelled: 'Cancelled',
};

export const newsletterStatusTones: Record<NewsletterStatus, 'amber' | 'slate' | 'danger' | 'success'> = {
  draft: 'slate',
  scheduled: 'amber',
  sending: 'amber',
  sent: 'success',
  cancelled: 'danger',
};

export const audienceSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('opted-in') }),
  z.object({ kind: z.literal('active'), days: z.number().int() }),
  z.object({ kind: z.literal('campaign'), campaignId: z.number().int() }),
]);

export type Audience = z.infer<typeof audienceSchema>;
export type AudienceKind = Audience['kind'];

export const progressSchema = z.object({
  /** Null until sending starts: the audience is counted, and fixed, at that moment. */
  recipients: z.number().int().nullable(),
  queued: z.number().int(),
  sending: z.number().int(),
  sent: z.number().int(),
  failed: z.number().int(),
  skippedUnsubscribed: z.number().int(),
  unknown: z.number().int(),
});

export type NewsletterProgress = z.infer<typeof progressSchema>;

export const newsletterSchema = z.object({
  id: z.number().int(),
  authorId: z.number().int().nullable(),
  headline: z.string(),
  bodyMarkdown: z.string(),
  audience: audienceSchema,
  allowRemoteImages: z.boolean(),
  status: z.enum(newsletterStatuses),
  scheduledFor: z.string().nullable(),
  sentAt: z.string().nullable(),
  lastError: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
  unknownPlaceholders: z.array(z.string()),
  progress: progressSchema,
  /** How many the audience holds now (before sending), or the readers it was sent to. */
  audienceSize: z.number().int().nonnegative().nullable(),
});

export type Newsletter = z.infer<typeof newsletterSchema>;

export const newsletterResponseSchema = z.object({ newsletter: newsletterSchema });

export const newsletterPreviewSchema = z.object({
  subject: z.string(),
  html: z.string(),
  text: z.string(),
  unknownPlaceholders: z.array(z.string()),
});

export type NewsletterPreview = z.infer<typeof newsletterPreviewSchema>;

/** What the preview is rendered from: the content without the audience. */
export interface NewsletterContent {
  headline: string;
  bodyMarkdown: string;
  allowRemoteImages: boolean;
}

/** The audience in words; `campaignName` finds a campaign's name when the list of campaigns is at hand. */
export function audienceText(audience: Audience, campaignName?: (id: number) => string | undefined): string {
  switch (audience.kind) {
    case 'opted-in':
      return 'Everyone who opted in';
    case 'active':
      return audience.days === 1
        ? 'Opted in and active in the last day'
        : `Opted in and active in the last ${audience.days} days`;
    case 'campaign': {
      const name = campaignName?.(audience.campaignId);
      return `Opted in and gave verdicts in ${name ? `“${name}”` : `campaign ${audience.campaignId}`}`;
    }
  }
}

/** Readers the sender has dealt with in some way: being sent, sent, failed, skipped or in doubt. */
export function handledCount(progress: NewsletterProgress): number {
  return progress.sending + progress.sent + progress.failed + progress.skippedUnsubscribed + progress.unknown;
}

/** The share of readers handled, 0 to 1; null while the audience is not yet fixed. An empty audience is done. */
export function progressFraction(progress: NewsletterProgress): number | null {
  if (progress.recipients === null) return null;
  if (progress.recipients === 0) return 1;
  return Math.min(1, handledCount(progress) / progress.recipients);
}

/** Sending and scheduled newsletters change without anyone touching them, so their screens keep asking. */
export function isInFlight(status: NewsletterStatus): boolean {
  return status === 'sending' || status === 'scheduled';
}

export const NEWSLETTER_POLL_MS = 2_000;

/** How often to ask again: every two seconds while any newsletter is in flight, otherwise not at all. */
export function newsletterPollInterval(statuses: readonly NewsletterStatus[]): number | false {
  return statuses.some(isInFlight) ? NEWSLETTER_POLL_MS : false;
}

/**
 * A `datetime-local` value ("2026-12-24T09:00") read in the browser's time zone, as an ISO instant for the
 * API; null when it is empty or not a date.
 */
export function localDateTimeToIso(value: string): string | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,3})?)?$/.test(value)) return null;
  // Without an offset, the Date constructor reads a date-time form in local time (ECMA-262 §21.4.3.2).
  const date = new Date(value);
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
}

/** The `datetime-local` value for an instant, in the browser's time zone, to the minute. */
export function toLocalDateTimeValue(date: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${date.getFullYear()}-${pad(date.getMonth() + 1)}-${pad(date.getDate())}T${pad(date.getHours())}:${pad(date.getMinutes())}`;
}

/** The browser's time zone by name ("Europe/Lisbon"), or its offset from UTC when it has no name. */
export function browserTimeZone(now = new Date()): string {
  const name = Intl.DateTimeFormat().resolvedOptions().timeZone;
  if (name) return name;
  const minutes = -now.getTimezoneOffset();
  const sign = minutes < 0 ? '−' : '+';
  const abs = Math.abs(minutes);
  return `UTC${sign}${String(Math.floor(abs / 60)).padStart(2, '0')}:${String(abs % 60).padStart(2, '0')}`;
}

// The preview uses the app's one mail frame (src/lib/sandboxed-mail.ts).
export { sandboxedMailDocument as sandboxedPreview } from '@/lib/sandboxed-mail';

/** How long typing must pause before the live preview asks the server again. */
export const PREVIEW_DEBOUNCE_MS = 400;
