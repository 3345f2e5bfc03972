import type { Knex } from 'knex';
import type { AuditVerdict } from '../science/volunteer-audit';
import { type Db, nullsAsSmallest } from './knex';
import { nowIso, toIso, toIsoOrNull } from './rows';
import type { SnippetKind, SnippetState } from './snippets';

// What the Desk reads and writes: split snippets, their verdicts with names, rulings, the volunteers'
// verdict histories for the audit, and moderators' clearings of flags.

type Q = Db | Knex.Transaction;
type Raw = Record<string, unknown>;
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export interface SplitRow {
  snippetId: number;
  campaign: { id: number; name: string };
  target: { id: number; designation: string };
  kind: SnippetKind;
  splitReason: string | null;
  splitAt: string | null;
  consensusScore: number | null;
  dipShare: number | null;
  verdictCount: number;
  onCandidate: boolean;
}

export async function listSplits(
  db: Q,
  filter: { campaignId?: number | undefined; order: 'oldest' | 'needed'; limit: number; offset: number },
): Promise<{ splits: SplitRow[]; total: number }> {
  const base = db('snippets').where('snippets.state', 'split');
  if (filter.campaignId) base.andWhere('snippets.campaign_id', filter.campaignId);
  const [count] = await base.clone().count<{ n: number | string }[]>({ n: '*' });
  const onCandidate = db('candidates')
    .whereRaw('candidates.target_id = snippets.target_id')
    .whereRaw('candidates.campaign_id = snippets.campaign_id')
    .select(db.raw('1'));
  const query = base
    .clone()
    .join('campaigns', 'campaigns.id', 'snippets.campaign_id')
    .join('targets', 'targets.id', 'snippets.target_id')
    .select(
      'snippets.id',
      'snippets.kind',
      'snippets.split_reason',
      'snippets.settled_at',
      'snippets.consensus_score',
      'snippets.dip_share',
      'snippets.verdict_count',
      'snippets.campaign_id',
      'campaigns.name as campaign_name',
      'snippets.target_id',
      'targets.designation',
      db.raw('exists ? as on_candidate', [onCandidate]),
    )
    .limit(filter.limit)
    .offset(filter.offset);
  if (filter.order === 'needed') query.orderByRaw('exists ? desc', [onCandidate]);
  query.orderBy([
    { column: 'snippets.settled_at', order: 'asc', nulls: nullsAsSmallest(db, 'asc') },
    'snippets.id',
  ]);
  const rows: Raw[] = await query;
  return {
    total: Number(count?.n ?? 0),
    splits: rows.map((row) => ({
      snippetId: Number(row.id),
      campaign: { id: Number(row.campaign_id), name: String(row.campaign_name) },
      target: { id: Number(row.target_id), designation: String(row.designation) },
      kind: row.kind as SnippetKind,
      splitReason: (row.split_reason as string | null) ?? null,
      splitAt: toIsoOrNull(row.settled_at),
      consensusScore: numOrNull(row.consensus_score),
      dipShare: numOrNull(row.dip_share),
      verdictCount: Number(row.verdict_count),
      onCandidate: Boolean(Number(row.on_candidate)) || row.on_candidate === true,
    })),
  };
}

export interface ReviewSnippet {
  id: number;
  campaign: { id: number; name: string };
  target: { id: number; designation: string };
  lightCurveId: number;
  kind: SnippetKind;
  state: SnippetState;
  outcome: 'dip' | 'flat' | null;
  splitReason: string | null;
  timeStart: number;
  timeEnd: number;
  consensusScore: number | null;
  dipShare: number | null;
  effectiveVotes: number | null;
  verdictCount: number;
}

export async function findReviewSnippet(db: Q, snippetId: number): Promise<ReviewSnippet | undefined> {
  const row: Raw | undefined = await db('snippets')
    .join('campaigns', 'campaigns.id', 'snippets.campaign_id')
    .join('targets', 'targets.id', 'snippets.target_id')
    .where('snippets.id', snippetId)
    .first('snippets.*', 'campaigns.name as campaign_name', 'targets.designation');
  if (!row) return undefined;
  return {
    id: Number(row.id),
    campaign: { id: Number(row.campaign_id), name: String(row.campaign_name) },
    target: { id: Number(row.target_id), designation: String(row.designation) },
    lightCurveId: Number(row.light_curve_id),
    kind: row.kind as SnippetKind,
    state: row.state as SnippetState,
    outcome: (row.outcome as 'dip' | 'flat' | null) ?? null,
    splitReason: (row.split_reason as string | null) ?? null,
    timeStart: Number(row.time_start),
    timeEnd: Number(row.time_end),
    consensusScore: numOrNull(row.consensus_score),
    dipShare: numOrNull(row.dip_share),
    effectiveVotes: numOrNull(row.effective_votes),
    verdictCount: Number(row.verdict_count),
  };
}

