/**
 * The first-run guide's example cards: invented light curves made here from a seed, so the guide looks
 * the same every time and needs no server. None of them is a real star.
 */

export type ExampleKind = 'transit' | 'eclipsing-binary' | 'jump-after-gap' | 'flat';

export interface ExampleCard {
  kind: ExampleKind;
  hours: number[];
  ppm: number[];
  durationHours: number;
  cadenceMinutes: number;
}

/** mulberry32: a tiny seeded generator, plenty for drawing noise. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 2 ** 32;
  };
}

/** Normal noise by Box–Muller. */
function gaussian(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

const durationHours = 12;
const cadenceMinutes = 6;
const noisePpm = 260;

function shapeAt(kind: ExampleKind, hour: number): number {
  if (kind === 'transit') {
    // Flat-bottomed: 2.6 h long with 25-minute ingress and egress, 1,400 ppm deep.
    const fromCentre = Math.abs(hour - 6.4);
    const half = 1.3;
    const ramp = 0.42;
    if (fromCentre >= half) return 0;
    return -1400 * Math.min(1, (half - fromCentre) / ramp);
  }
  if (kind === 'eclipsing-binary') {
    // V-shaped and deep: two stars eclipsing each other graze with no flat bottom.
    const fromCentre = Math.abs(hour - 5.6);
    return fromCentre >= 1.6 ? 0 : -6200 * (1 - fromCentre / 1.6);
  }
  if (kind === 'jump-after-gap') return hour > 7.4 ? 1100 : 0;
  return 0;
}

export function makeExample(kind: ExampleKind, seed: number): ExampleCard {
  const random = seededRandom(seed);
  const hours: number[] = [];
  const ppm: number[] = [];
  const steps = Math.round((durationHours * 60) / cadenceMinutes);
  for (let step = 0; step <= steps; step += 1) {
    const hour = (step * cadenceMinutes) / 60;
    // The instrument stopped for a while: the jump after it is the instrument, not the star.
    if (kind === 'jump-after-gap' && hour > 5.2 && hour < 7.4) continue;
    hours.push(Math.round(hour * 1e4) / 1e4);
    ppm.push(Math.round(shapeAt(kind, hour) + noisePpm * gaussian(random)));
  }
  return { kind, hours, ppm, durationHours, cadenceMinutes };
}

export const exampleKinds: readonly ExampleKind[] = ['transit', 'eclipsing-binary', 'jump-after-gap', 'flat'];

/** The guide's four cards, the same for the same seed. */
export function makeGuideExamples(seed = 2024): ExampleCard[] {
  return exampleKinds.map((kind, index) => makeExample(kind, seed + index * 7919));
}
