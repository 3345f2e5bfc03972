import { useMemo } from 'react';

interface LightCurveSketchProps {
  /** Whether the sketch shows a transit-shaped dip, with its mark, or only flat noise. */
  dip?: boolean;
  seed?: number;
  className?: string;
  title?: string;
}

const width = 600;
const height = 160;
const count = 120;

/** Small deterministic generator so the drawing is the same on every render and in screenshots. */
function noise(seed: number): () => number {
  let state = seed >>> 0 || 1;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/** A drawn, invented light curve: decoration for empty states and the home page, not data. */
export function LightCurveSketch({ dip = true, seed = 7, className = '', title }: LightCurveSketchProps) {
  const points = useMemo(() => {
    const random = noise(seed);
    const centre = count * 0.56;
    const halfWidth = 9;
    return Array.from({ length: count }, (_, index) => {
      const x = 12 + (index / (count - 1)) * (width - 24);
      const distance = Math.abs(index - centre);
      // A trapezoid with short ingress and egress, about the shape a planet makes crossing its star.
      const depth = dip ? Math.max(0, Math.min(1, (halfWidth - distance) / 3)) * 46 : 0;
      const y = 58 + depth + random() * 14;
      return { x, y, inDip: depth > 0 };
    });
  }, [dip, seed]);

  const dipStart = points.find((point) => point.inDip)?.x ?? 0;
  const dipEnd = [...points].reverse().find((point) => point.inDip)?.x ?? 0;
  const markX = (dipStart + dipEnd) / 2;

  return (
    <svg
      viewBox={`0 0 ${width} ${height}`}
      className={className}
      role={title ? 'img' : undefined}
      aria-hidden={title ? undefined : true}
      preserveAspectRatio="none"
    >
      {title ? <title>{title}</title> : null}
      {[40, 80, 120].map((y) => (
        <line key={y} x1="0" x2={width} y1={y} y2={y} className="stroke-line" strokeWidth="1" />
      ))}
      {dip ? (
        <rect x={dipStart - 8} y="8" width={dipEnd - dipStart + 16} height={height - 16} rx="6" className="fill-amber-wash" />
      ) : null}
      {points.map((point) => (
        <circle
          key={point.x}
          cx={point.x}
          cy={point.y}
          r="2.6"
          className={point.inDip ? 'fill-amber' : 'fill-slate'}
          opacity={point.inDip ? 1 : 0.75}
        />
      ))}
      {dip ? (
        <g className="stroke-amber">
          <line x1={markX} x2={markX} y1="14" y2={height - 14} strokeWidth="2" strokeDasharray="4 4" />
          <path d={`M${markX - 7} 10 L${markX + 7} 10 L${markX} 20 Z`} className="fill-amber" strokeWidth="0" />
        </g>
      ) : null}
    </svg>
  );
}
