import { describe, expect, it } from 'vitest';
import { markHistogram, queueNeighbours, readQueue } from '@/features/desk/lib/splits';

describe('queueNeighbours', () => {
  it('in the middle of the queue, J and K lead to either side and a ruling goes on to the next', () => {
    expect(queueNeighbours([1, 2, 3], 2)).toEqual({ position: 2, next: 3, previous: 1, afterRuling: 3 });
  });

  it('on the last split, nothing is next but a ruling goes on to the first one left', () => {
    expect(queueNeighbours([1, 2, 3], 3)).toEqual({ position: 3, next: null, previous: 2, afterRuling: 1 });
  });

  it('on the only split, a ruling has nowhere to go', () => {
    expect(queueNeighbours([7], 7)).toEqual({ position: 1, next: null, previous: null, afterRuling: null });
  });

  it('for a snippet not in the queue, leads to the queue’s first split', () => {
    expect(queueNeighbours([4, 5], 9)).toEqual({ position: null, next: 4, previous: null, afterRuling: 4 });
  });
});

describe('markHistogram', () => {
  it('counts marks into equal bins, the end of the range in the last bin, marks outside left out', () => {
    expect(markHistogram([0, 0.5, 5.9, 6, 12, 13, -1], 0, 12, 4)).toEqual([2, 1, 1, 1]);
  });
});

describe('readQueue', () => {
  it('reads campaign, order and page, and ignores what it cannot read', () => {
    expect(readQueue(new URLSearchParams('campaign=3&order=needed&page=2'))).toEqual({
      campaign: 3,
      order: 'needed',
      page: 2,
    });
    expect(readQueue(new URLSearchParams('campaign=x&order=sideways&page=-1'))).toEqual({
      campaign: null,
      order: 'oldest',
      page: 1,
    });
  });
});
