import { performance } from 'node:perf_hooks';
import { createRandom } from '../../server/science/random';
import { totalDurationDays, transitFlux } from '../../server/science/transit-model';
import { fitTransitShape } from '../../server/science/transit-shape';
import type { Figure } from './figures';

// The V-shape check runs inside GET /api/targets/:id/vetting, so its cost is part of that request:
// a trapezoid fitted to 20,000 points (27.8 d at 2-minute cadence, a k = 0.1 planet every 3.2 d)
// folded at the period. The median of 9 runs.

const POINTS = 20_000;
const RUNS = 9;

export async function run(): Promise<Figure[]> {
  const orbit = { periodDays: 3.2, radiusRatio: 0.1, aOverRstar: 12, impact: 0.3, u1: 0.4, u2: 0.25 };
  const timeDays = Float64Array.from({ length: POINTS }, (_, i) => 1000 + (i * 2) / 60 / 24);
  const flux = transitFlux(timeDays, { ...orbit, t0Days: 1001 });
  const random = createRandom('vetting-bench');
  for (let i = 0; i < POINTS; i += 1) flux[i]! += random.normal(0, 300e-6);
  const durationHours = totalDurationDays(orbit) * 24;
  const times: number[] = [];
  for (let i = 0; i < RUNS; i += 1) {
    const start = performance.now();
    fitTransitShape({ timeDays, flux, periodDays: orbit.periodDays, t0Days: 1001, durationHours });
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return [{ name: 'vetting.shape_fit_20k_ms', value: times[Math.floor(RUNS / 2)]!, unit: 'ms' }];
}
