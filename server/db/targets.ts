import type { Knex } from 'knex';
import type { Db } from './knex';
import { fromJson, nowIso } from './rows';

export interface TargetFields {
  designation: string;
  raDeg: number | null;
  decDeg: number | null;
  magnitude: number | null;
  stellarRadiusRsun: number | null;
  stellarMassMsun: number | null;
  teffK: number | null;
  /** Fields that hold assumed defaults rather than catalogue values. */
  assumedFields: string[];
}

export interface TargetRow extends TargetFields {
  id: number;
  campaignId: number;
}

type Raw = Record<string, unknown>;
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export function toTarget(row: Raw): TargetRow {
  return {
    id: Number(row.id),
    campaignId: Number(row.campaign_id),
    designation: String(row.designation),
    raDeg: numOrNull(row.ra_deg),
    decDeg: numOrNull(row.dec_deg),
    magnitude: numOrNull(row.magnitude),
    stellarRadiusRsun: numOrNull(row.stellar_radius_rsun),
    stellarMassMsun: numOrNull(row.stellar_mass_msun),
    teffK: numOrNull(row.teff_k),
    assumedFields: fromJson<string[]>(row.assumed_fields, []),
  };
}

const toColumns = (fields: TargetFields) => ({
  designation: fields.designation,
  ra_deg: fields.raDeg,
  dec_deg: fields.decDeg,
  magnitude: fields.magnitude,
  stellar_radius_rsun: fields.stellarRadiusRsun,
  stellar_mass_msun: fields.stellarMassMsun,
  teff_k: fields.teffK,
  assumed_fields: JSON.stringify(fields.assumedFields),
});

/**
 * Inserts or updates by designation within the campaign; answers the row and whether it was new. The
 * unique index decides which: on PostgreSQL two imports of the same new star can run at once, and the
 * second waits for the first and then updates its row instead of failing on the index.
 */
export async function upsertTarget(
  db: Db | Knex.Transaction,
  campaignId: number,
  fields: TargetFields,
): Promise<{ target: TargetRow; created: boolean }> {
  const now = nowIso();
  const [inserted] = await db('targets')
    .insert({ ...toColumns(fields), campaign_id: campaignId, created_at: now, updated_at: now })
    .onConflict(['campaign_id', 'designation'])
    .ignore()
    .returning('*');
  if (inserted) return { target: toTarget(inserted), created: true };
  const [row] = await db('targets')
    .where({ campaign_id: campaignId, designation: fields.designation })
    .update({ ...toColumns(fields), updated_at: now })
    .returning('*');
  return { target: toTarget(row), created: false };
}

export async function findTargetByDesignation(
  db: Db | Knex.Transaction,
  campaignId: number,
  designation: string,
): Promise<TargetRow | undefined> {
  const row = await db('targets').where({ campaign_id: campaignId, designation }).first();
  return row ? toTarget(row) : undefined;
}

export async function findTargetById(db: Db | Knex.Transaction, id: number): Promise<TargetRow | undefined> {
  const row = await db('targets').where({ id }).first();
  return row ? toTarget(row) : undefined;
}
