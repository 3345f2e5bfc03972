import { useMemo, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import type { PeriodSearchResult } from '../../api/get-period-search';
import { formatCount } from '../../lib/format';
import { formatPeriodDays, periodogramPeaks, type SeriesPart } from '../../lib/period-search';
import { formatMeasurement } from '../../lib/vetting';
import { FoldChart } from './fold-chart';
import { PeriodogramChart, type PeriodogramMark } from './periodogram-chart';

interface PeriodSearchResultViewProps {
  result: PeriodSearchResult;
  parts: readonly SeriesPart[];
  designation: string;
}

export function PeriodSearchResultView({ result, parts, designation }: PeriodSearchResultViewProps) {
  const { best } = result;
  const [wholeOrbit, setWholeOrbit] = useState(false);
  if (!best) {
    return (
      <Alert tone="note" title="No transit-like signal">
        <p>
          The search ran over {formatCount(result.grid.periods)} periods and found no box-shaped dip that fits
          better than a flat light curve.
        </p>
      </Alert>
    );
  }
  const reference = result.bjdRefDays;
  const folds = [
    { name: 'P', periodDays: best.periodDays, diagnostics: result.diagnostics?.atBest ?? null },
    { name: 'P/2', periodDays: best.periodDays / 2, diagnostics: result.diagnostics?.atHalf ?? null },
    { name: '2P', periodDays: best.periodDays * 2, diagnostics: result.diagnostics?.atDouble ?? null },
  ];

  return (
    <div className="flex flex-col gap-6">
      <dl className="grid grid-cols-2 gap-3 md:grid-cols-3 lg:grid-cols-6">
        <Measure label="Period P" value={formatPeriodDays(best.periodDays)} />
        <Measure
          label="Mid-transit t0"
          value={`${best.t0Days.toFixed(5)} d`}
          detail={reference ? `BJD_TDB ${(best.t0Days + reference).toFixed(5)}` : 'in the light curve’s days'}
        />
        <Measure label="Depth" value={formatMeasurement(best.depthPpm, best.depthErrPpm, 'ppm', 0)} />
        <Measure label="Duration" value={`${best.durationHours.toFixed(2)} h`} />
        <Measure label="SNR" value={best.snr.toFixed(1)} />
        <Measure
          label="Searched"
          value={`${formatCount(result.grid.periods)} periods`}
          detail={`${formatCount(result.pointCount)} points over ${result.baselineDays.toFixed(1)} d`}
        />
      </dl>

      <Periodogram result={result} periodDays={best.periodDays} designation={designation} />

      <section aria-labelledby="folds-heading" className="flex flex-col gap-3">
        <div className="flex flex-col gap-1">
          <h3 id="folds-heading" className="text-lg font-semibold text-ink">
            The light curve folded
          </h3>
          <p className="max-w-2xl text-sm text-muted">
            The light curve folded at P, at half and at twice P, with binned means as a line. A real planet
            folds cleanly at P; different odd and even depths, or a dip at phase 0.5, point to an eclipsing
            binary at 2P.
          </p>
        </div>
        <fieldset className="flex flex-wrap gap-2">
          <legend className="sr-only">How much of the orbit to show</legend>
          {[
            { whole: false, text: 'Near mid-transit' },
            { whole: true, text: 'Whole orbit' },
          ].map((option) => (
            <Button
              key={option.text}
              variant={wholeOrbit === option.whole ? 'primary' : 'secondary'}
              aria-pressed={wholeOrbit === option.whole}
              onClick={() => setWholeOrbit(option.whole)}
              className="text-sm"
            >
              {option.text}
            </Button>
          ))}
        </fieldset>
        <div className="grid gap-4 lg:grid-cols-3">
          {folds.map((fold) => (
            <ErrorBoundary
              key={fold.name}
              fallback={(_error, reset) => (
                <Alert tone="danger" title={`The fold at ${fold.name} could not be drawn`}>
                  <Button variant="secondary" className="mt-2" onClick={reset}>
                    Try again
                  </Button>
                </Alert>
              )}
            >
              <FoldChart
                name={fold.name}
                parts={parts}
                periodDays={fold.periodDays}
                t0Days={best.t0Days}
                durationHours={best.durationHours}
                diagnostics={fold.diagnostics}
                designation={designation}
                wholeOrbit={wholeOrbit}
              />
            </ErrorBoundary>
          ))}
        </div>
      </section>
    </div>
  );
}

function Measure({ label, value, detail }: { label: string; value: string; detail?: string }) {
  return (
    <div className="flex flex-col gap-1 rounded-lg border border-line bg-surface p-4">
      <dt className="text-sm font-medium text-ink">{label}</dt>
      <dd className="tabular text-lg text-ink">{value}</dd>
      {detail ? <dd className="tabular text-xs text-muted">{detail}</dd> : null}
    </div>
  );
}

/** How a peak's period relates to the best one, when it is a simple harmonic of it. */
function harmonicName(periodDays: number, bestDays: number): string {
  const ratio = periodDays / bestDays;
  const named: [number, string][] = [
    [1, 'P'],
    [0.5, 'P/2'],
    [2, '2P'],
    [1 / 3, 'P/3'],
    [3, '3P'],
    [2 / 3, '2P/3'],
    [1.5, '3P/2'],
  ];
  const match = named.find(([value]) => Math.abs(ratio - value) < 0.01 * value);
  return match ? match[1] : '—';
}

function Periodogram({
  result,
  periodDays,
  designation,
}: {
  result: PeriodSearchResult;
  periodDays: number;
  designation: string;
}) {
  const { periodsDays, power } = result.periodogram;
  const marks = useMemo<PeriodogramMark[]>(
    () => [
      { periodDays, label: 'P', strong: true },
      { periodDays: periodDays / 2, label: 'P/2' },
      { periodDays: periodDays * 2, label: '2P' },
    ],
    [periodDays],
  );
  const peaks = useMemo(() => periodogramPeaks(periodsDays, power, 5), [periodsDays, power]);
  const first = periodsDays[0];
  const last = periodsDays[periodsDays.length - 1];

  return (
    <section aria-labelledby="periodogram-heading" className="flex flex-col gap-3">
      <h3 id="periodogram-heading" className="text-lg font-semibold text-ink">
        Periodogram
      </h3>
      <div className="rounded-lg border border-line bg-surface p-4 md:p-6">
        {periodsDays.length > 1 ? (
          <ErrorBoundary
            fallback={(_error, reset) => (
              <Alert tone="danger" title="The periodogram could not be drawn">
                <p>Its strongest peaks are listed below.</p>
                <Button variant="secondary" className="mt-2" onClick={reset}>
                  Try again
                </Button>
              </Alert>
            )}
          >
            <PeriodogramChart
              periodsDays={periodsDays}
              power={power}
              marks={marks}
              label={`BLS periodogram of ${designation} from ${first?.toFixed(2)} to ${last?.toFixed(2)} days; the highest peak at P = ${formatPeriodDays(periodDays)}, with P/2 and 2P marked`}
            />
          </ErrorBoundary>
        ) : (
          <p className="text-sm text-muted">The search kept no periodogram to draw.</p>
        )}
        <ul className="mt-3 flex flex-wrap gap-x-5 gap-y-2 text-xs text-muted">
          <li className="flex items-center gap-2">
            <span aria-hidden="true" className="h-3 w-0.5 bg-amber" />
            P, the best period
          </li>
          <li className="flex items-center gap-2">
            <span aria-hidden="true" className="h-3 w-0 border-l-2 border-dashed border-slate" />
            P/2 and 2P
          </li>
        </ul>
      </div>
      {peaks.length > 0 ? (
        <Table caption="The strongest peaks of the periodogram">
          <TableHead>
            <Th>Peak</Th>
            <Th className="text-right">Period</Th>
            <Th className="text-right">Power</Th>
            <Th>Against P</Th>
          </TableHead>
          <TableBody>
            {peaks.map((peak, index) => (
              <Tr key={peak.periodDays} card="pairs">
                <Td label="Peak">
                  <span className="tabular">{index + 1}</span>
                </Td>
                <Td label="Period" className="md:text-right">
                  <span className="tabular">{formatPeriodDays(peak.periodDays)}</span>
                </Td>
                <Td label="Power" className="md:text-right">
                  <span className="tabular">{peak.power.toFixed(1)}</span>
                </Td>
                <Td label="Against P">
                  <span className="tabular">{harmonicName(peak.periodDays, periodDays)}</span>
                </Td>
              </Tr>
            ))}
          </TableBody>
        </Table>
      ) : null}
    </section>
  );
}
