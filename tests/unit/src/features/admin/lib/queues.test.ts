import { describe, expect, it } from 'vitest';
import {
  countTone,
  type Queue,
  queueLabel,
  queueStates,
  queuesOverviewSchema,
  totalCounts,
} from '@/features/admin/lib/queues';

function queue(name: string, counts: Partial<Queue['counts']> = {}): Queue {
  return {
    name,
    label: name.toUpperCase(),
    counts: { waiting: 0, active: 0, completed: 0, failed: 0, delayed: 0, paused: 0, ...counts },
  };
}

describe('totalCounts', () => {
  it('adds each state over every queue', () => {
    const totals = totalCounts([queue('mail', { waiting: 2, failed: 1 }), queue('ingest', { waiting: 3 })]);
    expect(totals).toEqual({ waiting: 5, active: 0, completed: 0, failed: 1, delayed: 0, paused: 0 });
  });

  it('when there are no queues, gives zero for every state', () => {
    expect(Object.values(totalCounts([]))).toEqual(queueStates.map(() => 0));
  });
});

describe('countTone', () => {
  it('mutes a zero whatever its state, failed included', () => {
    expect(countTone('waiting', 0)).toBe('zero');
    expect(countTone('failed', 0)).toBe('zero');
  });

  it('asks for attention only for failed jobs', () => {
    expect(countTone('failed', 3)).toBe('attention');
    expect(countTone('waiting', 3)).toBe('plain');
    expect(countTone('completed', 120)).toBe('plain');
  });
});

describe('queueLabel', () => {
  it('gives the queue’s label, or its name when the overview does not know it', () => {
    const queues = [queue('mail')];
    expect(queueLabel(queues, 'mail')).toBe('MAIL');
    expect(queueLabel(queues, 'period-search')).toBe('period-search');
  });
});

describe('queuesOverviewSchema', () => {
  it('reads the answer of GET /api/admin/queues as the contract of issue 3 describes it', () => {
    const answer = { backend: 'embedded', queues: [queue('housekeeping', { completed: 4 })] };
    expect(queuesOverviewSchema.parse(answer)).toEqual(answer);
  });

  it('when the backend is not one it knows, refuses the answer', () => {
    expect(queuesOverviewSchema.safeParse({ backend: 'memory', queues: [] }).success).toBe(false);
  });
});
