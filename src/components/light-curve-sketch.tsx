import { useMemo } from 'react';

interface LightCurveSketchProps {
  /** Whether the sketch shows a transit-shaped dip, with its mark, or only flat noise. */
  dip?: boolean;
  /** A strip is a lower drawing for card headers. */
  shape?: 'wide' | 'strip';
  seed?: number;
  className?: string;
}

const width = 600;
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
export function LightCurveSketch({
  dip = true,
  shape = 'wide',
  seed = 7,
  className = '',
}: LightCurveSketchProps) {
  const height = shape === 'strip' ? 100 : 160;
  const points = useMemo(() => {
    const random = noise(seed);
    const centre = count * 0.56;
    const halfWidth = 9;
    const baseline = height * (dip ? 0.36 : 0.5);
    return Array.from({ length: count }, (_, index) => {
      const x = 12 + (index / (count - 1)) * (width - 24);
      const distance = Math.abs(index - centre);
      // A trapezoid with short ingress and egress, about the shape a planet makes crossing its star.
      const depth = dip ? Math.max(0, Math.min(1, (halfWidth - distance) / 3)) * height * 0.29 : 0;
      const y = baseline + depth + random() * height * 0.09;
      return { x, y, inDip: depth > 0 };
    });
  }, [dip, seed, height]);

  const dipStart = points.find((point) => point.inDip)?.x ?? 0;
  const dipEnd = [...points].reverse().find((point) => point.inDip)?.x ?? 0;
  const markX = (dipStart + dipEnd) / 2;

  return (
    <svg viewBox={`0 0 ${width} ${height}`} className={className} aria-hidden="true">
      {[0.25, 0.5, 0.75].map((fraction) => (
        <line
          key={fraction}
          x1="0"
          x2={width}
          y1={height * fraction}
          y2={height * fraction}
          className="stroke-line"
          strokeWidth="1"
        />
      ))}
      {dip ? (
        <rect
          x={dipStart - 8}
          y="6"
          width={dipEnd - dipStart + 16}
          height={height - 12}
          rx="6"
          className="fill-amber-wash"
        />
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
          <line x1={markX} x2={markX} y1="14" y2={height - 12} strokeWidth="2" strokeDasharray="4 4" />
          <path d={`M${markX - 7} 8 L${markX + 7} 8 L${markX} 18 Z`} className="fill-amber" strokeWidth="0" />
        </g>
      ) : null}
    </svg>
  );
}
