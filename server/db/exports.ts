import type { ExportRow } from '../formats/columns';
import { candidateCredits } from './candidates';
import type { Db } from './knex';

// The rows of the exports, read a page at a time by id so that a long list streams in flat memory.

const PAGE = 1_000;
const num = (value: unknown) => (value === null || value === undefined ? null : Number(value));

export async function* followUpRows(db: Db, campaignId: number): AsyncGenerator<ExportRow> {
  let after = 0;
  for (;;) {
    const rows: Record<string, unknown>[] = await db('candidates')
      .join('targets', 'targets.id', 'candidates.target_id')
      .where('candidates.campaign_id', campaignId)
      .andWhere('candidates.id', '>', after)
      .orderBy('candidates.id')
      .limit(PAGE)
      .select(
        'candidates.*',
        'targets.designation',
        'targets.ra_deg',
        'targets.dec_deg',
        'targets.magnitude',
      );
    if (rows.length === 0) return;
    for (const row of rows) {
      const id = Number(row.id);
      const [dips] = await db('candidate_dips').where({ candidate_id: id }).count({ n: '*' });
      const credits = await candidateCredits(db, id);
      yield {
        candidate_id: id,
        designation: String(row.designation),
        ra: num(row.ra_deg),
        dec: num(row.dec_deg),
        magnitude: num(row.magnitude),
        state: String(row.state),
        disposition: String(row.disposition),
        period: num(row.period_days),
        period_err: num(row.period_sigma_days),
        t0_bjd_tdb: num(row.t0_bjd),
        t0_err: num(row.t0_sigma_days),
        depth: num(row.depth_ppm),
        duration: num(row.duration_hours),
        snr: num(row.snr),
        priority: num(row.priority),
        dip_count: Number(dips?.n ?? 0),
        credited: credits.named.join('; '),
      };
    }
    after = Number(rows[rows.length - 1]!.id);
  }
}

export async function* consensusRows(db: Db, campaignId: number): AsyncGenerator<ExportRow> {
  let after = 0;
  for (;;) {
    const rows: Record<string, unknown>[] = await db('snippets')
      .join('targets', 'targets.id', 'snippets.target_id')
      .leftJoin('dips', (join) => join.on('dips.snippet_id', 'snippets.id').andOnVal('dips.cluster_index', 0))
      .where('snippets.campaign_id', campaignId)
      .whereIn('snippets.state', ['settled', 'ruled'])
      .andWhere('snippets.id', '>', after)
      .orderBy('snippets.id')
      .limit(PAGE)
      .select(
        'snippets.id',
        'snippets.kind',
        'snippets.state',
        'snippets.outcome',
        'snippets.time_start',
        'snippets.time_end',
        'snippets.consensus_score',
        'snippets.dip_share',
        'snippets.verdict_count',
        'snippets.effective_votes',
        'targets.designation',
        'dips.time_center',
        'dips.time_sigma',
        'dips.depth_ppm',
        'dips.duration_hours',
      );
    if (rows.length === 0) return;
    for (const row of rows) {
      yield {
        snippet_id: Number(row.id),
        designation: String(row.designation),
        kind: String(row.kind),
        state: String(row.state),
        outcome: (row.outcome as string | null) ?? null,
        time_start: Number(row.time_start),
        time_end: Number(row.time_end),
        consensus_score: num(row.consensus_score),
        dip_share: num(row.dip_share),
        verdicts: Number(row.verdict_count),
        effective_votes: num(row.effective_votes),
        dip_time: num(row.time_center),
        dip_time_err: num(row.time_sigma),
        dip_depth: num(row.depth_ppm),
        dip_duration: num(row.duration_hours),
      };
    }
    after = Number(rows[rows.length - 1]!.id);
  }
}
