import { useMemo } from 'react';
import { LightCurvePlot } from '@/components/light-curve-plot';
import { formatScore, plural } from '../lib/format';
import type { Review } from '../lib/splits';

/** The consensus score after each verdict, on a fixed 0 to 1 axis so a small swing looks small. */
export function ScoreHistory({ history }: { history: Review['scoreHistory'] }) {
  const x = useMemo(() => history.map((step) => step.verdictCount), [history]);
  const y = useMemo(() => history.map((step) => step.score), [history]);
  const line = useMemo(() => ({ x, y }), [x, y]);
  const first = history[0];
  const last = history[history.length - 1];

  return (
    <section aria-labelledby="desk-score-heading" className="flex min-w-0 flex-col gap-3">
      <h2 id="desk-score-heading" className="text-lg font-semibold text-ink">
        Consensus score over time
      </h2>
      {!first || !last ? (
        <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-4 text-base text-muted">
          No score has been worked out for this snippet yet.
        </p>
      ) : (
        <>
          <div className="rounded-lg border border-line bg-surface p-3">
            <LightCurvePlot
              x={x}
              y={y}
              line={line}
              yMin={0}
              yMax={1}
              height={190}
              xLabel="verdicts"
              yLabel="score"
              xUnit="verdicts"
              label={`Consensus score after each verdict: ${formatScore(first.score)} after ${plural(first.verdictCount, 'verdict')}, ${formatScore(last.score)} after ${plural(last.verdictCount, 'verdict')}.`}
            />
          </div>
          <p className="text-xs text-muted">
            Near 1 the verdicts point to a dip, near 0 to flat. Now{' '}
            <span className="tabular text-ink">{formatScore(last.score)}</span> after{' '}
            {plural(last.verdictCount, 'verdict')}.
          </p>
        </>
      )}
    </section>
  );
}
