import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { createGroupCommit, type GroupCommit } from '../../db/group-commit';
import type { Db } from '../../db/knex';
import { touchLastActive } from '../../db/people';
import { fromJson, nowIso, toIso } from '../../db/rows';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';
import type { Judge } from './next-cards';

export type Answer = 'dip' | 'flat' | 'unsure';

export interface VerdictInput {
  clientId: string;
  snippetId: number;
  answer: Answer;
  /** The marked dip centre, in the light curve's time (days); within the snippet. */
  markTime?: number | null | undefined;
  /** How long the card was shown before the verdict. */
  elapsedMs?: number | undefined;
}

export interface VerdictView {
  clientId: string;
  snippetId: number;
  answer: Answer;
  markTime: number | null;
  createdAt: string;
}

/** Shown after the verdict: the target's name, and for some controls what they were. */
export interface Reveal {
  designation: string;
  feedback: null | { kind: 'quiet' } | { kind: 'planted'; t0Days: number; durationHours: number };
}

/** A visitor may judge this many cards before signing up (their verdicts then count). */
export const GUEST_VERDICT_LIMIT = 20;
/** How long a verdict can be taken back. */
export const UNDO_WINDOW_MS = 15_000;

// The same judge and snippet always get the same answer to "show feedback?", so a retried request agrees.
function feedbackShown(snippetId: number, judge: Judge, rate: number): boolean {
  const digest = createHash('sha256')
    .update(`${snippetId}:${judge.personId ?? judge.guestKey}`)
    .digest();
  return digest.readUInt32BE(0) / 2 ** 32 < rate;
}

async function reveal(
  trx: Knex.Transaction | Db,
  snippet: Record<string, unknown>,
  judge: Judge,
  feedbackRate: number,
): Promise<Reveal> {
  const target =
    snippet.designation !== undefined
      ? { designation: snippet.designation }
      : await trx('targets').where({ id: snippet.target_id }).first('designation');
  let feedback: Reveal['feedback'] = null;
  if (
    (snippet.kind === 'planted' || snippet.kind === 'quiet') &&
    feedbackShown(Number(snippet.id), judge, feedbackRate)
  ) {
    if (snippet.kind === 'quiet') feedback = { kind: 'quiet' };
    else {
      const truth = fromJson<{ t0Days: number; durationHours: number }>(snippet.planted_truth, {
        t0Days: 0,
        durationHours: 0,
      });
      feedback = { kind: 'planted', t0Days: truth.t0Days, durationHours: truth.durationHours };
    }
  }
  return { designation: String(target?.designation ?? ''), feedback };
}

function toView(row: Record<string, unknown>, clientId: string): VerdictView {
  return {
    clientId,
    snippetId: Number(row.snippet_id),
    answer: row.answer as Answer,
    markTime: row.mark_time === null || row.mark_time === undefined ? null : Number(row.mark_time),
    createdAt: toIso(row.created_at),
  };
}

const judgeWhere = (judge: Judge) =>
  judge.personId ? { person_id: judge.personId } : { guest_key: judge.guestKey };

/**
 * Records a verdict. Idempotent by the client's id: the same id is answered with the verdict it made,
 * never applied twice. One verdict per judge and snippet: a later one with a new id changes it while the
 * snippet is open. Only signed-in people's verdicts count (a guest's count once they sign up).
 */
type RecordedVerdict = {
  created: boolean;
  verdict: VerdictView;
  reveal: Reveal;
  /** The snippet's campaign, for the rescore request (not part of the answer). */
  campaignId: number;
};

// Verdicts arriving together share a transaction, which recordVerdictIn allows: it checks before it writes.
const verdictCommits = new WeakMap<Db, GroupCommit<{ judge: Judge; input: VerdictInput }, RecordedVerdict>>();

export async function recordVerdict(db: Db, judge: Judge, input: VerdictInput): Promise<RecordedVerdict> {
  let commits = verdictCommits.get(db);
  if (!commits) {
    commits = createGroupCommit(db, (trx, { judge, input }) => recordVerdictIn(trx, judge, input));
    verdictCommits.set(db, commits);
  }
  return commits.submit({ judge, input });
}

