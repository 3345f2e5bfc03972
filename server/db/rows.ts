// Column values come back differently from SQLite (text, 0/1) and PostgreSQL (Date, boolean, parsed
// JSON); repositories pass them through these so callers always see one shape.

export function toIso(value: unknown): string {
  if (value instanceof Date) return value.toISOString();
  if (typeof value === 'number') return new Date(value).toISOString();
  return String(value);
}

export function toIsoOrNull(value: unknown): string | null {
  return value === null || value === undefined ? null : toIso(value);
}

export function toBool(value: unknown): boolean {
  return value === true || value === 1 || value === '1' || value === 't';
}

export function fromJson<T>(value: unknown, fallback: T): T {
  if (value === null || value === undefined) return fallback;
  if (typeof value === 'string') return JSON.parse(value) as T;
  return value as T;
}

export const nowIso = (): string => new Date().toISOString();
