import { describe, expect, it } from 'vitest';
import type { Card } from '@/features/deck/lib/cards';
import {
  appendCards,
  cardsAhead,
  cardsToRequest,
  excludeList,
  excludeMaxChars,
} from '@/features/deck/lib/deck-queue';

const card = (snippetId: number): Card => ({
  snippetId,
  campaign: { id: 1, name: 'Invented field' },
  timeStart: 100,
  durationHours: 12,
  cadenceMinutes: 30,
  pointCount: 24,
  hours: [0, 0.5],
  ppm: [0, 10],
});

describe('the card queue', () => {
  it('keeps at least three (here six) cards ahead of the one shown, asking at most ten at a time', () => {
    expect(cardsAhead).toBeGreaterThanOrEqual(3);
    expect(cardsToRequest(0)).toBe(8);
    expect(cardsToRequest(1 + cardsAhead)).toBe(0);
    expect(cardsToRequest(cardsAhead)).toBe(3);
  });

  it('excludes verdicts still on the device, then the held cards with the last shown last', () => {
    expect(excludeList([9, 4], [4, 5, 6])).toEqual([9, 4, 5, 6]);
    const long = Array.from({ length: 200 }, (_, i) => 100000 + i);
    const list = excludeList(long, [7, 8]);
    expect(list.join(',').length).toBeLessThanOrEqual(excludeMaxChars);
    expect(list.slice(-2)).toEqual([7, 8]);
  });

  it('appends new cards, skipping ones already held or just judged', () => {
    expect(appendCards([card(1)], [card(1), card(2), card(3)], new Set([3])).map((c) => c.snippetId)).toEqual(
      [1, 2],
    );
  });
});
