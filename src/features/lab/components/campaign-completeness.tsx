import { LoadFailure } from '@/components/load-failure';
import 'uplot/dist/uPlot.min.css';
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { Loading } from '@/components/loading';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { fonts, palette } from '@/config/design-tokens';
import {
  type Completeness,
  type RecoveryBin,
  useCampaignCompleteness,
} from '../api/get-campaign-completeness';
import { formatCount, plural } from '../lib/format';

type Binning = 'snr' | 'depth' | 'duration';

const binnings: Record<
  Binning,
  { choice: string; axis: string; column: string; bins: (c: Completeness) => RecoveryBin[]; unit: string }
> = {
  snr: { choice: 'SNR', axis: 'Expected SNR', column: 'Expected SNR', bins: (c) => c.bySnr, unit: '' },
  depth: { choice: 'Depth', axis: 'Depth (ppm)', column: 'Depth', bins: (c) => c.byDepth, unit: 'ppm' },
  duration: {
    choice: 'Duration',
    axis: 'Duration (hours)',
    column: 'Duration',
    bins: (c) => c.byDuration,
    unit: 'h',
  },
};

const binningOrder: Binning[] = ['snr', 'depth', 'duration'];

const edgeFormat = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });
const compactFormat = new Intl.NumberFormat('en-GB', { notation: 'compact', maximumFractionDigits: 1 });

function formatEdge(value: number, binning: Binning): string {
  return binning === 'depth' ? formatCount(value) : edgeFormat.format(value);
}

/** "7.1–10", "1,000–2,000 ppm", "≥ 50": a bin's range as the table writes it. */
function formatBinRange(bin: RecoveryBin, binning: Binning): string {
  const unit = binnings[binning].unit;
  const range =
    bin.upper === null
      ? `≥ ${formatEdge(bin.lower, binning)}`
      : `${formatEdge(bin.lower, binning)}–${formatEdge(bin.upper, binning)}`;
  return unit ? `${range} ${unit}` : range;
}

const percent = (share: number) => `${Math.round(share * 100)} %`;

function formatInterval(low: number | null, high: number | null): string {
  return low === null || high === null ? '—' : `${Math.round(low * 100)}–${Math.round(high * 100)} %`;
}

const hasOutcomes = (c: Completeness) =>
  c.planted.recovered + c.planted.missed + c.quiet.falseDips + c.quiet.flat > 0;

/**
 * How completely volunteers find the campaign's planted dips, by SNR, depth and duration, and how often
 * they call a quiet control a dip: a chart of recovery with 95 % Wilson intervals and the same numbers
 * in a table.
 */
export function CampaignCompleteness({ campaignId }: { campaignId: number }) {
  const completeness = useCampaignCompleteness(campaignId);

  if (completeness.isPending) return <Loading label="Loading the completeness figures…" />;
  if (completeness.isError) {
    return (
      <LoadFailure
        title="Could not load the completeness figures"
        error={completeness.error}
        onRetry={() => completeness.refetch()}
      />
    );
  }
  const data = completeness.data;
  if (!hasOutcomes(data)) return <NoOutcomesYet completeness={data} />;
  return <CompletenessView completeness={data} />;
}

function NoOutcomesYet({ completeness }: { completeness: Completeness }) {
  const { planted, quiet } = completeness;
  const noControls = planted.total + quiet.total === 0;
  return (
    <div className="flex flex-col gap-4 rounded-lg border border-dashed border-edge bg-surface px-5 py-5 md:px-6">
      <div className="flex flex-col gap-1.5">
        <p className="text-base font-semibold text-ink">
          {noControls ? 'No controls yet' : 'No control has an outcome yet'}
        </p>
        <p className="max-w-2xl text-base text-muted">
          {noControls
            ? 'Planted and quiet controls are mixed in when light curves are cut into snippets. Once light curves are uploaded and volunteers have settled some controls, the results show up here.'
            : `This campaign has ${formatCount(planted.total)} planted and ${plural(quiet.total, 'quiet control')}, all still open or split. Their results show up here as volunteers’ verdicts settle them.`}
        </p>
      </div>
      <div className="flex flex-col gap-2">
        <p className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink">
          What will appear here
        </p>
        <ul className="flex flex-col gap-1.5">
          {[
            'The share of planted dips that volunteers recover, by SNR, depth and duration, with 95 % intervals',
            'How often volunteers call a quiet control a dip',
          ].map((item) => (
            <li key={item} className="flex gap-2.5 text-base text-ink">
              <span aria-hidden="true" className="mt-2.5 h-0.5 w-3 shrink-0 bg-amber" />
              {item}
            </li>
          ))}
        </ul>
      </div>
    </div>
  );
}

