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

/**
 * The policy put in front of a caught message's HTML. The iframe's empty sandbox already stops scripts,
 * forms and pop-ups and gives the document an origin of its own; this stops remote images, fonts and
 * style sheets too, so opening a message never tells a tracker (or a real address) that it was read.
 */
export const messagePolicy =
  "default-src 'none'; style-src 'unsafe-inline'; img-src data:; font-src data:; base-uri 'none'; form-action 'none'";

/**
 * The document to give `<iframe sandbox="" srcdoc>`: the message's HTML behind a content security policy
 * and a base that sends links to a new window, which the sandbox refuses to open.
 */
export function sandboxedDocument(html: string): string {
  const guard = `<meta http-equiv="Content-Security-Policy" content="${messagePolicy}"><base target="_blank">`;
  // The parser moves these into the head whatever follows; after a doctype, so the message keeps its mode.
  const doctype = html.match(/^\s*<!doctype[^>]*>/i)?.[0] ?? '';
  return `${doctype}${guard}${html.slice(doctype.length)}`;
}

export function recipientsText(to: readonly string[]): string {
  return to.length === 0 ? '(no recipients)' : to.join(', ');
}
