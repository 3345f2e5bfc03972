import type { Knex } from 'knex';
import type { Db } from './knex';
import { fromJson, nowIso, toIso } from './rows';

// The audit log is append-only: this module offers insert and read, and nothing else.

export interface AuditEntry {
  actorId: number | null;
  action: string;
  entityType: string;
  entityId: string | number | null;
  before?: unknown;
  after?: unknown;
  note?: string | null;
}

export interface AuditRow extends Omit<AuditEntry, 'entityId'> {
  id: number;
  entityId: string | null;
  createdAt: string;
}

export async function appendAudit(db: Db | Knex.Transaction, entry: AuditEntry): Promise<void> {
  await db('audit_log').insert({
    actor_id: entry.actorId,
    action: entry.action,
    entity_type: entry.entityType,
    entity_id: entry.entityId === null ? null : String(entry.entityId),
    before: entry.before === undefined ? null : JSON.stringify(entry.before),
    after: entry.after === undefined ? null : JSON.stringify(entry.after),
    note: entry.note ?? null,
    created_at: nowIso(),
  });
}

export interface AuditFilter {
  action?: string | undefined;
  entityType?: string | undefined;
  entityId?: string | undefined;
  actorId?: number | undefined;
  /** ISO-8601 bounds on when the entry was written, inclusive. */
  from?: string | undefined;
  to?: string | undefined;
  limit: number;
  offset: number;
}

export interface AuditListRow extends AuditRow {
  actorName: string | null;
}

/** Newest first, filtered, with the actor's name and the number of entries that match. */
export async function listAudit(
  db: Db,
  filter: AuditFilter,
): Promise<{ entries: AuditListRow[]; total: number }> {
  const base = db('audit_log');
  if (filter.action) base.where('audit_log.action', filter.action);
  if (filter.entityType) base.where('audit_log.entity_type', filter.entityType);
  if (filter.entityId) base.where('audit_log.entity_id', filter.entityId);
  if (filter.actorId) base.where('audit_log.actor_id', filter.actorId);
  if (filter.from) base.where('audit_log.created_at', '>=', filter.from);
  if (filter.to) base.where('audit_log.created_at', '<=', filter.to);
  const [count] = await base.clone().count<{ n: number | string }[]>({ n: '*' });
  const rows: Record<string, unknown>[] = await base
    .clone()
    .leftJoin('people', 'people.id', 'audit_log.actor_id')
    .orderBy('audit_log.id', 'desc')
    .limit(filter.limit)
    .offset(filter.offset)
    .select('audit_log.*', 'people.display_name as actor_name');
  return {
    total: Number(count?.n ?? 0),
    entries: rows.map((row) => ({
      id: Number(row.id),
      actorId: row.actor_id === null ? null : Number(row.actor_id),
      actorName: (row.actor_name as string | null) ?? null,
      action: String(row.action),
      entityType: String(row.entity_type),
      entityId: (row.entity_id as string | null) ?? null,
      before: fromJson(row.before, null),
      after: fromJson(row.after, null),
      note: (row.note as string | null) ?? null,
      createdAt: toIso(row.created_at),
    })),
  };
}
