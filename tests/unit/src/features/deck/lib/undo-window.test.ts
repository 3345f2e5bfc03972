import { describe, expect, it } from 'vitest';
import { canUndo, undoRemainingMs, undoWindowMs } from '@/features/deck/lib/undo-window';

const given = { clientId: 'abc-12345', snippetId: 4, givenAtMs: 1_000_000 };

describe('the undo window', () => {
  it('is 15 seconds, like the server’s', () => {
    expect(undoWindowMs).toBe(15_000);
  });

  it('allows undo until 15 s after the verdict, and not a millisecond later', () => {
    expect(canUndo(given, given.givenAtMs)).toBe(true);
    expect(canUndo(given, given.givenAtMs + 14_999)).toBe(true);
    expect(canUndo(given, given.givenAtMs + 15_000)).toBe(false);
    expect(canUndo(given, given.givenAtMs + 60_000)).toBe(false);
    expect(undoRemainingMs(given, given.givenAtMs + 10_000)).toBe(5_000);
  });

  it('allows nothing once the snippet has settled, or when there is no verdict', () => {
    expect(canUndo({ ...given, settled: true }, given.givenAtMs + 1)).toBe(false);
    expect(canUndo(null, 0)).toBe(false);
  });
});
