import type { Knex } from 'knex';
import { type Db, nullsAsSmallest } from './knex';
import { nowIso, toBool, toIso } from './rows';

type Q = Db | Knex.Transaction;
type Raw = Record<string, unknown>;
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export const CANDIDATE_STATES = ['promoted', 'scheduled', 'observed', 'resolved'] as const;
export const DISPOSITIONS = [
  'planet candidate',
  'eclipsing binary',
  'systematic',
  'false positive',
  'confirmed planet',
] as const;
export type CandidateState = (typeof CANDIDATE_STATES)[number];
export type Disposition = (typeof DISPOSITIONS)[number];

export interface CandidateRow {
  id: number;
  campaignId: number;
  targetId: number;
  designation: string;
  promotedBy: number | null;
  state: CandidateState;
  disposition: Disposition;
  notes: string | null;
  periodDays: number | null;
  periodSigmaDays: number | null;
  t0Bjd: number | null;
  t0SigmaDays: number | null;
  depthPpm: number | null;
  durationHours: number | null;
  snr: number | null;
  priority: number | null;
  dipIds: number[];
  createdAt: string;
  updatedAt: string;
}

export type CandidateFields = Pick<
  CandidateRow,
  | 'periodDays'
  | 'periodSigmaDays'
  | 't0Bjd'
  | 't0SigmaDays'
  | 'depthPpm'
  | 'durationHours'
  | 'snr'
  | 'priority'
  | 'notes'
>;

