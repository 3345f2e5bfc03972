import { describe, expect, it } from 'vitest';
import { createRandom } from '../../../../server/science/random';
import {
  type AuditVerdict,
  maxInWindow,
  volunteerFlags,
  volunteerStats,
} from '../../../../server/science/volunteer-audit';

// Synthetic accounts: a careful volunteer, a careless one, and two automated ones. Each gives 200
// verdicts, a tenth of them on controls.
function account(
  kind: 'careful' | 'careless' | 'automated-fast' | 'automated-one',
  seed: string,
): AuditVerdict[] {
  const random = createRandom(seed);
  const verdicts: AuditVerdict[] = [];
  let at = Date.parse('2026-11-01T10:00:00Z');
  for (let i = 0; i < 200; i += 1) {
    const control = i % 10 === 0 ? (random.next() < 0.5 ? 'dip' : 'flat') : null;
    const truth = control ?? (random.next() < 0.1 ? 'dip' : 'flat');
    let answer: AuditVerdict['answer'];
    if (kind === 'careful') answer = random.next() < 0.9 ? truth : truth === 'dip' ? 'flat' : 'dip';
    else if (kind === 'careless') answer = random.next() < 0.5 ? 'dip' : 'flat';
    else if (kind === 'automated-one') answer = 'flat';
    else answer = random.next() < 0.5 ? 'dip' : 'flat';
    const elapsedMs = kind === 'automated-fast' ? 250 + random.next() * 200 : 2_500 + random.next() * 6_000;
    at += kind === 'automated-fast' ? 500 : elapsedMs + 400;
    verdicts.push({ answer, elapsedMs, atMs: at, controlTruth: control, outcome: truth });
  }
  return verdicts;
}

const codes = (verdicts: AuditVerdict[]) => volunteerFlags(volunteerStats(verdicts)).map((flag) => flag.code);

describe('volunteer audit flags', () => {
  it('stay quiet on a careful volunteer', () => {
    expect(codes(account('careful', 'careful-1'))).toEqual([]);
  });

  it('find a careless volunteer no better than chance on controls', () => {
    expect(codes(account('careless', 'careless-1'))).toEqual(['chance_accuracy']);
  });

  it('find an automated account by its pace and its bursts', () => {
    expect(codes(account('automated-fast', 'bot-1'))).toEqual(expect.arrayContaining(['too_fast', 'burst']));
  });

  it('find an account that gives one answer to everything', () => {
    expect(codes(account('automated-one', 'one-1'))).toContain('one_answer');
  });

  it('need enough evidence before flagging (the issue’s minimum counts)', () => {
    const fast = account('automated-fast', 'bot-2').slice(0, 49); // 49 < 50 verdicts
    expect(codes(fast)).not.toContain('too_fast');
    const oneAnswer = account('automated-one', 'one-2').slice(0, 99); // 99 < 100 verdicts
    expect(codes(oneAnswer)).not.toContain('one_answer');
    const careless = account('careless', 'careless-2').slice(0, 190); // 19 controls < 20
    expect(codes(careless)).not.toContain('chance_accuracy');
  });

  it('say why in words, with the numbers', () => {
    const [flag] = volunteerFlags(volunteerStats(account('automated-one', 'one-3')));
    expect(flag?.reason).toMatch(/^“flat” on 100 % of 200 verdicts$/);
  });
});

describe('volunteer statistics', () => {
  it('count controls, agreement, the median time and the most common answer (hand-counted)', () => {
    const base = { atMs: 0, elapsedMs: 1_000, controlTruth: null, outcome: null } as const;
    const stats = volunteerStats([
      { ...base, answer: 'dip', controlTruth: 'dip', elapsedMs: 1_000 },
      { ...base, answer: 'flat', controlTruth: 'dip', elapsedMs: 3_000 },
      { ...base, answer: 'flat', outcome: 'flat', elapsedMs: 2_000 },
      { ...base, answer: 'unsure', controlTruth: 'flat', elapsedMs: null },
    ]);
    expect(stats).toEqual({
      verdicts: 4,
      controls: { seen: 2, correct: 1, accuracy: 0.5 },
      agreement: { compared: 1, agreed: 1, share: 1 },
      medianMs: 2_000,
      topAnswer: { answer: 'flat', share: 0.5 },
      maxPerMinute: 4,
    });
  });

  it('find the busiest minute', () => {
    // 10 000 … 61 000 ms fall within one minute of each other: four verdicts.
    expect(maxInWindow([0, 10_000, 59_999, 60_000, 61_000, 200_000], 60_000)).toBe(4);
    expect(maxInWindow([], 60_000)).toBe(0);
  });
});
