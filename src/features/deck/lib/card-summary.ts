import type { Card } from './cards';

const number = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 1 });

/** Gaps in the data at least this long are worth saying, in cadences. */
const gapInCadences = 5;

export function formatHours(hours: number): string {
  return `${number.format(Math.round(hours * 10) / 10)} h`;
}

/** Stretches with no measurements, as the chart shows them; a gap is not a verdict on the star. */
export function gapsOf(
  card: Pick<Card, 'hours' | 'cadenceMinutes'>,
): { fromHours: number; toHours: number }[] {
  const cadenceHours = (card.cadenceMinutes ?? 0) / 60;
  if (!(cadenceHours > 0)) return [];
  const gaps: { fromHours: number; toHours: number }[] = [];
  for (let index = 1; index < card.hours.length; index += 1) {
    const before = card.hours[index - 1]!;
    const after = card.hours[index]!;
    if (after - before > cadenceHours * gapInCadences) gaps.push({ fromHours: before, toHours: after });
  }
  return gaps;
}

/**
 * A text account of what the chart shows, for people who do not see it. It describes and never judges:
 * span, cadence, how many points and where data is missing, but never where the faintest points are,
 * which would answer the question for the reader.
 */
export function describeCard(card: Card): string {
  const parts = [
    `Brightness of one star over ${formatHours(card.durationHours)}`,
    `${card.hours.length} points plotted of ${card.pointCount} measured`,
    card.cadenceMinutes === null
      ? 'uneven cadence'
      : `one measurement every ${number.format(card.cadenceMinutes)} minutes`,
  ];
  const gaps = gapsOf(card);
  if (gaps.length > 0) {
    parts.push(
      gaps.length === 1
        ? `no data from ${formatHours(gaps[0]!.fromHours)} to ${formatHours(gaps[0]!.toHours)}`
        : `${gaps.length} gaps in the data`,
    );
  }
  return `${parts.join('; ')}.`;
}
