import 'uplot/dist/uPlot.min.css';
import { useEffect, useId, useRef, useState } from 'react';
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
  height?: number;
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
  height = 280,
  zoomable = false,
  xUnit = '',
  yUnit = '',
}: LightCurvePlotProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const readoutRef = useRef<HTMLParagraphElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  // Bands and markers are read by the draw hooks, so a new selection redraws without a new chart.
  const overlayRef = useRef({ bands, markers });
  const [zoomed, setZoomed] = useState(false);
  const hintId = useId();

  // Declared before the chart's own effect, so a new chart draws with the overlays of this render.
  useEffect(() => {
    overlayRef.current = { bands, markers };
    plotRef.current?.redraw(false, false);
  }, [bands, markers]);

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return;
    const xs = Float64Array.from(x);
    const ys = y.map((value) => (value === null ? null : value));
    const pointSize = x.length > 4000 ? 2 : x.length > 800 ? 3 : 4;
    const width = Math.max(200, container.clientWidth);

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

    const options: uPlot.Options = {
      width,
      height,
      legend: { show: false },
      padding: [12, 12, 0, 0],
      scales: { x: { time: false }, y: { auto: true } },
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
        drawClear: [drawBands],
        draw: [drawMarkers],
        setScale: [
          (u, key) => {
            if (key !== 'x') return;
            const min = u.scales.x?.min ?? 0;
            const max = u.scales.x?.max ?? 0;
            const first = xs[0] ?? 0;
            const last = xs[xs.length - 1] ?? 0;
            setZoomed(min > first + 1e-9 || max < last - 1e-9);
          },
        ],
        setCursor: [
          (u) => {
            const readout = readoutRef.current;
            if (!readout) return;
            const index = u.cursor.idx;
            if (index === null || index === undefined) {
              readout.textContent = '\u00a0';
              return;
            }
            const xValue = xs[index];
            const yValue = ys[index];
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

    const observer = new ResizeObserver(() => {
      const next = Math.max(200, container.clientWidth);
      if (next !== plot.width) plot.setSize({ width: next, height });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      plot.destroy();
      plotRef.current = null;
    };
  }, [x, y, xLabel, yLabel, height, zoomable, xUnit, yUnit]);

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
      <figcaption className="flex flex-wrap items-center justify-between gap-x-4 gap-y-1">
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
