import type { Knex } from 'knex';
import type { Db } from './knex';
import { fromJson, nowIso, toIso } from './rows';

type Q = Db | Knex.Transaction;

export interface MailHeader {
  key: string;
  value: string;
}

export interface MailMessageSummary {
  id: number;
  messageId: string | null;
  from: string;
  to: string[];
  subject: string;
  receivedAt: string;
  sizeBytes: number;
}

export interface MailMessage extends MailMessageSummary {
  headers: MailHeader[];
  text: string | null;
  html: string | null;
}

const toSummary = (row: Record<string, unknown>): MailMessageSummary => ({
  id: Number(row.id),
  messageId: (row.message_id as string | null) ?? null,
  from: String(row.from_address),
  to: fromJson<string[]>(row.to_addresses, []),
  subject: String(row.subject),
  receivedAt: toIso(row.received_at),
  sizeBytes: Number(row.size_bytes),
});

export async function insertMailMessage(
  db: Q,
  message: Omit<MailMessage, 'id' | 'receivedAt'>,
): Promise<number> {
  const [row] = await db('mail_messages')
    .insert({
      message_id: message.messageId,
      from_address: message.from,
      to_addresses: JSON.stringify(message.to),
      subject: message.subject,
      headers: JSON.stringify(message.headers),
      text_body: message.text,
      html_body: message.html,
      size_bytes: message.sizeBytes,
      received_at: nowIso(),
    })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}

/** Newest first. */
export async function listMailMessages(
  db: Q,
  page: { limit: number; offset: number },
): Promise<{ messages: MailMessageSummary[]; total: number }> {
  const rows = await db('mail_messages')
    .orderBy([
      { column: 'received_at', order: 'desc' },
      { column: 'id', order: 'desc' },
    ])
    .limit(page.limit)
    .offset(page.offset)
    .select('id', 'message_id', 'from_address', 'to_addresses', 'subject', 'received_at', 'size_bytes');
  const [count] = await db('mail_messages').count<{ n: number }[]>({ n: '*' });
  return { messages: rows.map(toSummary), total: Number(count?.n ?? 0) };
}

export async function findMailMessage(db: Q, id: number): Promise<MailMessage | undefined> {
  const row = await db('mail_messages').where({ id }).first();
  if (!row) return undefined;
  return {
    ...toSummary(row),
    headers: fromJson<MailHeader[]>(row.headers, []),
    text: (row.text_body as string | null) ?? null,
    html: (row.html_body as string | null) ?? null,
  };
}

/** The messages sent to one address, oldest first: what tests and the worker's reports look at. */
export async function mailMessagesTo(db: Q, address: string): Promise<MailMessage[]> {
  const ids: number[] = (await db('mail_messages').orderBy('id').select('id', 'to_addresses'))
    .filter((row: Record<string, unknown>) =>
      fromJson<string[]>(row.to_addresses, []).some((to) => to.toLowerCase() === address.toLowerCase()),
    )
    .map((row: Record<string, unknown>) => Number(row.id));
  const messages: MailMessage[] = [];
  for (const id of ids) messages.push((await findMailMessage(db, id))!);
  return messages;
}