export interface ReviewVerdict {
  personId: number;
  displayName: string;
  suspended: boolean;
  answer: 'dip' | 'flat' | 'unsure';
  markTime: number | null;
  createdAt: string;
}

/** The snippet's signed-in, not withdrawn verdicts, oldest first, with their authors' names. */
export async function reviewVerdicts(db: Q, snippetId: number): Promise<ReviewVerdict[]> {
  const rows: Raw[] = await db('verdicts')
    .join('people', 'people.id', 'verdicts.person_id')
    .where('verdicts.snippet_id', snippetId)
    .whereNull('verdicts.withdrawn_at')
    .whereNull('people.deleted_at')
    .orderBy(['verdicts.created_at', 'verdicts.id'])
    .select(
      'verdicts.person_id',
      'people.display_name',
      'people.suspended_at',
      'verdicts.answer',
      'verdicts.mark_time',
      'verdicts.created_at',
    );
  return rows.map((row) => ({
    personId: Number(row.person_id),
    displayName: String(row.display_name),
    suspended: row.suspended_at !== null && row.suspended_at !== undefined,
    answer: row.answer as ReviewVerdict['answer'],
    markTime: numOrNull(row.mark_time),
    createdAt: toIso(row.created_at),
  }));
}

export interface Neighbour {
  snippetId: number;
  timeStart: number;
  timeEnd: number;
  state: SnippetState;
  outcome: 'dip' | 'flat' | null;
  consensusScore: number | null;
}

/** Up to `each` real snippets of the same light curve on either side of the given time. */
export async function neighbourSnippets(
  db: Q,
  snippet: Pick<ReviewSnippet, 'id' | 'lightCurveId' | 'timeStart'>,
  each = 3,
): Promise<Neighbour[]> {
  const side = (direction: 'before' | 'after') =>
    db('snippets')
      .where({ light_curve_id: snippet.lightCurveId, kind: 'real' })
      .whereNot('id', snippet.id)
      .where('time_start', direction === 'before' ? '<' : '>', snippet.timeStart)
      .orderBy('time_start', direction === 'before' ? 'desc' : 'asc')
      .limit(each)
      .select('id', 'time_start', 'time_end', 'state', 'outcome', 'consensus_score');
  const rows: Raw[] = [...(await side('before')).reverse(), ...(await side('after'))];
  return rows.map((row) => ({
    snippetId: Number(row.id),
    timeStart: Number(row.time_start),
    timeEnd: Number(row.time_end),
    state: row.state as SnippetState,
    outcome: (row.outcome as 'dip' | 'flat' | null) ?? null,
    consensusScore: numOrNull(row.consensus_score),
  }));
}

export type RulingValue = 'dip' | 'flat' | 'systematic';

export interface RulingRow {
  id: number;
  ruling: RulingValue;
  note: string | null;
  moderator: string | null;
  createdAt: string;
}

export async function rulingsFor(db: Q, snippetId: number): Promise<RulingRow[]> {
  const rows: Raw[] = await db('rulings')
    .leftJoin('people', 'people.id', 'rulings.moderator_id')
    .where('rulings.snippet_id', snippetId)
    .orderBy('rulings.id')
    .select('rulings.id', 'rulings.ruling', 'rulings.note', 'rulings.created_at', 'people.display_name');
  return rows.map((row) => ({
    id: Number(row.id),
    ruling: row.ruling as RulingValue,
    note: (row.note as string | null) ?? null,
    moderator: (row.display_name as string | null) ?? null,
    createdAt: toIso(row.created_at),
  }));
}

export async function insertRuling(
  db: Q,
  ruling: { snippetId: number; moderatorId: number; ruling: RulingValue; note: string | null },
): Promise<RulingRow> {
  const now = nowIso();
  const [row] = await db('rulings')
    .insert({
      snippet_id: ruling.snippetId,
      moderator_id: ruling.moderatorId,
      ruling: ruling.ruling,
      note: ruling.note,
      created_at: now,
    })
    .returning('id');
  const id = Number(typeof row === 'object' ? row.id : row);
  return { id, ruling: ruling.ruling, note: ruling.note, moderator: null, createdAt: now };
}

/** A ruled snippet: its outcome is the ruling's, and it waits for no one. */
export async function markRuled(db: Q, snippetId: number, outcome: 'dip' | 'flat'): Promise<void> {
  await db('snippets').where({ id: snippetId }).update({
    state: 'ruled',
    outcome,
    split_reason: null,
    needs_rescore: true, // fresh numbers, and dips for a positive ruling
    updated_at: nowIso(),
  });
}

export async function deleteDipsOf(db: Q, snippetId: number): Promise<number> {
  return db('dips').where({ snippet_id: snippetId }).delete();
}

