import type { Db } from '../../db/knex';
import { toIso } from '../../db/rows';

/** Sensitivity and specificity are shown once a person has seen this many controls of the kind. */
export const CONTROLS_BEFORE_ACCURACY = 5;

export interface MyRecord {
  verdicts: { total: number; dip: number; flat: number; unsure: number; last30Days: number };
  controls: {
    plantedSeen: number;
    plantedFound: number;
    quietSeen: number;
    quietCorrect: number;
    /** Share of planted dips they said dip to; null until enough were seen. */
    sensitivity: number | null;
    /** Share of quiet controls they said flat to; null until enough were seen. */
    specificity: number | null;
  };
  dipsHelped: number;
  candidatesCredited: number;
  recent: {
    snippetId: number;
    answer: string;
    at: string;
    campaignName: string;
    designation: string | null;
  }[];
}

/** A person's own record: their verdicts, how they did on controls, and the dips and candidates they helped find. */
export async function myRecord(db: Db, personId: number): Promise<MyRecord> {
  const live = () => db('verdicts').where('verdicts.person_id', personId).whereNull('verdicts.withdrawn_at');
  const byAnswer: { answer: string; n: number | string }[] = await live()
    .select('answer')
    .count({ n: '*' })
    .groupBy('answer');
  const count = (answer: string) => Number(byAnswer.find((row) => row.answer === answer)?.n ?? 0);
  const [recentCount] = await live()
    .where('verdicts.updated_at', '>=', new Date(Date.now() - 30 * 86_400_000).toISOString())
    .count<{ n: number }[]>({ n: '*' });
  const controls: { kind: string; answer: string; n: number | string }[] = await live()
    .join('snippets', 'snippets.id', 'verdicts.snippet_id')
    .whereIn('snippets.kind', ['planted', 'quiet'])
    .whereNot('verdicts.answer', 'unsure')
    .select('snippets.kind', 'verdicts.answer')
    .count({ n: '*' })
    .groupBy('snippets.kind', 'verdicts.answer');
  const control = (kind: string, answer?: string) =>
    controls
      .filter((row) => row.kind === kind && (!answer || row.answer === answer))
      .reduce((sum, row) => sum + Number(row.n), 0);
  const plantedSeen = control('planted');
  const plantedFound = control('planted', 'dip');
  const quietSeen = control('quiet');
  const quietCorrect = control('quiet', 'flat');
  // Credited as the consensus job credits them: the dip voters of each dip (dip_finders).
  const [dips] = await db('dip_finders')
    .where({ person_id: personId })
    .countDistinct<{ n: number }[]>({ n: 'dip_id' });
  const [candidates] = await db('dip_finders')
    .where('dip_finders.person_id', personId)
    .join('candidate_dips', 'candidate_dips.dip_id', 'dip_finders.dip_id')
    .countDistinct<{ n: number }[]>({ n: 'candidate_dips.candidate_id' });
  const recent: Record<string, unknown>[] = await live()
    .join('snippets', 'snippets.id', 'verdicts.snippet_id')
    .join('campaigns', 'campaigns.id', 'snippets.campaign_id')
    .join('targets', 'targets.id', 'snippets.target_id')
    .select(
      'verdicts.snippet_id',
      'verdicts.answer',
      'verdicts.updated_at',
      'campaigns.name',
      'targets.designation',
    )
    .orderBy([
      { column: 'verdicts.updated_at', order: 'desc' },
      { column: 'verdicts.id', order: 'desc' },
    ])
    .limit(20);
  return {
    verdicts: {
      total: count('dip') + count('flat') + count('unsure'),
      dip: count('dip'),
      flat: count('flat'),
      unsure: count('unsure'),
      last30Days: Number(recentCount?.n ?? 0),
    },
    controls: {
      plantedSeen,
      plantedFound,
      quietSeen,
      quietCorrect,
      sensitivity: plantedSeen >= CONTROLS_BEFORE_ACCURACY ? plantedFound / plantedSeen : null,
      specificity: quietSeen >= CONTROLS_BEFORE_ACCURACY ? quietCorrect / quietSeen : null,
    },
    dipsHelped: Number(dips?.n ?? 0),
    candidatesCredited: Number(candidates?.n ?? 0),
    recent: recent.map((row) => ({
      snippetId: Number(row.snippet_id),
      answer: String(row.answer),
      at: toIso(row.updated_at),
      campaignName: String(row.name),
      designation: (row.designation as string | null) ?? null,
    })),
  };
}
