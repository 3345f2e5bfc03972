import { appendAudit } from '../../db/audit-log';
import { type Db, nullsAsSmallest } from '../../db/knex';
import { fromJson, nowIso } from '../../db/rows';
import { unpackDisplay } from '../../db/series-codec';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';

export interface SnippetQuery {
  state?: 'open' | 'settled' | 'split' | 'ruled' | undefined;
  kind?: 'real' | 'planted' | 'quiet' | undefined;
  target?: string | undefined;
  sort: 'id' | 'timeStart' | 'verdictCount' | 'consensusScore';
  order: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

const SORT_COLUMNS = {
  id: 'snippets.id',
  timeStart: 'snippets.time_start',
  verdictCount: 'snippets.verdict_count',
  consensusScore: 'snippets.consensus_score',
} as const;

const num = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export async function listSnippets(db: Db, campaignId: number, query: SnippetQuery) {
  const base = db('snippets')
    .join('targets', 'targets.id', 'snippets.target_id')
    .where('snippets.campaign_id', campaignId);
  if (query.state) base.andWhere('snippets.state', query.state);
  if (query.kind) base.andWhere('snippets.kind', query.kind);
  if (query.target) base.andWhere('targets.designation', query.target);
  const [count] = await base.clone().count<{ n: number }[]>({ n: '*' });
  const rows = await base
    .clone()
    .select(
      'snippets.id',
      'snippets.target_id',
      'targets.designation',
      'snippets.kind',
      'snippets.state',
      'snippets.time_start',
      'snippets.time_end',
      'snippets.point_count',
      'snippets.verdict_count',
      'snippets.consensus_score',
    )
    // Unscored snippets (no consensus score) sort as the smallest, on either database.
    .orderBy(SORT_COLUMNS[query.sort], query.order, nullsAsSmallest(db, query.order))
    .orderBy('snippets.id', 'asc')
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return {
    snippets: rows.map((row: Record<string, unknown>) => ({
      id: Number(row.id),
      targetId: Number(row.target_id),
      designation: String(row.designation),
      kind: row.kind,
      state: row.state,
      timeStart: Number(row.time_start),
      timeEnd: Number(row.time_end),
      pointCount: Number(row.point_count),
      verdictCount: Number(row.verdict_count),
      consensusScore: num(row.consensus_score),
    })),
    total: Number(count?.n ?? 0),
    page: query.page,
    pageSize: query.pageSize,
  };
}

/** One snippet as staff see it: its series, kind and, for a planted control, the truth. */
export async function getSnippet(db: Db, id: number) {
  const row = await db('snippets')
    .join('targets', 'targets.id', 'snippets.target_id')
    .where('snippets.id', id)
    .first('snippets.*', 'targets.designation');
  if (!row) throw notFound('Snippet');
  const display = unpackDisplay(row.display as Buffer);
  return {
    id: Number(row.id),
    campaignId: Number(row.campaign_id),
    targetId: Number(row.target_id),
    designation: String(row.designation),
    kind: row.kind,
    state: row.state,
    timeStart: Number(row.time_start),
    timeEnd: Number(row.time_end),
    pointCount: Number(row.point_count),
    verdictCount: Number(row.verdict_count),
    consensusScore: num(row.consensus_score),
    dipShare: num(row.dip_share),
    sourceSnippetId: num(row.source_snippet_id),
    plantedTruth: fromJson(row.planted_truth, null),
    display: { offsetDays: Array.from(display.offsetDays), flux: Array.from(display.flux) },
  };
}

/**
 * A scientist declares a real snippet to hold no transit: it becomes a quiet control, whose known answer
 * measures volunteers' specificity. Only an open real snippet can be marked; the change is audit-logged.
 */
export async function markSnippetQuiet(db: Db, actorId: number, id: number) {
  return writeTransaction(db, async (trx) => {
    const row = await trx('snippets').where({ id }).first('id', 'kind', 'state');
    if (!row) throw notFound('Snippet');
    if (row.kind !== 'real') {
      throw new AppError(
        'not_real',
        `Only a real snippet can be marked quiet; this one is ${row.kind}`,
        'conflict',
      );
    }
    if (row.state !== 'open') {
      throw new AppError(
        'not_open',
        `Only an open snippet can be marked quiet; this one is ${row.state}`,
        'conflict',
      );
    }
    await trx('snippets').where({ id }).update({ kind: 'quiet', updated_at: nowIso() });
    await appendAudit(trx, {
      actorId,
      action: 'snippet.marked_quiet',
      entityType: 'snippet',
      entityId: id,
      before: { kind: 'real' },
      after: { kind: 'quiet' },
    });
    return getSnippet(trx, id);
  });
}
