import {
  findCampaignConsensusSettings,
  listReliability,
  type ReliabilityRow,
} from '../../../server/db/consensus';
import type { Db } from '../../../server/db/knex';
import { dipTimeClusters } from '../../../server/science/consensus/dip-time';
import { scoreSnippet } from '../../../server/science/consensus/posterior';
import { decideSettlement, reliableDisagreement } from '../../../server/science/consensus/settle';
import type { Reliability } from '../../../server/science/consensus/types';
import {
  campaignDipRate,
  campaignPriors,
  currentReliability,
} from '../../../server/services/consensus/reliability-priors';
import { nextState } from '../../../server/services/consensus/rescore-snippets';
import type { AnsweredVerdict } from './volunteer';

/**
 * How far a stored score, dip share, effective vote count or dip time may be from the recompute: the
 * same formulas over the same verdicts in the same order give the same doubles, so only a last-bit
 * difference in how SQLite hands a double back is allowed for. Anything a missed or doubled verdict
 * causes is many orders larger (one verdict moves a snippet's log-odds by about 1).
 */
export const CONSENSUS_TOLERANCE = 1e-9;
/** A mark's weight floor in the dip time, as the rescore uses it (server/services/consensus/rescore-snippets.ts). */
const MARK_WEIGHT_FLOOR = 0.05;

type Raw = Record<string, unknown>;
const isAcknowledged = (verdict: AnsweredVerdict) => verdict.status === 200 || verdict.status === 201;
const close = (a: number | null, b: number | null) =>
  a === null || b === null ? a === b : Math.abs(a - b) <= CONSENSUS_TOLERANCE;
const numOrNull = (value: unknown) => (value === null || value === undefined ? null : Number(value));

async function inChunks<T>(items: T[], read: (chunk: T[]) => Promise<Raw[]>): Promise<Raw[]> {
  const rows: Raw[] = [];
  for (let i = 0; i < items.length; i += 500) rows.push(...(await read(items.slice(i, i + 500))));
  return rows;
}

export interface VerdictAudit {
  acknowledged: number;
  refused: number;
  /** Acknowledged verdicts that had to be sent more than once. */
  sentAgain: number;
  /** Of those, the ones the server answered 200: it had stored them before the answer was lost. */
  storedBeforeLostAnswer: number;
  /** The load's people's verdict rows. */
  stored: number;
  problems: string[];
}

/**
 * Every acknowledged verdict is stored exactly once, as it was sent; no refused one is stored; the load's
 * people have no verdict the load was not told about; each snippet's verdict count is its verdicts.
 */
