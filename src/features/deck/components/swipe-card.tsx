import { type ReactNode, useRef, useState } from 'react';
import { type Answer, answerLabels } from '../lib/cards';
import { createDragTracker, directionOf, dragProgress } from '../lib/gesture';

interface SwipeCardProps {
  onSwipe: (answer: Answer, offset: { dxPx: number; dyPx: number }) => void;
  disabled?: boolean;
  children: ReactNode;
}

const stampTones: Record<Answer, string> = {
  dip: 'border-amber text-amber-ink bg-amber-wash',
  flat: 'border-slate text-slate bg-slate-wash',
  unsure: 'border-edge text-ink bg-surface',
};

/**
 * The draggable card: right for dip, left for flat, up for unsure. Every swipe has a button too
 * (WCAG 2.5.1 and 2.5.7), and a drag that comes back, or stops short, springs back and records nothing.
 */
export function SwipeCard({ onSwipe, disabled = false, children }: SwipeCardProps) {
  const cardRef = useRef<HTMLDivElement>(null);
  const trackerRef = useRef<ReturnType<typeof createDragTracker> | null>(null);
  const [offset, setOffset] = useState<{ dxPx: number; dyPx: number } | null>(null);

  function onPointerDown(event: React.PointerEvent<HTMLDivElement>) {
    if (disabled || event.button !== 0) return;
    // Buttons, the time cursor and the data table inside the card keep their own pointer behaviour.
    if ((event.target as HTMLElement).closest('button, a, input, [role="slider"], [data-no-swipe]')) return;
    trackerRef.current = createDragTracker({ x: event.clientX, y: event.clientY, timeMs: event.timeStamp });
  }

  function onPointerMove(event: React.PointerEvent<HTMLDivElement>) {
    const tracker = trackerRef.current;
    if (!tracker) return;
    const wasDragging = tracker.dragging;
    const state = tracker.move({ x: event.clientX, y: event.clientY, timeMs: event.timeStamp });
    if (!state.dragging) return;
    // Only a real drag takes the pointer, so a tap still reaches the chart (where it sets the mark).
    if (!wasDragging) cardRef.current?.setPointerCapture(event.pointerId);
    setOffset({ dxPx: state.dxPx, dyPx: state.dyPx });
  }

  function finish(event: React.PointerEvent<HTMLDivElement>, cancelled: boolean) {
    const tracker = trackerRef.current;
    trackerRef.current = null;
    if (!tracker) return;
    const width = cardRef.current?.getBoundingClientRect().width ?? 320;
    const answer = cancelled
      ? null
      : tracker.release({ x: event.clientX, y: event.clientY, timeMs: event.timeStamp }, width);
    const last = offset;
    setOffset(null);
    if (answer) onSwipe(answer, last ?? { dxPx: 0, dyPx: 0 });
  }

  const width = cardRef.current?.getBoundingClientRect().width ?? 320;
  const direction = offset ? directionOf(offset.dxPx, offset.dyPx) : null;
  const progress = offset ? dragProgress(offset, width) : 0;

  return (
    <div
      ref={cardRef}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={(event) => finish(event, false)}
      onPointerCancel={(event) => finish(event, true)}
      data-dragging={offset ? 'true' : undefined}
      className={`relative touch-none select-none rounded-lg border border-line bg-surface shadow-[0_1px_0_var(--color-line),0_24px_48px_-32px_rgb(29_35_48/0.45)] ${
        offset ? 'cursor-grabbing' : 'cursor-grab motion-safe:transition-transform motion-safe:duration-200'
      }`}
      style={
        offset
          ? {
              transform: `translate(${offset.dxPx}px, ${Math.min(0, offset.dyPx) + Math.max(0, offset.dyPx) / 4}px) rotate(${offset.dxPx / 40}deg)`,
            }
          : undefined
      }
    >
      {children}
      {direction ? (
        <span
          aria-hidden="true"
          className={`pointer-events-none absolute top-4 rounded-md border-2 px-3 py-1 text-lg font-semibold uppercase tracking-[0.12em] ${stampTones[direction]} ${
            direction === 'dip' ? 'left-4' : direction === 'flat' ? 'right-4' : 'left-1/2 -translate-x-1/2'
          }`}
          style={{ opacity: 0.25 + progress * 0.75 }}
        >
          {answerLabels[direction]}
        </span>
      ) : null}
    </div>
  );
}
