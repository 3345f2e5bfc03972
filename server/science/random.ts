// Deterministic pseudo-random numbers for the synthetic survey, planting and tests: the same seed
// always gives the same sequence, on every machine.

export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [min, max). */
  uniform(min: number, max: number): number;
  /** Log-uniform in [min, max), both > 0. */
  logUniform(min: number, max: number): number;
  /** Normal with the given mean and standard deviation. */
  normal(mean?: number, sd?: number): number;
  /** Integer in [min, max] inclusive. */
  int(min: number, max: number): number;
  pick<T>(items: readonly T[]): T;
  /** A new generator whose sequence depends only on this one's seed and the label. */
  fork(label: string): Random;
}

// mulberry32 (Tommy Ettinger's 32-bit generator): small, fast, statistically fine for simulation.
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

// FNV-1a, to turn labels into seeds.
function hashString(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i += 1) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash >>> 0;
}

export function createRandom(seed: number | string): Random {
  const seedNumber = typeof seed === 'number' ? seed >>> 0 : hashString(seed);
  const next = mulberry32(seedNumber);
  let spare: number | null = null;
  const random: Random = {
    next,
    uniform: (min, max) => min + (max - min) * next(),
    logUniform: (min, max) => Math.exp(Math.log(min) + (Math.log(max) - Math.log(min)) * next()),
    normal(mean = 0, sd = 1) {
      // Box–Muller, keeping the second value for the next call.
      if (spare !== null) {
        const value = spare;
        spare = null;
        return mean + sd * value;
      }
      let u = 0;
      while (u === 0) u = next();
      const v = next();
      const radius = Math.sqrt(-2 * Math.log(u));
      spare = radius * Math.sin(2 * Math.PI * v);
      return mean + sd * radius * Math.cos(2 * Math.PI * v);
    },
    int: (min, max) => min + Math.floor(next() * (max - min + 1)),
    pick: (items) => items[Math.floor(next() * items.length)]!,
    fork: (label) => createRandom(hashString(`${seedNumber}:${label}`)),
  };
  return random;
}