export async function auditVerdicts(
  db: Db,
  answered: AnsweredVerdict[],
  personIds: number[],
): Promise<VerdictAudit> {
  const problems: string[] = [];
  const acknowledged = answered.filter(isAcknowledged);
  const refused = answered.filter((verdict) => !isAcknowledged(verdict));
  const byClientId = new Map(acknowledged.map((verdict) => [verdict.clientId, verdict]));
  if (new Set(answered.map((verdict) => verdict.clientId)).size !== answered.length) {
    problems.push('the load answered one clientId twice (a harness bug)');
  }

  const receipts = await inChunks(
    answered.map((verdict) => verdict.clientId),
    (chunk) =>
      db('verdict_receipts')
        .join('verdicts', 'verdicts.id', 'verdict_receipts.verdict_id')
        .whereIn('verdict_receipts.client_id', chunk)
        .select(
          'verdict_receipts.client_id as receipt',
          'verdicts.person_id',
          'verdicts.snippet_id',
          'verdicts.answer',
          'verdicts.mark_time',
          'verdicts.withdrawn_at',
        ),
  );
  const receiptOf = new Map(receipts.map((row) => [String(row.receipt), row]));
  for (const verdict of acknowledged) {
    const row = receiptOf.get(verdict.clientId);
    if (!row) {
      problems.push(`acknowledged verdict ${verdict.clientId} (HTTP ${verdict.status}) is not stored`);
      continue;
    }
    const stored = {
      personId: Number(row.person_id),
      snippetId: Number(row.snippet_id),
      answer: row.answer,
      markTime: numOrNull(row.mark_time),
    };
    if (
      stored.personId !== verdict.personId ||
      stored.snippetId !== verdict.snippetId ||
      stored.answer !== verdict.answer ||
      !close(stored.markTime, verdict.markTime) ||
      row.withdrawn_at !== null
    ) {
      problems.push(
        `verdict ${verdict.clientId} is stored as ${JSON.stringify(stored)}, sent as ${JSON.stringify(verdict)}`,
      );
    }
  }
  for (const verdict of refused) {
    if (receiptOf.has(verdict.clientId)) {
      problems.push(`refused verdict ${verdict.clientId} (HTTP ${verdict.status}) is stored all the same`);
    }
  }

  const rows = await inChunks(personIds, (chunk) =>
    db('verdicts').whereIn('person_id', chunk).select('id', 'client_id', 'person_id', 'snippet_id'),
  );
  for (const row of rows) {
    if (!byClientId.has(String(row.client_id))) {
      problems.push(
        `verdict ${row.client_id} (person ${row.person_id}, snippet ${row.snippet_id}) was never acknowledged`,
      );
    }
  }
  if (rows.length !== acknowledged.length) {
    problems.push(
      `the load's people have ${rows.length} verdicts stored, ${acknowledged.length} acknowledged`,
    );
  }
  const pairs = new Set(rows.map((row) => `${row.person_id}:${row.snippet_id}`));
  if (pairs.size !== rows.length) problems.push('a person has two verdicts on one snippet');
  // A verdict applied twice under two receipts would still be one row; count the receipts too.
  const receiptRows = await inChunks(personIds, (chunk) =>
    db('verdict_receipts')
      .join('verdicts', 'verdicts.id', 'verdict_receipts.verdict_id')
      .whereIn('verdicts.person_id', chunk)
      .select('verdict_receipts.client_id'),
  );
  if (receiptRows.length !== acknowledged.length) {
    problems.push(
      `the load's verdicts have ${receiptRows.length} receipts, ${acknowledged.length} acknowledged`,
    );
  }

  const counts = await db('snippets')
    .leftJoin(
      db('verdicts')
        .join('people', 'people.id', 'verdicts.person_id')
        .whereNull('verdicts.withdrawn_at')
        .whereNull('people.suspended_at')
        .whereNull('people.deleted_at')
        .groupBy('verdicts.snippet_id')
        .select('verdicts.snippet_id')
        .count({ n: '*' })
        .as('counted'),
      'counted.snippet_id',
      'snippets.id',
    )
    .whereRaw('snippets.verdict_count <> coalesce(counted.n, 0)')
    .select('snippets.id', 'snippets.verdict_count', 'counted.n');
  for (const row of counts) {
    problems.push(`snippet ${row.id} counts ${row.verdict_count} verdicts, has ${row.n ?? 0}`);
  }

  const sentAgain = acknowledged.filter((verdict) => verdict.attempts > 1);
  return {
    acknowledged: acknowledged.length,
    refused: refused.length,
    sentAgain: sentAgain.length,
    storedBeforeLostAnswer: sentAgain.filter((verdict) => verdict.status === 200).length,
    stored: rows.length,
    problems,
  };
}

export interface ConsensusComparison {
  snippets: number;
  judged: number;
  settled: number;
  split: number;
  dips: number;
  problems: string[];
}

interface CountingVerdict {
  snippetId: number;
  personId: number;
  answer: 'dip' | 'flat' | 'unsure';
  markTime: number | null;
}

/**
 * Recomputes the campaign's consensus from scratch — every volunteer's reliability from their control
 * verdicts (plus what a full re-estimate, if one ran, stored), then every snippet's score, state and dips
 * from its counting verdicts — and compares it with what the consensus jobs stored. A snippet is judged
 * from open, as if it had just received all its verdicts; only a snippet that a rescore sent to the Desk
 * because its outcome would flip keeps its stored state as the starting point.
 */
