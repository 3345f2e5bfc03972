import { z } from 'zod';

export const outboxSummarySchema = z.object({
  id: z.number().int(),
  messageId: z.string().nullable(),
  from: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  receivedAt: z.string(),
  sizeBytes: z.number().int().nonnegative(),
});

export type OutboxSummary = z.infer<typeof outboxSummarySchema>;

export const outboxMessageSchema = outboxSummarySchema.extend({
  headers: z.array(z.object({ key: z.string(), value: z.string() })),
  text: z.string().nullable(),
  html: z.string().nullable(),
});

export type OutboxMessage = z.infer<typeof outboxMessageSchema>;

export type OutboxView = 'html' | 'text' | 'headers';

/** The view a message opens in: its HTML when it has some, as its readers most likely saw it. */
export function defaultView(message: Pick<OutboxMessage, 'html' | 'text'>): OutboxView {
  if (message.html !== null) return 'html';
  if (message.text !== null) return 'text';
  return 'headers';
}

const sizeFormat = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

/** A message's size as people read it: "820 B", "14.2 kB", "1.3 MB" (powers of 1000, as mail tools do). */
export function formatSize(sizeBytes: number): string {
  if (sizeBytes < 1000) return `${sizeBytes} B`;
  if (sizeBytes < 1_000_000) return `${sizeFormat.format(sizeBytes / 1000)} kB`;
  return `${sizeFormat.format(sizeBytes / 1_000_000)} MB`;
}

// The Outbox shows a caught message's HTML in the app's one mail frame (src/lib/sandboxed-mail.ts).
export {
  mailFramePolicy as messagePolicy,
  sandboxedMailDocument as sandboxedDocument,
} from '@/lib/sandboxed-mail';

export function recipientsText(to: readonly string[]): string {
  return to.length === 0 ? '(no recipients)' : to.join(', ');
}
