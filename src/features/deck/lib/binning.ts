/**
 * The binned line drawn over a card's points: the mean brightness in equal time bins, so a few-hour dip
 * stands out of the point-to-point noise without smoothing it away.
 */
export function binSeries(
  hours: readonly number[],
  ppm: readonly number[],
  binHours: number,
): { hours: number[]; ppm: number[] } {
  const out = { hours: [] as number[], ppm: [] as number[] };
  if (hours.length === 0 || !(binHours > 0)) return out;
  const start = hours[0]!;
  let bin = 0;
  let sum = 0;
  let count = 0;
  let timeSum = 0;
  const push = () => {
    if (count === 0) return;
    out.hours.push(Math.round((timeSum / count) * 1e4) / 1e4);
    out.ppm.push(Math.round(sum / count));
  };
  for (let index = 0; index < hours.length; index += 1) {
    const value = ppm[index];
    if (value === undefined || !Number.isFinite(value)) continue;
    const here = Math.floor((hours[index]! - start) / binHours);
    if (here !== bin) {
      push();
      bin = here;
      sum = 0;
      count = 0;
      timeSum = 0;
    }
    sum += value;
    timeSum += hours[index]!;
    count += 1;
  }
  push();
  return out;
}

/**
 * Puts a break (NaN) into a binned line wherever neighbouring bins are further apart than `maxStepHours`,
 * so the line does not draw a straight bridge across a gap in the data.
 */
export function breakAtGaps(line: { hours: number[]; ppm: number[] }, maxStepHours: number) {
  const out = { hours: [] as number[], ppm: [] as number[] };
  line.hours.forEach((hour, index) => {
    const before = line.hours[index - 1];
    if (before !== undefined && hour - before > maxStepHours) {
      out.hours.push((hour + before) / 2);
      out.ppm.push(Number.NaN);
    }
    out.hours.push(hour);
    out.ppm.push(line.ppm[index]!);
  });
  return out;
}

/** About 40 bins across a card, but never narrower than three points of its cadence. */
export function binWidthHours(durationHours: number, cadenceMinutes: number | null): number {
  const byCount = durationHours / 40;
  const byCadence = cadenceMinutes ? (cadenceMinutes * 3) / 60 : 0;
  return Math.max(byCount, byCadence, 1e-3);
}
