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
