// The numbers the Desk's volunteer audit shows, and the automatic flags that follow from them. Pure:
// a volunteer's verdicts in, statistics and flags out.
import { wilsonInterval } from './completeness';
import { median } from './statistics';

export type FlagCode = 'too_fast' | 'chance_accuracy' | 'one_answer' | 'burst';

export interface AuditVerdict {
  answer: 'dip' | 'flat' | 'unsure';
  /** How long the card was shown (ms), when the client said. */
  elapsedMs: number | null;
  /** When the verdict was stored (ms since the epoch). */
  atMs: number;
  /** The snippet's known truth (a control), else null. */
  controlTruth: 'dip' | 'flat' | null;
  /** The snippet's settled or ruled outcome, else null. */
  outcome: 'dip' | 'flat' | null;
}

export interface VolunteerStats {
  verdicts: number;
  controls: { seen: number; correct: number; accuracy: number | null };
  agreement: { compared: number; agreed: number; share: number | null };
  medianMs: number | null;
  topAnswer: { answer: 'dip' | 'flat' | 'unsure'; share: number } | null;
  /** The most verdicts in any 60 seconds. */
  maxPerMinute: number;
}

export interface Flag {
  code: FlagCode;
  reason: string;
}

/** The thresholds of the automatic flags (the Desk issue's, except the burst rate: see below). */
export const FLAG_RULES = {
  tooFast: { medianMsBelow: 700, minVerdicts: 50 },
  chanceAccuracy: { minControls: 20 },
  oneAnswer: { shareAtLeast: 0.98, minVerdicts: 100 },
  // Looking at a card and answering takes a person at least about two seconds, so more than 30 in a
  // minute is not a human pace: our own threshold, common practice for rate limits of this kind.
  burst: { perMinuteAbove: 30 },
} as const;

/** The most timestamps within any window of `windowMs` (two pointers over the sorted times). */
export function maxInWindow(timesMs: number[], windowMs: number): number {
  const sorted = [...timesMs].sort((a, b) => a - b);
  let best = 0;
  let start = 0;
  for (let end = 0; end < sorted.length; end += 1) {
    while (sorted[end]! - sorted[start]! >= windowMs) start += 1;
    best = Math.max(best, end - start + 1);
  }
  return best;
}

export function volunteerStats(verdicts: readonly AuditVerdict[]): VolunteerStats {
  let seen = 0;
  let correct = 0;
  let compared = 0;
  let agreed = 0;
  const counts = { dip: 0, flat: 0, unsure: 0 };
  for (const verdict of verdicts) {
    counts[verdict.answer] += 1;
    if (verdict.answer === 'unsure') continue;
    if (verdict.controlTruth) {
      seen += 1;
      if (verdict.answer === verdict.controlTruth) correct += 1;
    }
    if (verdict.outcome) {
      compared += 1;
      if (verdict.answer === verdict.outcome) agreed += 1;
    }
  }
  const total = verdicts.length;
  const elapsed = verdicts.flatMap((verdict) => (verdict.elapsedMs === null ? [] : [verdict.elapsedMs]));
  const top = (Object.entries(counts) as [AuditVerdict['answer'], number][]).sort((a, b) => b[1] - a[1])[0]!;
  return {
    verdicts: total,
    controls: { seen, correct, accuracy: seen > 0 ? correct / seen : null },
    agreement: { compared, agreed, share: compared > 0 ? agreed / compared : null },
    medianMs: elapsed.length > 0 ? median(elapsed) : null,
    topAnswer: total > 0 ? { answer: top[0], share: top[1] / total } : null,
    maxPerMinute: maxInWindow(
      verdicts.map((verdict) => verdict.atMs),
      60_000,
    ),
  };
}

const percent = (share: number) => `${Math.round(share * 100)} %`;

/**
 * The automatic flags, each with the reason in words. "No better than chance" means the accuracy on
 * controls cannot be told apart from a coin: the 95 % Wilson interval's lower bound is at or below one
 * half (Wilson 1927, JASA 22, 209).
 */
export function volunteerFlags(stats: VolunteerStats): Flag[] {
  const flags: Flag[] = [];
  const { tooFast, chanceAccuracy, oneAnswer, burst } = FLAG_RULES;
  if (
    stats.verdicts >= tooFast.minVerdicts &&
    stats.medianMs !== null &&
    stats.medianMs < tooFast.medianMsBelow
  ) {
    flags.push({
      code: 'too_fast',
      reason: `Median ${Math.round(stats.medianMs)} ms per verdict over ${stats.verdicts} verdicts (under ${tooFast.medianMsBelow} ms)`,
    });
  }
  if (stats.controls.seen >= chanceAccuracy.minControls) {
    const { low } = wilsonInterval(stats.controls.correct, stats.controls.seen);
    if (low <= 0.5) {
      flags.push({
        code: 'chance_accuracy',
        reason: `Right on ${stats.controls.correct} of ${stats.controls.seen} controls (${percent(stats.controls.correct / stats.controls.seen)}): no better than chance (95 % interval from ${percent(low)})`,
      });
    }
  }
  if (
    stats.verdicts >= oneAnswer.minVerdicts &&
    stats.topAnswer &&
    stats.topAnswer.share >= oneAnswer.shareAtLeast
  ) {
    flags.push({
      code: 'one_answer',
      reason: `“${stats.topAnswer.answer}” on ${percent(stats.topAnswer.share)} of ${stats.verdicts} verdicts`,
    });
  }
  if (stats.maxPerMinute > burst.perMinuteAbove) {
    flags.push({
      code: 'burst',
      reason: `${stats.maxPerMinute} verdicts within one minute (a person manages about ${burst.perMinuteAbove})`,
    });
  }
  return flags;
}