function CompletenessView({ completeness }: { completeness: Completeness }) {
  const [binning, setBinning] = useState<Binning>('snr');
  const bins = binnings[binning].bins(completeness);
  const plantedOutcomes = completeness.planted.recovered + completeness.planted.missed;

  return (
    <div className="flex flex-col gap-6">
      <Summary completeness={completeness} />
      <BinningChoice value={binning} onChange={setBinning} />
      {plantedOutcomes === 0 ? (
        <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-4 text-base text-muted">
          No planted dip has an outcome yet, so there is no recovery to chart. The pending ones are counted
          below.
        </p>
      ) : bins.length === 0 ? null : (
        <ErrorBoundary
          fallback={(_error, reset) => (
            <Alert tone="danger" title="The chart could not be drawn">
              <p>The numbers are still in the table below.</p>
              <Button variant="secondary" className="mt-2" onClick={reset}>
                Try again
              </Button>
            </Alert>
          )}
        >
          <RecoveryChart bins={bins} binning={binning} quietRate={completeness.quiet.rate} />
        </ErrorBoundary>
      )}
      <BinTable bins={bins} binning={binning} />
    </div>
  );
}

function Summary({ completeness }: { completeness: Completeness }) {
  const { planted, quiet } = completeness;
  const plantedTrials = planted.recovered + planted.missed;
  const quietTrials = quiet.falseDips + quiet.flat;
  const items = [
    {
      label: 'Planted dips recovered',
      value: planted.rate === null ? '—' : percent(planted.rate),
      note:
        plantedTrials === 0
          ? 'none settled yet'
          : `${formatCount(planted.recovered)} of ${formatCount(plantedTrials)} · 95 % interval ${formatInterval(planted.wilsonLow, planted.wilsonHigh)}`,
    },
    {
      label: 'False dips on quiet controls',
      value: quiet.rate === null ? '—' : percent(quiet.rate),
      note:
        quietTrials === 0
          ? 'none settled yet'
          : `${formatCount(quiet.falseDips)} of ${formatCount(quietTrials)} · 95 % interval ${formatInterval(quiet.wilsonLow, quiet.wilsonHigh)}`,
    },
    {
      label: 'Pending',
      value: formatCount(planted.pending + quiet.pending),
      note: `${formatCount(planted.pending)} planted · ${formatCount(quiet.pending)} quiet, open or split`,
    },
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3">
      {items.map((item, index) => (
        <div
          key={item.label}
          className={`flex flex-col gap-1 rounded-lg border border-line bg-surface p-4 ${index === 2 ? 'col-span-2 sm:col-span-1' : ''}`}
        >
          <dt className="text-sm font-medium text-ink">{item.label}</dt>
          <dd className={`tabular order-first text-2xl ${item.value === '—' ? 'text-muted' : 'text-ink'}`}>
            {item.value}
          </dd>
          <dd className="tabular text-xs text-muted">{item.note}</dd>
        </div>
      ))}
    </dl>
  );
}

function BinningChoice({ value, onChange }: { value: Binning; onChange: (binning: Binning) => void }) {
  const name = useId();
  return (
    <fieldset className="flex flex-wrap items-center gap-x-3 gap-y-2">
      <legend className="float-left mr-1 text-sm font-medium text-ink">Planted dips by</legend>
      <div className="inline-flex rounded-md border border-edge bg-surface p-1">
        {binningOrder.map((binning) => {
          const checked = binning === value;
          return (
            <label
              key={binning}
              className={`inline-flex min-h-target cursor-pointer items-center rounded-sm px-4 text-sm font-medium has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-amber has-[:focus-visible]:outline-offset-2 ${
                checked ? 'bg-ink text-paper' : 'text-ink hover:bg-amber-wash'
              }`}
            >
              <input
                type="radio"
                name={name}
                value={binning}
                checked={checked}
                onChange={() => onChange(binning)}
                className="sr-only"
              />
              {binnings[binning].choice}
            </label>
          );
        })}
      </div>
    </fieldset>
  );
}

