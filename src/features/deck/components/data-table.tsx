import { formatTick } from '@/lib/light-curve';

/** The plotted points as numbers, for anyone who would rather read than look. */
export function DataTable({
  hours,
  ppm,
  caption,
}: {
  hours: readonly number[];
  ppm: readonly number[];
  caption: string;
}) {
  return (
    <section
      // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard.
      tabIndex={0}
      aria-label={caption}
      data-no-swipe
      className="max-h-72 overflow-auto rounded-md border border-line bg-surface"
    >
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="sticky top-0 bg-paper">
          <tr>
            <th
              scope="col"
              className="px-3 py-2 text-xs font-semibold uppercase tracking-[0.08em] text-muted"
            >
              Hours from start
            </th>
            <th
              scope="col"
              className="px-3 py-2 text-right text-xs font-semibold uppercase tracking-[0.08em] text-muted"
            >
              Brightness (ppm)
            </th>
          </tr>
        </thead>
        <tbody className="tabular text-slate">
          {hours.map((hour, index) => (
            <tr key={hour} className="border-t border-line">
              <td className="px-3 py-1">{hour.toFixed(3)}</td>
              <td className="px-3 py-1 text-right">{formatTick(ppm[index] ?? 0, 1000)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
