import { useMemo } from 'react';
import { LightCurvePlot } from '@/components/light-curve-plot';
import type { FoldDiagnostics } from '../../api/get-period-search';
import {
  binFold,
  foldBinHours,
  foldHalfWindowHours,
  foldSeries,
  formatPeriodDays,
  type SeriesPart,
} from '../../lib/period-search';
import { formatMeasurement } from '../../lib/vetting';

interface FoldChartProps {
  /** "P", "P/2" or "2P": which trial period of the search this fold is. */
  name: string;
  parts: readonly SeriesPart[];
  periodDays: number;
  t0Days: number;
  durationHours: number;
  diagnostics: FoldDiagnostics | null;
  designation: string;
  /** From −P/2 to +P/2 rather than near mid-transit: where a secondary eclipse shows. */
  wholeOrbit?: boolean;
}

/** The light curve folded at one trial period, with BLS's measurements at that period beside it. */
export function FoldChart({
  name,
  parts,
  periodDays,
  t0Days,
  durationHours,
  diagnostics,
  designation,
  wholeOrbit = false,
}: FoldChartProps) {
  const half = wholeOrbit ? (periodDays * 24) / 2 : foldHalfWindowHours(periodDays, durationHours);
  // Over a whole orbit, bins a fifth of the transit would leave a few points each: keep about 200.
  const binHours = Math.max(foldBinHours(durationHours), wholeOrbit ? half / 100 : 0);
  const fold = useMemo(
    () => foldSeries(parts, { periodDays, t0Days, halfWindowHours: half }),
    [parts, periodDays, t0Days, half],
  );
  const binned = useMemo(
    () => (fold.phaseHours.length > 0 ? binFold(fold, binHours, -half, half) : null),
    [fold, binHours, half],
  );
  const line = useMemo(() => (binned ? { x: binned.phaseHours, y: binned.meanPpm } : null), [binned]);
  const depth = formatMeasurement(diagnostics?.depthPpm, diagnostics?.depthErrPpm, 'ppm', 0);
  const secondary = formatMeasurement(
    diagnostics?.depthSecondaryPpm,
    diagnostics?.depthSecondaryErrPpm,
    'ppm',
    0,
  );
  const oddEven = diagnostics?.oddEvenDifferenceSigma;
  const headingId = `fold-${name.replace(/\W/g, '')}`;

  return (
    <article
      aria-labelledby={headingId}
      className="flex min-w-0 flex-col gap-3 rounded-lg border border-line bg-surface p-4"
    >
      <h4 id={headingId} className="text-base font-semibold text-ink">
        Folded at {name}{' '}
        <span className="tabular ml-2 text-sm font-normal text-muted">{formatPeriodDays(periodDays)}</span>
      </h4>
      {fold.phaseHours.length > 0 ? (
        <LightCurvePlot
          x={fold.phaseHours}
          y={fold.fluxPpm}
          line={line}
          xLabel="hours from mid-transit"
          yLabel="flux (ppm)"
          xUnit="h"
          yUnit="ppm"
          height={220}
          label={`Light curve of ${designation} folded at ${name} = ${formatPeriodDays(periodDays)}: ${fold.phaseHours.length} points within ${half.toFixed(1)} h of mid-transit, binned means drawn as a line; depth ${depth}`}
        />
      ) : (
        <p className="text-sm text-muted">
          No point of the light curve falls near mid-transit at this period.
        </p>
      )}
      <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
        <div className="col-span-2 flex flex-col">
          <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Depth</dt>
          <dd className="tabular text-ink">{depth}</dd>
        </div>
        <div className="flex flex-col">
          <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Odd − even</dt>
          <dd className="tabular text-ink">
            {oddEven === null || oddEven === undefined ? '—' : `${oddEven.toFixed(1)}σ`}
          </dd>
        </div>
        <div className="flex flex-col">
          <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Transits seen</dt>
          <dd className="tabular text-ink">{diagnostics ? diagnostics.transitsWithData : '—'}</dd>
        </div>
        <div className="col-span-2 flex flex-col">
          <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">
            Secondary (phase 0.5)
          </dt>
          <dd className="tabular text-ink">{secondary}</dd>
        </div>
      </dl>
    </article>
  );
}