// What judging a snippet needs to know of it; not its display series, which is most of its row.
const SNIPPET_FOR_VERDICT = [
  'snippets.id',
  'snippets.campaign_id',
  'snippets.kind',
  'snippets.state',
  'snippets.time_start',
  'snippets.time_end',
  'snippets.planted_truth',
  'campaigns.status as campaign_status',
  'campaigns.feedback_rate',
  'targets.designation',
];

const snippetForVerdict = (trx: Knex.Transaction, snippetId: number) =>
  trx('snippets')
    .join('campaigns', 'campaigns.id', 'snippets.campaign_id')
    .join('targets', 'targets.id', 'snippets.target_id')
    .where('snippets.id', snippetId)
    .first(SNIPPET_FOR_VERDICT);

async function recordVerdictIn(
  trx: Knex.Transaction,
  judge: Judge,
  input: VerdictInput,
): Promise<RecordedVerdict> {
  const receipt = await trx('verdict_receipts').where({ client_id: input.clientId }).first('verdict_id');
  if (receipt) {
    const existing = await trx('verdicts').where({ id: receipt.verdict_id }).first();
    const mine =
      existing &&
      (judge.personId ? existing.person_id === judge.personId : existing.guest_key === judge.guestKey);
    if (!mine)
      throw new AppError('client_id_taken', 'This verdict id belongs to another verdict', 'conflict', {
        clientId: 'Already used',
      });
    const snippet = await snippetForVerdict(trx, Number(existing.snippet_id));
    return {
      created: false,
      campaignId: Number(snippet.campaign_id),
      verdict: toView(existing, input.clientId),
      reveal: await reveal(trx, snippet, judge, Number(snippet.feedback_rate)),
    };
  }

  const snippet = await snippetForVerdict(trx, input.snippetId);
  if (!snippet)
    throw new AppError('validation_failed', 'No such snippet', 'invalid', { snippetId: 'Unknown snippet' });
  if (snippet.campaign_status !== 'live') {
    throw new AppError('campaign_not_live', 'This campaign is not taking verdicts now', 'conflict');
  }
  if (snippet.state !== 'open')
    throw new AppError('snippet_not_open', 'This snippet is already settled', 'conflict');
  if (input.markTime !== undefined && input.markTime !== null) {
    const start = Number(snippet.time_start);
    const end = Number(snippet.time_end);
    if (!(input.markTime >= start && input.markTime <= end)) {
      throw new AppError('validation_failed', 'The mark is outside the snippet', 'invalid', {
        markTime: `Must be within the snippet, ${start} to ${end}`,
      });
    }
  }
  if (judge.guestKey) {
    const [count] = await trx('verdicts')
      .where({ guest_key: judge.guestKey })
      .count<{ n: number }[]>({ n: '*' });
    if (Number(count?.n ?? 0) >= GUEST_VERDICT_LIMIT) {
      throw new AppError(
        'guest_limit',
        `Visitors can judge ${GUEST_VERDICT_LIMIT} cards: sign up to keep going (your verdicts come with you)`,
        'forbidden',
      );
    }
  }
  const now = nowIso();
  const fields = {
    answer: input.answer,
    mark_time: input.answer === 'dip' ? (input.markTime ?? null) : null,
    elapsed_ms: input.elapsedMs ?? null,
    withdrawn_at: null,
    updated_at: now,
  };
  const existing = await trx('verdicts')
    .where({ snippet_id: input.snippetId, ...judgeWhere(judge) })
    .first();
  let row: Record<string, unknown>;
  let counted = 0; // how much the snippet's count of counting verdicts grows
  if (existing) {
    [row] = await trx('verdicts')
      .where({ id: existing.id })
      .update({ ...fields, client_id: input.clientId })
      .returning('*');
    if (existing.withdrawn_at && judge.personId) counted = 1;
  } else {
    [row] = await trx('verdicts')
      .insert({
        ...fields,
        client_id: input.clientId,
        snippet_id: input.snippetId,
        person_id: judge.personId ?? null,
        guest_key: judge.guestKey ?? null,
        created_at: now,
      })
      .returning('*');
    if (judge.personId) counted = 1;
  }
  await trx('verdict_receipts').insert({ client_id: input.clientId, verdict_id: row!.id, created_at: now });
  // The consensus job rescores snippets marked so (the consensus issue); a guest's verdict does not count.
  if (judge.personId) {
    await trx('snippets')
      .where({ id: input.snippetId })
      .update({ needs_rescore: true, verdict_count: trx.raw('verdict_count + ?', [counted]) });
    // "Last active" is for the audit's eyes: minutes are precise enough, and it saves a write per verdict.
    if (!judge.lastActiveAt || Date.parse(now) - Date.parse(judge.lastActiveAt) > 5 * 60_000) {
      await touchLastActive(trx, judge.personId, now);
    }
  }
  return {
    created: true,
    campaignId: Number(snippet.campaign_id),
    verdict: toView(row!, input.clientId),
    reveal: await reveal(trx, snippet, judge, Number(snippet.feedback_rate)),
  };
}

