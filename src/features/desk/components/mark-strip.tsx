import type { PlotView } from '@/components/light-curve-plot';
import { formatHours, plural } from '../lib/format';
import { markHistogram } from '../lib/splits';

const binCount = 36;
const barTop = 2;
const barBottom = 30;
const rugTop = 33;
const rugBottom = 40;

function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

interface MarkStripProps {
  /** Hours from the snippet's start, one per verdict that carried a mark. */
  marksHours: readonly number[];
  durationHours: number;
  verdictCount: number;
  /** Where the chart above shows and what it shows; null before it has drawn (the whole snippet then). */
  view: PlotView | null;
}

/**
 * Where volunteers put their marks, as a histogram with one tick per mark beneath, on the same time axis
 * as the chart above it: it follows the chart's zoom and lines up with its plotting area.
 */
export function MarkStrip({ marksHours, durationHours, verdictCount, view }: MarkStripProps) {
  const from = view?.xMin ?? 0;
  const to = view?.xMax ?? durationHours;
  const span = Math.max(1e-9, to - from);
  const counts = markHistogram(marksHours, from, to, binCount);
  const most = Math.max(1, ...counts);
  const middle = median(marksHours);
  const summary =
    marksHours.length === 0
      ? 'No volunteer marked a time on this snippet.'
      : `${plural(marksHours.length, 'mark')} from ${plural(verdictCount, 'verdict')}; median ${formatHours(middle, 1)} from the start, range ${formatHours(Math.min(...marksHours))} to ${formatHours(Math.max(...marksHours))}.`;

  return (
    <div className="flex flex-col gap-1.5">
      <div
        className="relative h-10 border-b border-edge"
        style={view ? { marginLeft: view.leftPx, width: view.widthPx } : undefined}
      >
        <svg
          role="img"
          aria-label={`Marks on the time axis. ${summary}`}
          viewBox={`0 0 ${binCount} ${rugBottom}`}
          preserveAspectRatio="none"
          className="block h-full w-full overflow-hidden"
        >
          {counts.map((count, bin) =>
            count === 0 ? null : (
              <rect
                // biome-ignore lint/suspicious/noArrayIndexKey: the bins are fixed slots along the axis.
                key={bin}
                x={bin + 0.08}
                width={0.84}
                y={barBottom - ((barBottom - barTop) * count) / most}
                height={((barBottom - barTop) * count) / most}
                className="fill-amber/70"
              />
            ),
          )}
          {marksHours.map((mark, index) => {
            if (mark < from || mark > to) return null;
            const x = ((mark - from) / span) * binCount;
            return (
              <line
                // biome-ignore lint/suspicious/noArrayIndexKey: two volunteers can mark the same time.
                key={index}
                x1={x}
                x2={x}
                y1={rugTop}
                y2={rugBottom}
                vectorEffect="non-scaling-stroke"
                className="stroke-amber-ink"
                strokeWidth={1.5}
              />
            );
          })}
        </svg>
      </div>
      <p className="text-xs text-muted">
        <span className="font-medium text-ink">Marks</span> · {summary}
      </p>
    </div>
  );
}
