import 'uplot/dist/uPlot.min.css';
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import uPlot from 'uplot';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { fonts, palette } from '@/config/design-tokens';
import { formatTick, formatTicks } from '@/lib/light-curve';

export interface PlotBand {
  /** On the x axis, in the plot's x unit. */
  start: number;
  end: number;
  /** amber for dips and planted transits, slate for flat and neutral, muted for plain boundaries. */
  tone: 'amber' | 'slate' | 'muted';
  /** Written at the top of the band when there is room (a consensus score, a snippet id). */
  label?: string;
  /** Drawn stronger: the band someone picked or hovers. */
  emphasis?: boolean;
}

export interface PlotMarker {
  x: number;
  label?: string;
  /** amber (default) for a mark; ink for a cursor that only points at a time. */
  tone?: 'amber' | 'ink';
}

export interface PlotLine {
  /** Sorted ascending, in the plot's x unit; need not share the points' x values. */
  x: readonly number[];
  /** A non-finite value breaks the line (a gap in the data). */
  y: readonly number[];
}

/** What the chart shows of the x axis and where its plotting area sits inside the figure, in CSS px. */
export interface PlotView {
  xMin: number;
  xMax: number;
  leftPx: number;
  widthPx: number;
}

export interface LightCurvePlotProps {
  /** Sorted ascending. */
  x: readonly number[];
  y: readonly (number | null)[];
  xLabel: string;
  yLabel: string;
  /** The chart's accessible name: what it shows, with its numbers. */
  label: string;
  bands?: readonly PlotBand[];
  markers?: readonly PlotMarker[];
  /** The x axis's extent, when it should be fixed rather than follow the data (a snippet's whole window); not for zoomable plots. */
  xMin?: number;
  xMax?: number;
  /** The y axis's extent, when it should be fixed (a probability from 0 to 1) rather than follow the data. */
  yMin?: number;
  yMax?: number;
  /** A line drawn over the points, such as binned means. */
  line?: PlotLine | null;
  height?: number;
  /** A tap or click on the chart (not a drag), with the x value under it. */
  onTap?: (x: number) => void;
  /** The x value under the pointer while it is over the chart, null when it leaves. */
  onHover?: (x: number | null) => void;
  /** The visible x range and the plotting area's place, whenever either changes: for a strip lined up under the chart. */
  onView?: (view: PlotView) => void;
  /** Replaces the read-out under the chart (the Deck keeps its own controls there). */
  hideReadout?: boolean;
  /** Drag across to zoom into a time range; double-click or the reset button to see it all again. */
  zoomable?: boolean;
  /** Unit words for the cursor read-out, e.g. "h" and "ppm". */
  xUnit?: string;
  yUnit?: string;
}

/**
 * A light curve drawn with uPlot on our tokens: slate points, amber for dips and marks, monospace
 * numbers. Wrapped in its own error boundary so a plot that cannot draw leaves the page readable.
 */
export function LightCurvePlot(props: LightCurvePlotProps) {
  return (
    <ErrorBoundary
      fallback={(_error, reset) => (
        <Alert tone="danger" title="The light curve could not be drawn">
          <p>The numbers are still listed on this page.</p>
          <Button variant="secondary" className="mt-2" onClick={reset}>
            Try again
          </Button>
        </Alert>
      )}
    >
      <PlotCanvas {...props} />
    </ErrorBoundary>
  );
}

const toneColours = {
  amber: { fill: hexAlpha(palette.amber, 0.16), strong: hexAlpha(palette.amber, 0.3), edge: palette.amber },
  slate: { fill: hexAlpha(palette.slate, 0.1), strong: hexAlpha(palette.slate, 0.24), edge: palette.slate },
  muted: { fill: hexAlpha(palette.edge, 0.08), strong: hexAlpha(palette.edge, 0.2), edge: palette.edge },
} as const;

function hexAlpha(hex: string, alpha: number): string {
  const value = Number.parseInt(hex.slice(1), 16);
  return `rgba(${(value >> 16) & 255}, ${(value >> 8) & 255}, ${value & 255}, ${alpha})`;
}

// Stable defaults, so a plot without overlays does not redraw on every render.
const noBands: readonly PlotBand[] = [];
const noMarkers: readonly PlotMarker[] = [];

const axisFont = `11px ${fonts.mono}`;
const labelFont = `500 12px ${fonts.sans}`;

