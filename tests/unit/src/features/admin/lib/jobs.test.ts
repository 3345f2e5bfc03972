import { describe, expect, it } from 'vitest';
import {
  attemptsText,
  distinctTraces,
  errorHeadline,
  jobSchema,
  jobTime,
  timeAgo,
} from '@/features/admin/lib/jobs';

const now = Date.parse('2026-12-01T12:00:00.000Z');

function secondsBefore(seconds: number): string {
  return new Date(now - seconds * 1000).toISOString();
}

describe('timeAgo', () => {
  it('says "just now" under 45 s, and for a time slightly ahead of the browser’s clock', () => {
    expect(timeAgo(secondsBefore(10), now)).toBe('just now');
    expect(timeAgo(secondsBefore(-5), now)).toBe('just now');
  });

  it('counts minutes up to an hour and a half, then hours, then days', () => {
    expect(timeAgo(secondsBefore(50), now)).toBe('1 min ago');
    expect(timeAgo(secondsBefore(7 * 60), now)).toBe('7 min ago');
    expect(timeAgo(secondsBefore(80 * 60), now)).toBe('80 min ago');
    expect(timeAgo(secondsBefore(3 * 3600), now)).toBe('3 h ago');
    expect(timeAgo(secondsBefore(3 * 86_400), now)).toBe('3 days ago');
  });

  it('when there is no time or it cannot be read, gives null', () => {
    expect(timeAgo(null, now)).toBeNull();
    expect(timeAgo('yesterday', now)).toBeNull();
  });
});

describe('jobTime', () => {
  it('prefers when the job finished, and falls back to when it was created', () => {
    expect(jobTime({ createdAt: 'a', finishedAt: 'b' })).toBe('b');
    expect(jobTime({ createdAt: 'a', finishedAt: null })).toBe('a');
    expect(jobTime({ createdAt: null, finishedAt: null })).toBeNull();
  });
});

describe('attemptsText', () => {
  it('shows attempts made of attempts allowed', () => {
    expect(attemptsText({ attemptsMade: 3, attempts: 3 })).toBe('3 of 3');
  });

  it('when no limit was set or more were made than allowed, shows only the attempts made', () => {
    expect(attemptsText({ attemptsMade: 1, attempts: 0 })).toBe('1');
    expect(attemptsText({ attemptsMade: 4, attempts: 3 })).toBe('4');
  });
});

describe('errorHeadline', () => {
  it('gives the first line that has text', () => {
    expect(errorHeadline('\n  SMTP said 421\nTry later')).toBe('SMTP said 421');
  });

  it('when there is no message, says so', () => {
    expect(errorHeadline(null)).toBe('The job failed without an error message.');
    expect(errorHeadline('  \n ')).toBe('The job failed without an error message.');
  });
});

describe('distinctTraces', () => {
  it('puts the latest attempt first and keeps each trace once', () => {
    expect(distinctTraces(['first', 'second', 'second'])).toEqual(['second', 'first']);
    expect(distinctTraces(['same', 'same ', 'same'])).toEqual(['same']);
  });

  it('leaves out empty traces', () => {
    expect(distinctTraces(['', '  '])).toEqual([]);
  });
});

describe('jobSchema', () => {
  it('reads a failed job as the contract of issue 3 describes it', () => {
    const job = {
      id: 'mail:12',
      queue: 'mail',
      name: 'send-newsletter',
      state: 'failed',
      progress: { percent: 40, stage: 'sending' },
      attemptsMade: 3,
      attempts: 3,
      error: 'SMTP said 421',
      stacktrace: ['Error: SMTP said 421\n    at send (mail.ts:1:1)'],
      createdAt: '2026-12-01T11:00:00.000Z',
      finishedAt: null,
    };
    expect(jobSchema.parse(job)).toEqual(job);
  });
});
