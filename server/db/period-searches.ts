import type { Knex } from 'knex';
import type { Db } from './knex';
import { fromJson, nowIso, toIso } from './rows';
import { unpackLightCurve } from './series-codec';

type Q = Db | Knex.Transaction;

export type PeriodSearchStatus = 'queued' | 'running' | 'done' | 'failed';

export interface PeriodSearchRow {
  id: number;
  targetId: number;
  requestedBy: number | null;
  status: PeriodSearchStatus;
  jobRef: string | null;
  settings: Record<string, unknown>;
  result: Record<string, unknown> | null;
  error: string | null;
  createdAt: string;
  updatedAt: string;
}

function toRow(row: Record<string, unknown>): PeriodSearchRow {
  return {
    id: Number(row.id),
    targetId: Number(row.target_id),
    requestedBy: row.requested_by === null ? null : Number(row.requested_by),
    status: row.status as PeriodSearchStatus,
    jobRef: (row.job_ref as string | null) ?? null,
    settings: fromJson(row.settings, {}),
    result: fromJson(row.result, null),
    error: (row.error as string | null) ?? null,
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

export async function insertPeriodSearch(
  db: Q,
  search: { targetId: number; requestedBy: number; settings: Record<string, unknown> },
): Promise<PeriodSearchRow> {
  const now = nowIso();
  const [row] = await db('period_searches')
    .insert({
      target_id: search.targetId,
      requested_by: search.requestedBy,
      status: 'queued',
      settings: JSON.stringify(search.settings),
      created_at: now,
      updated_at: now,
    })
    .returning('*');
  return toRow(row);
}

export async function findPeriodSearch(db: Q, id: number): Promise<PeriodSearchRow | undefined> {
  const row = await db('period_searches').where({ id }).first();
  return row ? toRow(row) : undefined;
}

export async function latestPeriodSearch(db: Q, targetId: number): Promise<PeriodSearchRow | undefined> {
  const row = await db('period_searches').where({ target_id: targetId }).orderBy('id', 'desc').first();
  return row ? toRow(row) : undefined;
}

export async function updatePeriodSearch(
  db: Q,
  id: number,
  changes: { status?: PeriodSearchStatus; jobRef?: string; result?: unknown; error?: string | null },
): Promise<void> {
  await db('period_searches')
    .where({ id })
    .update({
      ...(changes.status ? { status: changes.status } : {}),
      ...(changes.jobRef ? { job_ref: changes.jobRef } : {}),
      ...(changes.result !== undefined ? { result: JSON.stringify(changes.result) } : {}),
      ...(changes.error !== undefined ? { error: changes.error } : {}),
      updated_at: nowIso(),
    });
}

/** The target's light curves (not quiet references), joined in time order, with their time system. */
export async function targetSeries(
  db: Q,
  targetId: number,
): Promise<{
  timeDays: Float64Array;
  flux: Float64Array;
  fluxErr: Float64Array;
  bjdRefDays: number | null;
} | null> {
  const rows: Record<string, unknown>[] = await db('light_curves')
    .where({ target_id: targetId, is_quiet_reference: false })
    .orderBy(['time_start', 'id'])
    .select('series', 'time_system');
  const parts = rows.filter((row) => row.series).map((row) => unpackLightCurve(row.series as Buffer));
  if (parts.length === 0) return null;
  const n = parts.reduce((sum, part) => sum + part.timeDays.length, 0);
  const timeDays = new Float64Array(n);
  const flux = new Float64Array(n);
  const fluxErr = new Float64Array(n);
  let offset = 0;
  for (const part of parts) {
    timeDays.set(part.timeDays, offset);
    flux.set(part.flux, offset);
    fluxErr.set(part.fluxErr, offset);
    offset += part.timeDays.length;
  }
  const system = fromJson<{ bjdRefDays?: number | null }>(rows[0]!.time_system, {});
  return { timeDays, flux, fluxErr, bjdRefDays: system.bjdRefDays ?? null };
}