function PlotCanvas({
  x,
  y,
  xLabel,
  yLabel,
  label,
  bands = noBands,
  markers = noMarkers,
  line = null,
  xMin,
  xMax,
  yMin,
  yMax,
  height = 280,
  zoomable = false,
  xUnit = '',
  yUnit = '',
  onTap,
  onHover,
  onView,
  hideReadout = false,
}: LightCurvePlotProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const readoutRef = useRef<HTMLParagraphElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  // Bands and markers are read by the draw hooks, so a new selection redraws without a new chart.
  const overlayRef = useRef({ bands, markers, line });
  // Callbacks change identity on every render of the parent; the chart reads the latest through a ref.
  const handlersRef = useRef({ onTap, onHover, onView });
  handlersRef.current = { onTap, onHover, onView };
  const [zoomed, setZoomed] = useState(false);
  const hintId = useId();

  // The points, and the x extent, go to the chart in place: making a chart costs a phone tens of
  // milliseconds, and the Deck shows a new snippet after every verdict.
  const data = useMemo(
    () => ({ xs: Float64Array.from(x), ys: y.map((value) => (value === null ? null : value)) }),
    [x, y],
  );
  const dataRef = useRef({ data, xMin, xMax, yMin, yMax });
  const fixedRange = xMin !== undefined && xMax !== undefined;
  const fixedYRange = yMin !== undefined && yMax !== undefined;
  const pointSize = x.length > 4000 ? 2 : x.length > 800 ? 3 : 4;

  // Declared before the chart's own effect, so a new chart draws with the overlays of this render.
  useEffect(() => {
    overlayRef.current = { bands, markers, line };
    plotRef.current?.redraw(false, false);
  }, [bands, markers, line]);

  useEffect(() => {
    dataRef.current = { data, xMin, xMax, yMin, yMax };
    const plot = plotRef.current;
    if (!plot || plot.data[0] === data.xs) return;
    plot.setData([data.xs, data.ys] as uPlot.AlignedData);
    setZoomed(false);
  }, [data, xMin, xMax, yMin, yMax]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return;
    const width = Math.max(200, container.clientWidth);
    const { xs, ys } = dataRef.current.data;
    const current = () => dataRef.current.data;

    const drawBands = (u: uPlot) => {
      const { ctx, bbox } = u;
      const { bands: current } = overlayRef.current;
      if (current.length === 0) return;
      ctx.save();
      ctx.beginPath();
      ctx.rect(bbox.left, bbox.top, bbox.width, bbox.height);
      ctx.clip();
      for (const band of current) {
        const left = u.valToPos(band.start, 'x', true);
        const right = u.valToPos(band.end, 'x', true);
        if (right < bbox.left || left > bbox.left + bbox.width) continue;
        const colours = toneColours[band.tone];
        ctx.fillStyle = band.emphasis ? colours.strong : colours.fill;
        ctx.fillRect(left, bbox.top, Math.max(1, right - left), bbox.height);
        ctx.strokeStyle = colours.edge;
        ctx.globalAlpha = band.emphasis ? 0.9 : 0.35;
        ctx.lineWidth = devicePixelRatio;
        ctx.beginPath();
        ctx.moveTo(Math.round(left) + 0.5, bbox.top);
        ctx.lineTo(Math.round(left) + 0.5, bbox.top + bbox.height);
        ctx.stroke();
        ctx.globalAlpha = 1;
        if (band.label && right - left > 34 * devicePixelRatio) {
          ctx.fillStyle = band.tone === 'amber' ? palette.amberInk : palette.slate;
          ctx.font = `${10 * devicePixelRatio}px ${fonts.mono}`;
          ctx.textBaseline = 'top';
          ctx.textAlign = 'left';
          ctx.fillText(band.label, left + 4 * devicePixelRatio, bbox.top + 4 * devicePixelRatio);
        }
      }
      ctx.restore();
    };

    const drawLine = (u: uPlot) => {
      const { ctx, bbox } = u;
      const { line: current } = overlayRef.current;
      if (!current || current.x.length < 2) return;
      ctx.save();
      ctx.beginPath();
      ctx.rect(bbox.left, bbox.top, bbox.width, bbox.height);
      ctx.clip();
      ctx.strokeStyle = palette.ink;
      ctx.globalAlpha = 0.85;
      ctx.lineWidth = 2 * devicePixelRatio;
      ctx.lineJoin = 'round';
      ctx.beginPath();
      let broken = true;
      current.x.forEach((xValue, index) => {
        const yValue = current.y[index]!;
        if (!Number.isFinite(yValue)) {
          broken = true;
          return;
        }
        const left = u.valToPos(xValue, 'x', true);
        const top = u.valToPos(yValue, 'y', true);
        if (broken) ctx.moveTo(left, top);
        else ctx.lineTo(left, top);
        broken = false;
      });
      ctx.stroke();
      ctx.restore();
    };

    const drawMarkers = (u: uPlot) => {
      const { ctx, bbox } = u;
      const { markers: current } = overlayRef.current;
      if (current.length === 0) return;
      ctx.save();
      ctx.beginPath();
      ctx.rect(bbox.left, bbox.top, bbox.width, bbox.height);
      ctx.clip();
      const ratio = devicePixelRatio;
      for (const marker of current) {
        const left = u.valToPos(marker.x, 'x', true);
        if (left < bbox.left || left > bbox.left + bbox.width) continue;
        if (marker.tone === 'ink') {
          // A cursor: a thin solid line that points at a time without looking like a mark.
          ctx.strokeStyle = palette.ink;
          ctx.lineWidth = 1.5 * ratio;
          ctx.beginPath();
          ctx.moveTo(left, bbox.top);
          ctx.lineTo(left, bbox.top + bbox.height);
          ctx.stroke();
          continue;
        }
        ctx.strokeStyle = palette.amber;
        ctx.fillStyle = palette.amber;
        ctx.lineWidth = 2 * ratio;
        ctx.setLineDash([4 * ratio, 4 * ratio]);
        ctx.beginPath();
        ctx.moveTo(left, bbox.top + 12 * ratio);
        ctx.lineTo(left, bbox.top + bbox.height);
        ctx.stroke();
        ctx.setLineDash([]);
        // The same downward triangle the home page's sketch uses for a mark.
        ctx.beginPath();
        ctx.moveTo(left - 6 * ratio, bbox.top + 2 * ratio);
        ctx.lineTo(left + 6 * ratio, bbox.top + 2 * ratio);
        ctx.lineTo(left, bbox.top + 11 * ratio);
        ctx.closePath();
        ctx.fill();
        if (marker.label) {
          ctx.fillStyle = palette.amberInk;
          ctx.font = `${10 * ratio}px ${fonts.mono}`;
          ctx.textBaseline = 'top';
          ctx.textAlign = 'left';
          ctx.fillText(marker.label, left + 8 * ratio, bbox.top + 2 * ratio);
        }
      }
      ctx.restore();
    };

    const reportView = (u: uPlot) => {
      const report = handlersRef.current.onView;
      const min = u.scales.x?.min;
      const max = u.scales.x?.max;
      if (!report || min === undefined || max === undefined) return;
      report({
        xMin: min,
        xMax: max,
        leftPx: u.bbox.left / devicePixelRatio,
        widthPx: u.bbox.width / devicePixelRatio,
      });
    };

    const options: uPlot.Options = {
      width,
      height,
      legend: { show: false },
      padding: [12, 12, 0, 0],
      scales: {
        x: {
          time: false,
          ...(fixedRange
            ? {
                range: (_u, dataMin, dataMax): uPlot.Range.MinMax => {
                  const { xMin: min, xMax: max } = dataRef.current;
                  return min !== undefined && max !== undefined && max > min
                    ? [min, max]
                    : [dataMin, dataMax];
                },
              }
            : {}),
        },
        y: fixedYRange
          ? {
              range: (_u, dataMin, dataMax): uPlot.Range.MinMax => {
                const { yMin: min, yMax: max } = dataRef.current;
                return min !== undefined && max !== undefined && max > min ? [min, max] : [dataMin, dataMax];
              },
            }
          : { auto: true },
      },
      cursor: {
        drag: { x: zoomable, y: false, setScale: zoomable },
        points: { show: false },
        // Without zoom there is nothing to reset, and a double-click should not do anything surprising.
        ...(zoomable ? {} : { bind: { dblclick: () => () => null } }),
      },
      select: { show: zoomable, left: 0, top: 0, width: 0, height: 0 },
      axes: [
        {
          label: xLabel,
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          grid: { stroke: palette.line, width: 1 },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          values: (_u, splits) => formatTicks(splits),
        },
        {
          label: yLabel,
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          size: 64,
          grid: { stroke: palette.line, width: 1 },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          values: (_u, splits) => formatTicks(splits),
        },
      ],
      series: [
        {},
        {
          label: yLabel,
          stroke: palette.slate,
          // Photometry is read as points; a line through noise suggests structure that is not there.
          paths: () => null,
          points: { show: true, size: pointSize, width: 0, fill: hexAlpha(palette.slate, 0.8), space: 0 },
        },
      ],
      hooks: {
        ready: [reportView],
        setSize: [reportView],
        drawClear: [drawBands],
        draw: [drawLine, drawMarkers],
        setScale: [
          (u, key) => {
            if (key !== 'x') return;
            const min = u.scales.x?.min ?? 0;
            const max = u.scales.x?.max ?? 0;
            const { xs: shown } = current();
            const first = shown[0] ?? 0;
            const last = shown[shown.length - 1] ?? 0;
            setZoomed(min > first + 1e-9 || max < last - 1e-9);
            reportView(u);
          },
        ],
        setCursor: [
          (u) => {
            const hover = handlersRef.current.onHover;
            if (hover) {
              const left = u.cursor.left;
              hover(left === undefined || left < 0 ? null : u.posToVal(left, 'x'));
            }
            const readout = readoutRef.current;
            if (!readout) return;
            const index = u.cursor.idx;
            if (index === null || index === undefined) {
              readout.textContent = '\u00a0';
              return;
            }
            const xValue = current().xs[index];
            const yValue = current().ys[index];
            const xSpan = (u.scales.x?.max ?? 0) - (u.scales.x?.min ?? 0);
            const ySpan = (u.scales.y?.max ?? 0) - (u.scales.y?.min ?? 0);
            readout.textContent =
              xValue === undefined
                ? '\u00a0'
                : `${formatTick(xValue, xSpan, 2)} ${xUnit} · ${
                    yValue === null || yValue === undefined
                      ? 'no point'
                      : `${formatTick(yValue, ySpan, 1)} ${yUnit}`
                  }`;
          },
        ],
      },
    };

    const plot = new uPlot(options, [xs, ys] as uPlot.AlignedData, container);
    plotRef.current = plot;
    setZoomed(false);

    // A tap is a press and release close together; anything longer is a drag (of the Deck's card).
    let pressed: { x: number; y: number } | null = null;
    const over = plot.over;
    const onPointerDown = (event: PointerEvent) => {
      pressed = { x: event.clientX, y: event.clientY };
    };
    const onPointerUp = (event: PointerEvent) => {
      const start = pressed;
      pressed = null;
      const tap = handlersRef.current.onTap;
      if (!start || !tap || Math.hypot(event.clientX - start.x, event.clientY - start.y) > 10) return;
      const rect = over.getBoundingClientRect();
      tap(plot.posToVal(event.clientX - rect.left, 'x'));
    };
    over.addEventListener('pointerdown', onPointerDown);
    over.addEventListener('pointerup', onPointerUp);

    const observer = new ResizeObserver(() => {
      const next = Math.max(200, container.clientWidth);
      if (next !== plot.width) plot.setSize({ width: next, height });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      over.removeEventListener('pointerdown', onPointerDown);
      over.removeEventListener('pointerup', onPointerUp);
      plot.destroy();
      plotRef.current = null;
    };
  }, [xLabel, yLabel, height, zoomable, xUnit, yUnit, fixedRange, fixedYRange, pointSize]);

  function resetZoom() {
    const plot = plotRef.current;
    if (!plot || x.length === 0) return;
    plot.setScale('x', { min: x[0]!, max: x[x.length - 1]! });
  }

  return (
    <figure className="light-curve-plot flex min-w-0 flex-col gap-2">
      <div
        ref={containerRef}
        role="img"
        aria-label={label}
        aria-describedby={zoomable ? hintId : undefined}
        className="w-full min-w-0 touch-pan-y"
      />
      <figcaption
        className={`flex flex-wrap items-center justify-between gap-x-4 gap-y-1 ${hideReadout ? 'sr-only' : ''}`}
      >
        <p ref={readoutRef} aria-hidden="true" className="tabular min-h-5 text-xs text-slate">
          {'\u00a0'}
        </p>
        {zoomable ? (
          <span className="flex flex-wrap items-center gap-3">
            <span id={hintId} className="text-xs text-muted">
              Drag across the chart to zoom; double-click to see it all.
            </span>
            <Button variant="secondary" disabled={!zoomed} onClick={resetZoom} className="text-sm">
              Reset zoom
            </Button>
          </span>
        ) : null}
      </figcaption>
    </figure>
  );
}
