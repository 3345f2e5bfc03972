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

export async function listAudit(
  db: Db,
  filter: { action?: string; entityType?: string; actorId?: number; limit: number; offset: number },
): Promise<AuditRow[]> {
  const query = db('audit_log').orderBy('id', 'desc').limit(filter.limit).offset(filter.offset);
  if (filter.action) query.where({ action: filter.action });
  if (filter.entityType) query.where({ entity_type: filter.entityType });
  if (filter.actorId) query.where({ actor_id: filter.actorId });
  const rows: Record<string, unknown>[] = await query;
  return rows.map((row) => ({
    id: Number(row.id),
    actorId: row.actor_id === null ? null : Number(row.actor_id),
    action: String(row.action),
    entityType: String(row.entity_type),
    entityId: (row.entity_id as string | null) ?? null,
    before: fromJson(row.before, null),
    after: fromJson(row.after, null),
    note: (row.note as string | null) ?? null,
    createdAt: toIso(row.created_at),
  }));
}
