import 'uplot/dist/uPlot.min.css';
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import { fonts, palette } from '@/config/design-tokens';
import { formatTicks } from '@/lib/light-curve';

export interface PeriodogramMark {
  periodDays: number;
  label: string;
  /** The best period is drawn solid and amber; its half and double dashed, in slate. */
  strong?: boolean;
}

interface PeriodogramChartProps {
  periodsDays: readonly number[];
  power: readonly number[];
  marks: readonly PeriodogramMark[];
  /** The chart's accessible name, with the numbers it shows. */
  label: string;
  height?: number;
}

const axisFont = `11px ${fonts.mono}`;
const labelFont = `500 12px ${fonts.sans}`;

/**
 * A BLS periodogram drawn as a line (LightCurvePlot draws points, which suit photometry, not a
 * spectrum), with vertical marks at the best period and its harmonics.
 */
export function PeriodogramChart({ periodsDays, power, marks, label, height = 260 }: PeriodogramChartProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const marksRef = useRef(marks);
  marksRef.current = marks;

  useEffect(() => {
    const container = containerRef.current;
    if (!container) return;
    const drawMarks = (u: uPlot) => {
      const { ctx, bbox } = u;
      const ratio = devicePixelRatio;
      ctx.save();
      ctx.beginPath();
      ctx.rect(bbox.left, bbox.top, bbox.width, bbox.height);
      ctx.clip();
      for (const mark of marksRef.current) {
        const left = u.valToPos(mark.periodDays, 'x', true);
        if (left < bbox.left || left > bbox.left + bbox.width) continue;
        ctx.strokeStyle = mark.strong ? palette.amber : palette.slate;
        ctx.lineWidth = (mark.strong ? 2 : 1.5) * ratio;
        ctx.setLineDash(mark.strong ? [] : [5 * ratio, 4 * ratio]);
        ctx.beginPath();
        ctx.moveTo(left, bbox.top + 14 * ratio);
        ctx.lineTo(left, bbox.top + bbox.height);
        ctx.stroke();
        ctx.setLineDash([]);
        ctx.fillStyle = mark.strong ? palette.amberInk : palette.slate;
        ctx.font = `600 ${11 * ratio}px ${fonts.mono}`;
        ctx.textBaseline = 'top';
        ctx.textAlign = 'center';
        ctx.fillText(mark.label, left, bbox.top + 1 * ratio);
      }
      ctx.restore();
    };
    const options: uPlot.Options = {
      width: Math.max(200, container.clientWidth),
      height,
      legend: { show: false },
      padding: [16, 12, 0, 0],
      scales: { x: { time: false }, y: { auto: true } },
      cursor: { drag: { x: false, y: false }, points: { show: false } },
      select: { show: false, left: 0, top: 0, width: 0, height: 0 },
      axes: [
        {
          label: 'period (days)',
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          grid: { stroke: palette.line, width: 1 },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          values: (_u, splits) => formatTicks(splits),
        },
        {
          label: 'BLS power (Δ log-likelihood)',
          font: axisFont,
          labelFont,
          stroke: palette.muted,
          size: 64,
          grid: { stroke: palette.line, width: 1 },
          ticks: { stroke: palette.line, width: 1, size: 4 },
          values: (_u, splits) => formatTicks(splits),
        },
      ],
      series: [{}, { label: 'power', stroke: palette.ink, width: 1.25, points: { show: false } }],
      hooks: { draw: [drawMarks] },
    };
    const plot = new uPlot(
      options,
      [Float64Array.from(periodsDays), Float64Array.from(power)] as uPlot.AlignedData,
      container,
    );
    const observer = new ResizeObserver(() => {
      const next = Math.max(200, container.clientWidth);
      if (next !== plot.width) plot.setSize({ width: next, height });
    });
    observer.observe(container);
    return () => {
      observer.disconnect();
      plot.destroy();
    };
  }, [periodsDays, power, height]);

  return <div ref={containerRef} role="img" aria-label={label} className="w-full min-w-0 touch-pan-y" />;
}