export async function compareWithRecompute(db: Db, campaignId: number): Promise<ConsensusComparison> {
  const problems: string[] = [];
  const settings = await findCampaignConsensusSettings(db, campaignId);
  if (!settings) throw new Error(`no campaign ${campaignId}`);
  const priors = campaignPriors(settings);
  const dipRate = campaignDipRate(settings);
  const rules = {
    upper: settings.upper,
    lower: settings.lower,
    minVerdicts: settings.minVerdicts,
    maxVerdicts: settings.maxVerdicts,
  };

  const snippets: Raw[] = await db('snippets')
    .where({ campaign_id: campaignId })
    .orderBy('id')
    .select(
      'id',
      'kind',
      'state',
      'outcome',
      'split_reason',
      'needs_rescore',
      'consensus_score',
      'dip_share',
      'effective_votes',
    );
  const verdictRows: Raw[] = await db('verdicts')
    .join('snippets', 'snippets.id', 'verdicts.snippet_id')
    .join('people', 'people.id', 'verdicts.person_id')
    .where('snippets.campaign_id', campaignId)
    .whereNull('verdicts.withdrawn_at')
    .whereNull('people.suspended_at')
    .whereNull('people.deleted_at')
    .orderBy(['verdicts.snippet_id', 'verdicts.id'])
    .select('verdicts.snippet_id', 'verdicts.person_id', 'verdicts.answer', 'verdicts.mark_time');
  const bySnippet = new Map<number, CountingVerdict[]>();
  for (const row of verdictRows) {
    const verdict: CountingVerdict = {
      snippetId: Number(row.snippet_id),
      personId: Number(row.person_id),
      answer: row.answer as CountingVerdict['answer'],
      markTime: numOrNull(row.mark_time),
    };
    const list = bySnippet.get(verdict.snippetId) ?? [];
    list.push(verdict);
    bySnippet.set(verdict.snippetId, list);
  }

  // Reliability: exact control counts recounted here; expected counts on other snippets only as a full
  // re-estimate stored them (between re-estimates they do not change).
  const kindOf = new Map(snippets.map((row) => [Number(row.id), String(row.kind)]));
  const stored = new Map((await listReliability(db, campaignId)).map((row) => [row.personId, row]));
  const controls = new Map<
    number,
    Pick<ReliabilityRow, 'plantedSeen' | 'plantedFound' | 'quietSeen' | 'quietCorrect'>
  >();
  for (const verdict of bySnippet.values()) {
    for (const { snippetId, personId, answer } of verdict) {
      const kind = kindOf.get(snippetId);
      if ((kind !== 'planted' && kind !== 'quiet') || answer === 'unsure') continue;
      const counts = controls.get(personId) ?? {
        plantedSeen: 0,
        plantedFound: 0,
        quietSeen: 0,
        quietCorrect: 0,
      };
      if (kind === 'planted') {
        counts.plantedSeen += 1;
        if (answer === 'dip') counts.plantedFound += 1;
      } else {
        counts.quietSeen += 1;
        if (answer === 'flat') counts.quietCorrect += 1;
      }
      controls.set(personId, counts);
    }
  }
  const reliabilityCache = new Map<number, Reliability>();
  const reliabilityOf = (personId: number): Reliability => {
    let reliability = reliabilityCache.get(personId);
    if (!reliability) {
      const before = stored.get(personId);
      const control = controls.get(personId) ?? {
        plantedSeen: 0,
        plantedFound: 0,
        quietSeen: 0,
        quietCorrect: 0,
      };
      reliability = currentReliability(
        before || controls.has(personId)
          ? {
              personId,
              campaignId,
              sensitivity: 0,
              specificity: 0,
              weightDip: 0,
              weightFlat: 0,
              dipSeen: before?.dipSeen ?? 0,
              dipSaid: before?.dipSaid ?? 0,
              flatSeen: before?.flatSeen ?? 0,
              flatSaid: before?.flatSaid ?? 0,
              verdictCount: 0,
              ...control,
            }
          : undefined,
        priors,
      );
      reliabilityCache.set(personId, reliability);
    }
    return reliability;
  };

  const dipRows: Raw[] = await db('dips')
    .where({ campaign_id: campaignId })
    .orderBy(['snippet_id', 'cluster_index'])
    .select('id', 'snippet_id', 'cluster_index', 'time_center', 'mark_count');
  const finderRows: Raw[] = await db('dip_finders')
    .join('dips', 'dips.id', 'dip_finders.dip_id')
    .where('dips.campaign_id', campaignId)
    .select('dips.snippet_id', 'dip_finders.person_id');
  const dipsOf = new Map<number, Raw[]>();
  for (const row of dipRows)
    dipsOf.set(Number(row.snippet_id), [...(dipsOf.get(Number(row.snippet_id)) ?? []), row]);
  const findersOf = new Map<number, Set<number>>();
  for (const row of finderRows) {
    const set = findersOf.get(Number(row.snippet_id)) ?? new Set<number>();
    set.add(Number(row.person_id));
    findersOf.set(Number(row.snippet_id), set);
  }

  const summary = { snippets: snippets.length, judged: 0, settled: 0, split: 0, dips: dipRows.length };
  for (const row of snippets) {
    const id = Number(row.id);
    if (row.needs_rescore === true || row.needs_rescore === 1)
      problems.push(`snippet ${id} still waits for its rescore`);
    const verdicts = bySnippet.get(id) ?? [];
    const storedState = {
      state: row.state as 'open' | 'settled' | 'split' | 'ruled',
      outcome: (row.outcome as 'dip' | 'flat' | null) ?? null,
      splitReason: (row.split_reason as string | null) ?? null,
    };
    if (storedState.state === 'settled') summary.settled += 1;
    if (storedState.state === 'split') summary.split += 1;
    if (verdicts.length === 0) {
      if (storedState.state !== 'open')
        problems.push(`snippet ${id} is ${storedState.state} without verdicts`);
      continue;
    }
    summary.judged += 1;
    const weighted = verdicts.map((verdict) => ({
      ...verdict,
      reliability: reliabilityOf(verdict.personId),
    }));
    const score = scoreSnippet(dipRate, weighted);
    const decision = decideSettlement({
      score: score.score,
      verdictCount: score.verdictCount,
      rules,
      reliableDisagreement: reliableDisagreement(weighted),
    });
    const from =
      storedState.state === 'ruled' || storedState.splitReason === 'outcome_changed'
        ? storedState
        : { state: 'open' as const, outcome: null, splitReason: null };
    const expected = nextState(from, score, decision);
    const storedNumbers = {
      score: numOrNull(row.consensus_score),
      dipShare: numOrNull(row.dip_share),
      effectiveVotes: numOrNull(row.effective_votes),
    };
    if (
      expected.state !== storedState.state ||
      expected.outcome !== storedState.outcome ||
      expected.splitReason !== storedState.splitReason ||
      !close(storedNumbers.score, expected.score) ||
      !close(storedNumbers.dipShare, expected.dipShare) ||
      !close(storedNumbers.effectiveVotes, expected.effectiveVotes)
    ) {
      problems.push(
        `snippet ${id} (${verdicts.length} verdicts) is stored as ${JSON.stringify({ ...storedState, ...storedNumbers })}, recomputed as ${JSON.stringify({ state: expected.state, outcome: expected.outcome, splitReason: expected.splitReason, score: expected.score, dipShare: expected.dipShare, effectiveVotes: expected.effectiveVotes })}`,
      );
    }

    const dips = dipsOf.get(id) ?? [];
    const positive =
      (expected.state === 'settled' || expected.state === 'ruled') && expected.outcome === 'dip';
    if (!positive || row.kind !== 'real') {
      if (dips.length > 0) problems.push(`snippet ${id} has ${dips.length} dips but is no settled dip`);
      continue;
    }
    const dipVoters = weighted.filter((verdict) => verdict.answer === 'dip');
    const clusters = dipTimeClusters(
      dipVoters
        .filter((verdict) => verdict.markTime !== null && Number.isFinite(verdict.markTime))
        .map((verdict) => ({
          timeDays: verdict.markTime!,
          weight: Math.max(MARK_WEIGHT_FLOOR, verdict.reliability.weightDip),
        })),
      { separationDays: settings.longestTransitHours / 24 },
    );
    const expectedDips = clusters.length > 0 ? clusters : [null];
    const finders = [...(findersOf.get(id) ?? [])].sort((a, b) => a - b);
    const voters = [...new Set(dipVoters.map((verdict) => verdict.personId))].sort((a, b) => a - b);
    const dipsMatch =
      dips.length === expectedDips.length &&
      expectedDips.every((cluster, index) =>
        cluster === null
          ? Number(dips[index]!.mark_count) === 0
          : Number(dips[index]!.mark_count) === cluster.count &&
            close(Number(dips[index]!.time_center), cluster.center),
      );
    if (!dipsMatch || finders.join(',') !== voters.join(',')) {
      problems.push(
        `snippet ${id}'s dips are ${JSON.stringify({ dips, finders })}, recomputed as ${JSON.stringify({ clusters, finders: voters })}`,
      );
    }
  }
  return { ...summary, problems };
}
