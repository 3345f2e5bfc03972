import { describe, expect, it } from 'vitest';
import {
  classifyRelease,
  createDragTracker,
  directionOf,
  distanceShare,
  dragSlopPx,
  flingVelocityPxPerMs,
} from '@/features/deck/lib/gesture';

const width = 360;
const threshold = width * distanceShare;

/** A drag from the origin through the given points, one every 16 ms (a 60 Hz pointer). */
function drag(points: [number, number][], stepMs = 16) {
  const tracker = createDragTracker({ x: 0, y: 0, timeMs: 0 });
  const lastPoint = points.pop()!;
  for (const [index, [x, y]] of points.entries()) tracker.move({ x, y, timeMs: (index + 1) * stepMs });
  return tracker.release({ x: lastPoint[0], y: lastPoint[1], timeMs: (points.length + 1) * stepMs }, width);
}

/** Slow, even steps to `to`, then a pause there, so the release has no speed. */
function slowTo(x: number, y: number): [number, number][] {
  const steps = 40;
  const path: [number, number][] = Array.from({ length: steps }, (_, i) => [
    (x * (i + 1)) / steps,
    (y * (i + 1)) / steps,
  ]);
  for (let i = 0; i < 10; i += 1) path.push([x, y]);
  return path;
}

describe('directionOf', () => {
  it('reads the dominant axis: right dip, left flat, up unsure, down nothing', () => {
    expect(directionOf(50, 10)).toBe('dip');
    expect(directionOf(-50, -10)).toBe('flat');
    expect(directionOf(10, -50)).toBe('unsure');
    expect(directionOf(10, 50)).toBeNull();
    expect(directionOf(0, 0)).toBeNull();
  });
});

describe('classifyRelease by distance', () => {
  it('when released past a third of the card width, gives the verdict of that direction', () => {
    const still = { vxPxPerMs: 0, vyPxPerMs: 0 };
    expect(classifyRelease({ dxPx: threshold + 1, dyPx: 0, ...still }, width)).toBe('dip');
    expect(classifyRelease({ dxPx: -threshold - 1, dyPx: 5, ...still }, width)).toBe('flat');
    expect(classifyRelease({ dxPx: 0, dyPx: -threshold - 1, ...still }, width)).toBe('unsure');
  });

  it('when released short of the threshold and slowly, springs back (null)', () => {
    const still = { vxPxPerMs: 0.1, vyPxPerMs: 0 };
    expect(classifyRelease({ dxPx: threshold - 1, dyPx: 0, ...still }, width)).toBeNull();
    expect(classifyRelease({ dxPx: 0, dyPx: threshold * 2, ...still }, width)).toBeNull();
  });
});

describe('classifyRelease by velocity', () => {
  it('when flung fast but short, still counts once it moved a little the same way', () => {
    expect(
      classifyRelease({ dxPx: 40, dyPx: 0, vxPxPerMs: flingVelocityPxPerMs + 0.1, vyPxPerMs: 0 }, width),
    ).toBe('dip');
    expect(classifyRelease({ dxPx: 0, dyPx: -40, vxPxPerMs: 0, vyPxPerMs: -1.2 }, width)).toBe('unsure');
  });

  it('when the flick is too short, or slower than the fling velocity, springs back', () => {
    expect(classifyRelease({ dxPx: 12, dyPx: 0, vxPxPerMs: 2, vyPxPerMs: 0 }, width)).toBeNull();
    expect(
      classifyRelease({ dxPx: 60, dyPx: 0, vxPxPerMs: flingVelocityPxPerMs - 0.1, vyPxPerMs: 0 }, width),
    ).toBeNull();
  });

  it('when past the threshold but moving fast back towards the start, springs back', () => {
    expect(classifyRelease({ dxPx: threshold + 20, dyPx: 0, vxPxPerMs: -1, vyPxPerMs: 0 }, width)).toBeNull();
  });
});

describe('createDragTracker', () => {
  it('a slow drag past the threshold gives its verdict', () => {
    expect(drag(slowTo(threshold + 10, 0))).toBe('dip');
    expect(drag(slowTo(-(threshold + 10), 0))).toBe('flat');
    expect(drag(slowTo(0, -(threshold + 10)))).toBe('unsure');
  });

  it('a slow drag that stops short springs back', () => {
    expect(drag(slowTo(threshold - 10, 0))).toBeNull();
  });

  it('when the pointer comes back to where it started, nothing is recorded (WCAG 2.5.2)', () => {
    const far = threshold + 60;
    const out: [number, number][] = Array.from({ length: 40 }, (_, i) => [(far * (i + 1)) / 40, 0]);
    const back: [number, number][] = Array.from({ length: 40 }, (_, i) => [far - (far * (i + 1)) / 40, 0]);
    const pause: [number, number][] = Array.from({ length: 10 }, () => [0, 0]);
    expect(drag([...out, ...back, ...pause])).toBeNull();
  });

  it('a quick flick of 60 px in 50 ms is a fling', () => {
    expect(
      drag(
        [
          [15, 0],
          [30, 0],
          [45, 0],
          [60, 0],
        ],
        12,
      ),
    ).toBe('dip');
  });

  it('a press that moves less than the slop is a tap, not a drag', () => {
    const tracker = createDragTracker({ x: 0, y: 0, timeMs: 0 });
    tracker.move({ x: dragSlopPx - 2, y: 0, timeMs: 5 });
    expect(tracker.dragging).toBe(false);
    expect(tracker.release({ x: dragSlopPx - 2, y: 0, timeMs: 8 }, width)).toBeNull();
  });
});
