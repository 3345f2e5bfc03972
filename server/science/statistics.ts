// Small robust statistics shared by the science modules.

/** Median of the values (NaN for none). Does not change its input. */
export function median(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) return Number.NaN;
  const copy = Float64Array.from(values);
  return medianInPlace(copy, n);
}

/** Median of the first `n` values of `scratch`, reordering them (quickselect, expected O(n)). */
export function medianInPlace(scratch: Float64Array, n: number): number {
  if (n === 0) return Number.NaN;
  const mid = n >> 1;
  const upper = select(scratch, 0, n - 1, mid);
  if (n % 2 === 1) return upper;
  // The lower middle is the largest value left of `mid` after selection.
  let lower = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < mid; i += 1) if (scratch[i]! > lower) lower = scratch[i]!;
  return (lower + upper) / 2;
}

// Hoare's selection: after it, scratch[k] holds the k-th smallest and smaller values lie left of it.
function select(a: Float64Array, left: number, right: number, k: number): number {
  let lo = left;
  let hi = right;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1]!;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (a[i]! < pivot) i += 1;
      while (a[j]! > pivot) j -= 1;
      if (i <= j) {
        const t = a[i]!;
        a[i] = a[j]!;
        a[j] = t;
        i += 1;
        j -= 1;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return a[k]!;
  }
  return a[k]!;
}

// 1.4826 makes the median absolute deviation estimate σ for Gaussian data (1/Φ⁻¹(3/4)).
export const MAD_TO_SIGMA = 1.4826;

/** Median absolute deviation about the median, scaled to a Gaussian σ. */
export function robustSigma(values: ArrayLike<number>): number {
  const center = median(values);
  const deviations = new Float64Array(values.length);
  for (let i = 0; i < values.length; i += 1) deviations[i] = Math.abs(values[i]! - center);
  return MAD_TO_SIGMA * medianInPlace(deviations, deviations.length);
}

/** The median spacing of sorted times: the cadence, robust to gaps. */
export function medianCadence(timeDays: ArrayLike<number>): number {
  const n = timeDays.length;
  if (n < 2) return Number.NaN;
  const steps = new Float64Array(n - 1);
  for (let i = 1; i < n; i += 1) steps[i - 1] = timeDays[i]! - timeDays[i - 1]!;
  return medianInPlace(steps, n - 1);
}
