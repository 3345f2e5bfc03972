import type { Knex } from 'knex';
import type { Db } from './knex';
import { nowIso, toIso } from './rows';

type Q = Db | Knex.Transaction;

export interface ObservatoryRow {
  id: number;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number;
  minTargetAltitudeDeg: number;
  sunAltitudeLimitDeg: number;
  createdAt: string;
}

const toRow = (row: Record<string, unknown>): ObservatoryRow => ({
  id: Number(row.id),
  name: String(row.name),
  latitudeDeg: Number(row.latitude_deg),
  longitudeDeg: Number(row.longitude_deg),
  elevationM: Number(row.elevation_m),
  minTargetAltitudeDeg: Number(row.min_target_altitude_deg),
  sunAltitudeLimitDeg: Number(row.sun_altitude_limit_deg),
  createdAt: toIso(row.created_at),
});

export async function listObservatories(db: Q): Promise<ObservatoryRow[]> {
  return (await db('observatories').orderBy('name')).map(toRow);
}

/** Inserts an observatory; undefined when the name is taken (the unique index decides). */
export async function insertObservatory(
  db: Q,
  observatory: Omit<ObservatoryRow, 'id' | 'createdAt'> & { createdBy: number },
): Promise<ObservatoryRow | undefined> {
  const now = nowIso();
  const rows = await db('observatories')
    .insert({
      name: observatory.name,
      latitude_deg: observatory.latitudeDeg,
      longitude_deg: observatory.longitudeDeg,
      elevation_m: observatory.elevationM,
      min_target_altitude_deg: observatory.minTargetAltitudeDeg,
      sun_altitude_limit_deg: observatory.sunAltitudeLimitDeg,
      created_by: observatory.createdBy,
      created_at: now,
      updated_at: now,
    })
    .onConflict('name')
    .ignore()
    .returning('*');
  return rows[0] ? toRow(rows[0]) : undefined;
}

export async function findObservatory(db: Q, id: number): Promise<ObservatoryRow | undefined> {
  const row = await db('observatories').where({ id }).first();
  return row ? toRow(row) : undefined;
}

/** Changes an observatory; undefined when the new name is another observatory's. */
export async function updateObservatory(
  db: Q,
  id: number,
  changes: Partial<Omit<ObservatoryRow, 'id' | 'createdAt'>>,
): Promise<ObservatoryRow | undefined> {
  if (changes.name !== undefined) {
    const clash = await db('observatories').where({ name: changes.name }).whereNot({ id }).first('id');
    if (clash) return undefined;
  }
  const update: Record<string, unknown> = { updated_at: nowIso() };
  if (changes.name !== undefined) update.name = changes.name;
  if (changes.latitudeDeg !== undefined) update.latitude_deg = changes.latitudeDeg;
  if (changes.longitudeDeg !== undefined) update.longitude_deg = changes.longitudeDeg;
  if (changes.elevationM !== undefined) update.elevation_m = changes.elevationM;
  if (changes.minTargetAltitudeDeg !== undefined)
    update.min_target_altitude_deg = changes.minTargetAltitudeDeg;
  if (changes.sunAltitudeLimitDeg !== undefined) update.sun_altitude_limit_deg = changes.sunAltitudeLimitDeg;
  await db('observatories').where({ id }).update(update);
  return findObservatory(db, id);
}

export async function deleteObservatory(db: Q, id: number): Promise<boolean> {
  return (await db('observatories').where({ id }).delete()) > 0;
}