export interface AuditPerson {
  id: number;
  displayName: string;
  email: string | null;
  role: string;
  suspendedAt: string | null;
  suspendedReason: string | null;
  lastActiveAt: string | null;
}

/** Volunteers (role volunteer, not deleted), by name, with a search over name and e-mail. */
export async function listAuditPeople(db: Q, search?: string): Promise<AuditPerson[]> {
  const query = db('people')
    .where({ role: 'volunteer' })
    .whereNull('deleted_at')
    .orderBy(['display_name', 'id']);
  if (search) {
    const pattern = `%${search.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    query.andWhere((w) =>
      w
        .whereRaw("lower(email) like ? escape '\\'", [pattern])
        .orWhereRaw("lower(display_name) like ? escape '\\'", [pattern]),
    );
  }
  const rows: Raw[] = await query.select(
    'id',
    'display_name',
    'email',
    'role',
    'suspended_at',
    'suspended_reason',
    'last_active_at',
  );
  return rows.map((row) => ({
    id: Number(row.id),
    displayName: String(row.display_name),
    email: (row.email as string | null) ?? null,
    role: String(row.role),
    suspendedAt: toIsoOrNull(row.suspended_at),
    suspendedReason: (row.suspended_reason as string | null) ?? null,
    lastActiveAt: toIsoOrNull(row.last_active_at),
  }));
}

/** Every not-withdrawn verdict of these people (optionally in one campaign), as the audit reads them. */
export async function auditVerdicts(
  db: Q,
  personIds: number[],
  campaignId?: number,
): Promise<Map<number, AuditVerdict[]>> {
  const result = new Map<number, AuditVerdict[]>(personIds.map((id) => [id, []]));
  for (let i = 0; i < personIds.length; i += 500) {
    const query = db('verdicts')
      .join('snippets', 'snippets.id', 'verdicts.snippet_id')
      .whereIn('verdicts.person_id', personIds.slice(i, i + 500))
      .whereNull('verdicts.withdrawn_at')
      .select(
        'verdicts.person_id',
        'verdicts.answer',
        'verdicts.elapsed_ms',
        'verdicts.created_at',
        'snippets.kind',
        'snippets.state',
        'snippets.outcome',
      );
    if (campaignId) query.where('snippets.campaign_id', campaignId);
    const rows: Raw[] = await query;
    for (const row of rows) {
      const settled = row.state === 'settled' || row.state === 'ruled';
      result.get(Number(row.person_id))!.push({
        answer: row.answer as AuditVerdict['answer'],
        elapsedMs: numOrNull(row.elapsed_ms),
        atMs: Date.parse(toIso(row.created_at)),
        controlTruth: row.kind === 'planted' ? 'dip' : row.kind === 'quiet' ? 'flat' : null,
        outcome: settled ? ((row.outcome as 'dip' | 'flat' | null) ?? null) : null,
      });
    }
  }
  return result;
}

export interface FlagClearance {
  personId: number;
  flagCode: string;
  clearedBy: string | null;
  note: string;
  clearedAt: string;
}

export async function flagClearances(db: Q, personIds: number[]): Promise<FlagClearance[]> {
  const result: FlagClearance[] = [];
  for (let i = 0; i < personIds.length; i += 500) {
    const rows: Raw[] = await db('flag_clearances')
      .leftJoin('people', 'people.id', 'flag_clearances.cleared_by')
      .whereIn('flag_clearances.person_id', personIds.slice(i, i + 500))
      .select('flag_clearances.*', 'people.display_name');
    for (const row of rows) {
      result.push({
        personId: Number(row.person_id),
        flagCode: String(row.flag_code),
        clearedBy: (row.display_name as string | null) ?? null,
        note: String(row.note),
        clearedAt: toIso(row.cleared_at),
      });
    }
  }
  return result;
}

export async function saveFlagClearance(
  db: Q,
  clearance: { personId: number; flagCode: string; clearedBy: number; note: string },
): Promise<void> {
  await db('flag_clearances')
    .insert({
      person_id: clearance.personId,
      flag_code: clearance.flagCode,
      cleared_by: clearance.clearedBy,
      note: clearance.note,
      cleared_at: nowIso(),
    })
    .onConflict(['person_id', 'flag_code'])
    .merge();
}

/** Marks every snippet the person has a verdict on for rescoring; answers how many, and their campaigns. */
export async function markPersonSnippetsForRescore(
  db: Q,
  personId: number,
): Promise<{ snippets: number; campaignIds: number[] }> {
  const judged = db('verdicts').where({ person_id: personId }).whereNull('withdrawn_at').select('snippet_id');
  const snippets = await db('snippets').whereIn('id', judged).update({ needs_rescore: true });
  const campaigns = await db('snippets').whereIn('id', judged).distinct('campaign_id');
  return { snippets, campaignIds: campaigns.map((row) => Number(row.campaign_id)).sort((a, b) => a - b) };
}
