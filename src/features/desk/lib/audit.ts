import { z } from 'zod';

export const auditEntrySchema = z.object({
  id: z.number().int(),
  actor: z.object({ id: z.number().int(), displayName: z.string() }).nullable(),
  action: z.string(),
  entityType: z.string(),
  entityId: z.string().nullable(),
  before: z.unknown(),
  after: z.unknown(),
  note: z.string().nullable(),
  createdAt: z.string(),
});

export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditPageSchema = z.object({ entries: z.array(auditEntrySchema), total: z.number().int() });
export type AuditPage = z.infer<typeof auditPageSchema>;

/** One changed value: `key: before → after`, with null for a side that does not have it. */
export interface ChangeLine {
  key: string;
  before: string | null;
  after: string | null;
}

const longestValue = 80;

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** A value as one short line: strings as they are, everything else as JSON, cut at 80 characters. */
export function formatValue(value: unknown): string {
  const text = typeof value === 'string' ? value : (JSON.stringify(value) ?? String(value));
  return text.length > longestValue ? `${text.slice(0, longestValue - 1)}…` : text;
}

/**
 * What an audit entry changed, compactly: for two objects only the keys whose values differ; for one
 * side missing, every key of the other; for anything else the two values whole.
 */
export function describeChange(before: unknown, after: unknown): ChangeLine[] {
  const absent = (value: unknown) => value === null || value === undefined;
  if (absent(before) && absent(after)) return [];
  if ((isRecord(before) || absent(before)) && (isRecord(after) || absent(after))) {
    const was = isRecord(before) ? before : {};
    const now = isRecord(after) ? after : {};
    const keys = [...new Set([...Object.keys(was), ...Object.keys(now)])];
    return keys
      .filter((key) => JSON.stringify(was[key]) !== JSON.stringify(now[key]))
      .map((key) => ({
        key,
        before: key in was ? formatValue(was[key]) : null,
        after: key in now ? formatValue(now[key]) : null,
      }));
  }
  return [
    {
      key: '',
      before: absent(before) ? null : formatValue(before),
      after: absent(after) ? null : formatValue(after),
    },
  ];
}