function BinTable({ bins, binning }: { bins: RecoveryBin[]; binning: Binning }) {
  const column = binnings[binning].column;
  if (bins.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-4 text-base text-muted">
        No planted control has a recorded {column.toLowerCase()}.
      </p>
    );
  }
  return (
    <Table caption={`Recovery of planted dips by ${column.toLowerCase()}, with 95 % Wilson intervals`}>
      <TableHead>
        <Th>{column}</Th>
        <Th className="text-right">Recovered</Th>
        <Th className="text-right">Missed</Th>
        <Th className="text-right">Pending</Th>
        <Th className="text-right">Recovery</Th>
        <Th className="text-right">95 % interval</Th>
      </TableHead>
      <TableBody>
        {bins.map((bin) => (
          <Tr key={bin.lower} card="pairs">
            <Td label={column} className="col-span-2 before:hidden">
              <span className="tabular font-medium text-ink md:whitespace-nowrap">
                {formatBinRange(bin, binning)}
              </span>
            </Td>
            <Td label="Recovered" className="md:text-right">
              <span className="tabular text-ink">{formatCount(bin.recovered)}</span>
            </Td>
            <Td label="Missed" className="md:text-right">
              <span className="tabular text-ink">{formatCount(bin.missed)}</span>
            </Td>
            <Td label="Pending" className="md:text-right">
              <span className={`tabular ${bin.pending === 0 ? 'text-muted' : 'text-ink'}`}>
                {formatCount(bin.pending)}
              </span>
            </Td>
            <Td label="Recovery" className="md:text-right">
              <span className={`tabular ${bin.rate === null ? 'text-muted' : 'font-medium text-ink'}`}>
                {bin.rate === null ? '—' : percent(bin.rate)}
              </span>
            </Td>
            <Td label="95 % interval" className="col-span-2 md:text-right">
              <span className="tabular whitespace-nowrap text-slate">
                {formatInterval(bin.wilsonLow, bin.wilsonHigh)}
              </span>
            </Td>
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}

const axisFont = `11px ${fonts.mono}`;
const labelFont = `500 12px ${fonts.sans}`;
const chartHeightPx = 260;

/** Bin i is drawn at x = i; its edges at i − ½ and i + ½, labelled with the bin's edge values. */
function edgeLabels(bins: RecoveryBin[], binning: Binning): string[] {
  const short = (value: number) =>
    binning === 'depth' ? compactFormat.format(value) : edgeFormat.format(value);
  const labels = bins.map((bin) => short(bin.lower));
  const last = bins[bins.length - 1];
  labels.push(last && last.upper !== null ? short(last.upper) : '');
  return labels;
}

function chartLabel(bins: RecoveryBin[], binning: Binning, quietRate: number | null): string {
  const parts = bins.map((bin) => {
    const trials = bin.recovered + bin.missed;
    const range = formatBinRange(bin, binning);
    return bin.rate === null
      ? `${range}: no outcome yet`
      : `${range}: ${percent(bin.rate)} of ${formatCount(trials)}, interval ${formatInterval(bin.wilsonLow, bin.wilsonHigh)}`;
  });
  const quiet = quietRate === null ? '' : ` False dips on quiet controls: ${percent(quietRate)}.`;
  return `Recovery of planted dips by ${binnings[binning].column.toLowerCase()}. ${parts.join('; ')}.${quiet}`;
}

/**
 * Recovered share per bin as points, with the Wilson interval drawn as a bar with caps in a uPlot draw
 * hook, the number of outcomes above each bin, and the quiet controls' false-dip rate as a dashed line:
 * a bin near that line is one where volunteers cannot tell a planted dip from quiet data.
 */
function RecoveryChart({
  bins,
  binning,
  quietRate,
}: {
  bins: RecoveryBin[];
  binning: Binning;
  quietRate: number | null;
}) {
  const containerRef = useRef<HTMLDivElement>(null);
  const label = useMemo(() => chartLabel(bins, binning, quietRate), [bins, binning, quietRate]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return;
    const count = bins.length;
    const xs = bins.map((_, i) => i);
    const ys = bins.map((bin) => bin.rate);
    const labels = edgeLabels(bins, binning);
    const ratio = devicePixelRatio;

    const drawOverlays = (u: uPlot) => {
      const { ctx, bbox } = u;
      ctx.save();
      if (quietRate !== null) {
        const y = u.valToPos(quietRate, 'y', true);
        ctx.strokeStyle = palette.slate;
        ctx.lineWidth = 1.5 * ratio;
        ctx.setLineDash([6 * ratio, 4 * ratio]);
        ctx.beginPath();
        ctx.moveTo(bbox.left, y);
        ctx.lineTo(bbox.left + bbox.width, y);
        ctx.stroke();
        ctx.setLineDash([]);
      }
      const cap = Math.min(8 * ratio, bbox.width / count / 4);
      ctx.strokeStyle = palette.amber;
      ctx.lineWidth = 2 * ratio;
      ctx.font = `${10 * ratio}px ${fonts.mono}`;
      ctx.textAlign = 'center';
      ctx.textBaseline = 'bottom';
      bins.forEach((bin, i) => {
        const x = u.valToPos(i, 'x', true);
        const trials = bin.recovered + bin.missed;
        ctx.fillStyle = palette.muted;
        ctx.fillText(trials === 0 ? '–' : `n ${formatCount(trials)}`, x, bbox.top - 4 * ratio);
        if (bin.wilsonLow === null || bin.wilsonHigh === null) return;
        const top = u.valToPos(bin.wilsonHigh, 'y', true);
        const bottom = u.valToPos(bin.wilsonLow, 'y', true);
        ctx.beginPath();
        ctx.moveTo(x, top);
        ctx.lineTo(x, bottom);
        ctx.moveTo(x - cap, top);
        ctx.lineTo(x + cap, top);
        ctx.moveTo(x - cap, bottom);
        ctx.lineTo(x + cap, bottom);
        ctx.stroke();
      });
      ctx.restore();
    };

    const options: uPlot.Options = {
      width: Math.max(240, container.clientWidth),
      height: chartHeightPx,
      legend: { show: false },
      cursor: { show: false },
      select: { show: false, left: 0, top: 0, width: 0, height: 0 },
      padding: [24, 12, 0, 0],
      scales: {
        x: { time: false, range: (): uPlot.Range.MinMax => [-0.5, count - 0.5] },
        // A little beyond 0 and 1, so that points at 0 % and 100 % are not cut in half.
        y: { range: (): uPlot.Range.MinMax => [-0.04, 1.04] },
      },
      axes: [
        {
          label: binnings[binning].axis,
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          size: 32,
          labelSize: 22,
          grid: { show: false },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          splits: () => labels.map((_, i) => i - 0.5),
          values: (_u, splits) => splits.map((split) => labels[Math.round(split + 0.5)] ?? ''),
        },
        {
          label: 'Recovered',
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          size: 56,
          grid: { stroke: palette.line, width: 1 },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          splits: () => [0, 0.25, 0.5, 0.75, 1],
          values: (_u, splits) => splits.map((split) => percent(split)),
        },
      ],
      series: [
        {},
        {
          label: 'Recovered',
          stroke: palette.amber,
          paths: () => null,
          points: { show: true, size: 10, width: 2, stroke: palette.surface, fill: palette.amber, space: 0 },
        },
      ],
      // Under the points, so each point sits on its interval.
      hooks: { drawAxes: [drawOverlays] },
    };

    const plot = new uPlot(options, [xs, ys] as uPlot.AlignedData, container);
    const observer = new ResizeObserver(() => {
      const width = Math.max(240, container.clientWidth);
      if (width !== plot.width) plot.setSize({ width, height: chartHeightPx });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      plot.destroy();
    };
  }, [bins, binning, quietRate]);

  return (
    <figure className="flex min-w-0 flex-col gap-2">
      <div ref={containerRef} role="img" aria-label={label} className="w-full min-w-0" />
      <figcaption className="flex flex-wrap items-center gap-x-5 gap-y-1 text-xs text-muted">
        <span className="inline-flex items-center gap-2">
          <span aria-hidden="true" className="relative inline-flex h-3 w-3 items-center justify-center">
            <span className="absolute inset-y-0 w-0.5 bg-amber" />
            <span className="size-2.5 rounded-full bg-amber" />
          </span>
          Share recovered, with its 95 % Wilson interval; n: planted dips with an outcome
        </span>
        {quietRate !== null ? (
          <span className="inline-flex items-center gap-2">
            <span aria-hidden="true" className="w-4 border-t-2 border-dashed border-slate" />
            False dips on quiet controls ({percent(quietRate)})
          </span>
        ) : null}
      </figcaption>
    </figure>
  );
}
