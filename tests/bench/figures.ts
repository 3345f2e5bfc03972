/** One measured figure, printed as `name: value unit` on a line of its own. */
export interface Figure {
  name: string;
  value: number;
  unit: string;
}

export function formatFigure({ name, value, unit }: Figure): string {
  const rounded = Math.abs(value) >= 100 ? Math.round(value) : Number(value.toPrecision(3));
  return `${name}: ${rounded}${unit ? ` ${unit}` : ''}`;
}

export function percentile(sortedValues: number[], p: number): number {
  if (sortedValues.length === 0) return Number.NaN;
  const index = Math.min(sortedValues.length - 1, Math.ceil((p / 100) * sortedValues.length) - 1);
  return sortedValues[Math.max(0, index)]!;
}