function toCandidate(row: Raw, dipIds: number[]): CandidateRow {
  return {
    id: Number(row.id),
    campaignId: Number(row.campaign_id),
    targetId: Number(row.target_id),
    designation: String(row.designation),
    promotedBy: numOrNull(row.promoted_by),
    state: row.state as CandidateState,
    disposition: row.disposition as Disposition,
    notes: (row.notes as string | null) ?? null,
    periodDays: numOrNull(row.period_days),
    periodSigmaDays: numOrNull(row.period_sigma_days),
    t0Bjd: numOrNull(row.t0_bjd),
    t0SigmaDays: numOrNull(row.t0_sigma_days),
    depthPpm: numOrNull(row.depth_ppm),
    durationHours: numOrNull(row.duration_hours),
    snr: numOrNull(row.snr),
    priority: numOrNull(row.priority),
    dipIds,
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

async function dipIdsOf(db: Q, candidateIds: number[]): Promise<Map<number, number[]>> {
  const result = new Map<number, number[]>(candidateIds.map((id) => [id, []]));
  if (candidateIds.length === 0) return result;
  const rows: Raw[] = await db('candidate_dips').whereIn('candidate_id', candidateIds).orderBy('dip_id');
  for (const row of rows) result.get(Number(row.candidate_id))?.push(Number(row.dip_id));
  return result;
}

const withTarget = (db: Q) =>
  db('candidates')
    .join('targets', 'targets.id', 'candidates.target_id')
    .select('candidates.*', 'targets.designation');

export async function listCandidates(db: Q, campaignId: number): Promise<CandidateRow[]> {
  const rows: Raw[] = await withTarget(db)
    .where('candidates.campaign_id', campaignId)
    // Candidates without a priority last, on either database.
    .orderBy([
      { column: 'candidates.priority', order: 'desc', nulls: nullsAsSmallest(db, 'desc') },
      'candidates.id',
    ]);
  const dips = await dipIdsOf(
    db,
    rows.map((row) => Number(row.id)),
  );
  return rows.map((row) => toCandidate(row, dips.get(Number(row.id)) ?? []));
}

export async function findCandidate(db: Q, id: number): Promise<CandidateRow | undefined> {
  const row: Raw | undefined = await withTarget(db).where('candidates.id', id).first();
  if (!row) return undefined;
  return toCandidate(row, (await dipIdsOf(db, [id])).get(id) ?? []);
}

export async function findCandidateForTarget(db: Q, campaignId: number, targetId: number) {
  return db('candidates').where({ campaign_id: campaignId, target_id: targetId }).first('id');
}

/** Inserts a candidate; answers undefined when the target already is one (the unique index decides). */
export async function insertCandidate(
  db: Q,
  candidate: CandidateFields & { campaignId: number; targetId: number; promotedBy: number; dipIds: number[] },
): Promise<number | undefined> {
  const now = nowIso();
  const [row] = await db('candidates')
    .insert({
      campaign_id: candidate.campaignId,
      target_id: candidate.targetId,
      promoted_by: candidate.promotedBy,
      state: 'promoted',
      disposition: 'planet candidate',
      notes: candidate.notes,
      period_days: candidate.periodDays,
      period_sigma_days: candidate.periodSigmaDays,
      t0_bjd: candidate.t0Bjd,
      t0_sigma_days: candidate.t0SigmaDays,
      depth_ppm: candidate.depthPpm,
      duration_hours: candidate.durationHours,
      snr: candidate.snr,
      priority: candidate.priority,
      created_at: now,
      updated_at: now,
    })
    .onConflict(['campaign_id', 'target_id'])
    .ignore()
    .returning('id');
  if (row === undefined) return undefined;
  const id = Number(typeof row === 'object' ? row.id : row);
  if (candidate.dipIds.length > 0) {
    await db('candidate_dips').insert(candidate.dipIds.map((dipId) => ({ candidate_id: id, dip_id: dipId })));
  }
  return id;
}

export async function updateCandidate(
  db: Q,
  id: number,
  changes: {
    state?: CandidateState;
    disposition?: Disposition;
    notes?: string | null;
    priority?: number | null;
  },
): Promise<void> {
  const update: Raw = { updated_at: nowIso() };
  if (changes.state !== undefined) update.state = changes.state;
  if (changes.disposition !== undefined) update.disposition = changes.disposition;
  if (changes.notes !== undefined) update.notes = changes.notes;
  if (changes.priority !== undefined) update.priority = changes.priority;
  await db('candidates').where({ id }).update(update);
}

export interface TargetDip {
  id: number;
  snippetId: number;
  timeCenter: number;
  timeSigma: number | null;
  depthPpm: number | null;
  durationHours: number | null;
  snr: number | null;
  consensusScore: number | null;
}

export async function dipsOfTarget(db: Q, campaignId: number, targetId: number): Promise<TargetDip[]> {
  const rows: Raw[] = await db('dips')
    .where({ campaign_id: campaignId, target_id: targetId })
    .orderBy(['time_center', 'id']);
  return rows.map(toTargetDip);
}

function toTargetDip(row: Raw): TargetDip {
  return {
    id: Number(row.id),
    snippetId: Number(row.snippet_id),
    timeCenter: Number(row.time_center),
    timeSigma: numOrNull(row.time_sigma),
    depthPpm: numOrNull(row.depth_ppm),
    durationHours: numOrNull(row.duration_hours),
    snr: numOrNull(row.snr),
    consensusScore: numOrNull(row.consensus_score),
  };
}

/** Who found the candidate's dips: the names of those who agreed to be named, and how many others. */
export async function candidateCredits(
  db: Q,
  candidateId: number,
): Promise<{ named: string[]; others: number }> {
  const rows: Raw[] = await db('candidate_dips')
    .join('dip_finders', 'dip_finders.dip_id', 'candidate_dips.dip_id')
    .join('people', 'people.id', 'dip_finders.person_id')
    .where('candidate_dips.candidate_id', candidateId)
    .whereNull('people.deleted_at')
    .distinct('people.id', 'people.display_name', 'people.credit_by_name')
    .orderBy('people.display_name');
  const named = rows.filter((row) => toBool(row.credit_by_name)).map((row) => String(row.display_name));
  return { named, others: rows.length - named.length };
}

export interface DipTarget {
  targetId: number;
  designation: string;
  dipCount: number;
  bestSnr: number | null;
  meanScore: number | null;
  onCandidate: boolean;
  dips: TargetDip[];
}

/** A campaign's settled dips grouped by target: what the Lab's candidate review starts from. */
export async function dipTargets(db: Q, campaignId: number): Promise<DipTarget[]> {
  const rows: Raw[] = await db('dips')
    .join('targets', 'targets.id', 'dips.target_id')
    .where('dips.campaign_id', campaignId)
    .orderBy(['dips.target_id', 'dips.time_center', 'dips.id'])
    .select('dips.*', 'targets.designation');
  const candidates = new Set(
    (await db('candidates').where({ campaign_id: campaignId }).pluck('target_id')).map(Number),
  );
  const byTarget = new Map<number, DipTarget>();
  for (const row of rows) {
    const targetId = Number(row.target_id);
    let entry = byTarget.get(targetId);
    if (!entry) {
      entry = {
        targetId,
        designation: String(row.designation),
        dipCount: 0,
        bestSnr: null,
        meanScore: null,
        onCandidate: candidates.has(targetId),
        dips: [],
      };
      byTarget.set(targetId, entry);
    }
    entry.dips.push(toTargetDip(row));
  }
  for (const entry of byTarget.values()) {
    entry.dipCount = entry.dips.length;
    const snrs = entry.dips.flatMap((dip) => (dip.snr === null ? [] : [dip.snr]));
    entry.bestSnr = snrs.length ? Math.max(...snrs) : null;
    const scores = entry.dips.flatMap((dip) => (dip.consensusScore === null ? [] : [dip.consensusScore]));
    entry.meanScore = scores.length ? scores.reduce((a, b) => a + b, 0) / scores.length : null;
  }
  return [...byTarget.values()];
}
