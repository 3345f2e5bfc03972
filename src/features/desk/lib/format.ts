const countFormat = new Intl.NumberFormat('en-GB');
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

export function formatCount(value: number): string {
  return countFormat.format(value);
}

/** "1 split snippet", "3 split snippets". */
export function plural(count: number, one: string, many = `${one}s`): string {
  return `${formatCount(count)} ${count === 1 ? one : many}`;
}

export function formatDateTime(iso: string | null): string {
  if (!iso) return '—';
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTimeFormat.format(date);
}

/** A probability as the Desk writes it: two decimals, or a dash when there is none. */
export function formatScore(score: number | null): string {
  return score === null ? '—' : score.toFixed(2);
}

export function formatShare(share: number | null): string {
  return share === null ? '—' : `${Math.round(share * 100)} %`;
}

/** A time in hours from the snippet's start, with a minus sign for before it. */
export function formatHours(hours: number | null, digits = 1): string {
  if (hours === null) return '—';
  return `${hours.toFixed(digits).replace(/^-/, '−')} h`;
}

/** A signed log-odds weight: +1.24 for evidence of a dip, −0.80 for evidence of flat. */
export function formatWeight(weight: number): string {
  const text = Math.abs(weight).toFixed(2);
  if (Number(text) === 0) return '0.00';
  return weight > 0 ? `+${text}` : `−${text}`;
}

export function formatMs(ms: number | null): string {
  if (ms === null) return '—';
  return ms < 10_000 ? `${(ms / 1000).toFixed(1)} s` : `${Math.round(ms / 1000)} s`;
}
