import type { Answer } from './cards';

/**
 * Classifying a drag of the card: far enough, or fast enough, in one direction is a verdict; anything
 * else springs back and records nothing (WCAG 2.5.2: a gesture can be abandoned by coming back).
 */

/** A release past this share of the card's width counts, whatever the speed. */
export const distanceShare = 1 / 3;
/** A fling at least this fast (px per ms, ≈ 650 px/s) counts even when short… */
export const flingVelocityPxPerMs = 0.65;
/** …as long as it has moved at least this far the same way, so a flick of a tap does not. */
export const flingMinDistancePx = 32;
/** Movement before a press becomes a drag; less is a tap (which marks the chart). */
export const dragSlopPx = 10;
/** Only the last stretch of movement sets the release velocity. */
export const velocityWindowMs = 80;

export interface PointerSample {
  x: number;
  y: number;
  timeMs: number;
}

export interface DragState {
  dxPx: number;
  dyPx: number;
  /** Positive to the right and downwards, like the offsets. */
  vxPxPerMs: number;
  vyPxPerMs: number;
}

/** The verdict a drag points at, by its dominant axis; down points at nothing. */
export function directionOf(dxPx: number, dyPx: number): Answer | null {
  if (dxPx === 0 && dyPx === 0) return null;
  if (Math.abs(dxPx) >= Math.abs(dyPx)) return dxPx > 0 ? 'dip' : 'flat';
  return dyPx < 0 ? 'unsure' : null;
}

/** How far along to a verdict the drag is, 0…1, for the card's tint while dragging. */
export function dragProgress(state: Pick<DragState, 'dxPx' | 'dyPx'>, cardWidthPx: number): number {
  const distance = Math.max(Math.abs(state.dxPx), Math.abs(state.dyPx));
  return Math.min(1, distance / Math.max(1, cardWidthPx * distanceShare));
}

/** The verdict a released drag gives, or null to spring back. */
export function classifyRelease(state: DragState, cardWidthPx: number): Answer | null {
  const direction = directionOf(state.dxPx, state.dyPx);
  if (!direction) return null;
  const threshold = cardWidthPx * distanceShare;
  const along = direction === 'dip' ? state.dxPx : direction === 'flat' ? -state.dxPx : -state.dyPx;
  const speed =
    direction === 'dip' ? state.vxPxPerMs : direction === 'flat' ? -state.vxPxPerMs : -state.vyPxPerMs;
  if (along >= threshold) {
    // Past the threshold but moving firmly back towards the start: the person is changing their mind.
    return speed <= -flingVelocityPxPerMs ? null : direction;
  }
  if (along >= flingMinDistancePx && speed >= flingVelocityPxPerMs) return direction;
  return null;
}

/** Velocity over the last `velocityWindowMs` of samples (oldest first). */
export function releaseVelocity(samples: readonly PointerSample[]): { vxPxPerMs: number; vyPxPerMs: number } {
  const last = samples[samples.length - 1];
  if (!last) return { vxPxPerMs: 0, vyPxPerMs: 0 };
  let first = last;
  for (let index = samples.length - 1; index >= 0; index -= 1) {
    const sample = samples[index]!;
    if (last.timeMs - sample.timeMs > velocityWindowMs) break;
    first = sample;
  }
  const elapsed = last.timeMs - first.timeMs;
  if (elapsed <= 0) return { vxPxPerMs: 0, vyPxPerMs: 0 };
  return { vxPxPerMs: (last.x - first.x) / elapsed, vyPxPerMs: (last.y - first.y) / elapsed };
}

/** A drag in progress: feed it pointer positions, then ask what the release means. */
export function createDragTracker(start: PointerSample) {
  const samples: PointerSample[] = [start];
  let dragging = false;
  return {
    move(sample: PointerSample): DragState & { dragging: boolean } {
      samples.push(sample);
      // Keep only what the velocity window can use.
      while (samples.length > 2 && sample.timeMs - samples[0]!.timeMs > velocityWindowMs * 4) samples.shift();
      const dxPx = sample.x - start.x;
      const dyPx = sample.y - start.y;
      if (!dragging && Math.hypot(dxPx, dyPx) >= dragSlopPx) dragging = true;
      return { dxPx, dyPx, ...releaseVelocity(samples), dragging };
    },
    release(sample: PointerSample, cardWidthPx: number): Answer | null {
      const state = this.move(sample);
      return state.dragging ? classifyRelease(state, cardWidthPx) : null;
    },
    get dragging() {
      return dragging;
    },
  };
}
