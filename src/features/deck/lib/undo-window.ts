/** How long a verdict can be taken back; the server keeps the same window (UNDO_WINDOW_MS). */
export const undoWindowMs = 15_000;

export interface UndoableVerdict {
  clientId: string;
  snippetId: number;
  /** When the person gave it, by the device's clock. */
  givenAtMs: number;
  /** The server said the snippet has settled or the verdict cannot be taken back. */
  settled?: boolean;
}

export function undoRemainingMs(verdict: UndoableVerdict | null, nowMs: number): number {
  if (!verdict || verdict.settled) return 0;
  return Math.max(0, verdict.givenAtMs + undoWindowMs - nowMs);
}

/** Whether the last verdict can still be taken back: within 15 s and while its snippet is open. */
export function canUndo(verdict: UndoableVerdict | null, nowMs: number): boolean {
  return undoRemainingMs(verdict, nowMs) > 0;
}