/** Takes back a verdict within 15 seconds, while its snippet is still open; answers the snippet's campaign. */
export async function undoVerdict(db: Db, judge: Judge, clientId: string): Promise<{ campaignId: number }> {
  return writeTransaction(db, async (trx) => {
    const receipt = await trx('verdict_receipts').where({ client_id: clientId }).first('verdict_id');
    const verdict = receipt
      ? await trx('verdicts')
          .where({ id: receipt.verdict_id, ...judgeWhere(judge) })
          .first()
      : undefined;
    if (!verdict || verdict.client_id !== clientId) throw notFound('Verdict');
    const snippet = await trx('snippets').where({ id: verdict.snippet_id }).first('state', 'campaign_id');
    const campaignId = Number(snippet?.campaign_id);
    if (verdict.withdrawn_at) return { campaignId };
    if (Date.now() - Date.parse(toIso(verdict.updated_at)) > UNDO_WINDOW_MS) {
      throw new AppError('undo_too_late', 'A verdict can only be taken back within 15 seconds', 'conflict');
    }
    if (snippet?.state !== 'open')
      throw new AppError('snippet_not_open', 'This snippet has settled meanwhile', 'conflict');
    await trx('verdicts').where({ id: verdict.id }).update({ withdrawn_at: nowIso(), updated_at: nowIso() });
    if (judge.personId) {
      await trx('snippets').where({ id: verdict.snippet_id }).decrement('verdict_count', 1);
      await trx('snippets').where({ id: verdict.snippet_id }).update({ needs_rescore: true });
    }
    return { campaignId };
  });
}

/**
 * A visitor who signs up or in keeps their guest verdicts: they become the person's, and count from now
 * (except on snippets the person had already judged, or that settled meanwhile).
 */
export async function claimGuestVerdicts(db: Db, guestKey: string, personId: number): Promise<number> {
  return writeTransaction(db, async (trx) => {
    const guestVerdicts = await trx('verdicts').where({ guest_key: guestKey }).whereNull('withdrawn_at');
    let claimed = 0;
    for (const verdict of guestVerdicts) {
      const clash = await trx('verdicts')
        .where({ snippet_id: verdict.snippet_id, person_id: personId })
        .first('id');
      const snippet = await trx('snippets').where({ id: verdict.snippet_id }).first('state');
      if (clash || snippet?.state !== 'open') {
        await trx('verdicts').where({ id: verdict.id }).delete();
        continue;
      }
      await trx('verdicts')
        .where({ id: verdict.id })
        .update({ person_id: personId, guest_key: null, updated_at: nowIso() });
      await trx('snippets').where({ id: verdict.snippet_id }).increment('verdict_count', 1);
      await trx('snippets').where({ id: verdict.snippet_id }).update({ needs_rescore: true });
      claimed += 1;
    }
    return claimed;
  });
}
