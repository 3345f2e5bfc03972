import { z } from 'zod';

export const targetSchema = z.object({
  id: z.number().int(),
  designation: z.string(),
  raDeg: z.number().nullable(),
  decDeg: z.number().nullable(),
  magnitude: z.number().nullable(),
  stellarRadiusRsun: z.number().nullable(),
  stellarMassMsun: z.number().nullable(),
  teffK: z.number().nullable(),
  assumedFields: z.array(z.string()),
  lightCurveCount: z.number().int(),
  snippetCount: z.number().int(),
});

export type Target = z.infer<typeof targetSchema>;

export const catalogueRowSchema = z.object({
  line: z.number().int(),
  designation: z.string().nullable(),
  status: z.enum(['accepted', 'rejected']),
  reason: z.string().optional(),
  assumed: z.array(z.string()).optional(),
});

export type CatalogueRow = z.infer<typeof catalogueRowSchema>;

export const catalogueReportSchema = z.object({
  created: z.number().int(),
  updated: z.number().int(),
  rejected: z.number().int(),
  rows: z.array(catalogueRowSchema),
});

export type CatalogueReport = z.infer<typeof catalogueReportSchema>;

/** How a stellar parameter is named to people, by the API's field name (also the names in `assumed`). */
export const stellarFieldLabels: Record<string, string> = {
  stellarRadiusRsun: 'stellar radius',
  stellarMassMsun: 'stellar mass',
  teffK: 'effective temperature',
  magnitude: 'magnitude',
  raDeg: 'RA',
  decDeg: 'Dec',
};

export function fieldLabel(field: string): string {
  return stellarFieldLabels[field] ?? field.replace(/_/g, ' ');
}

function pad(value: number, width: number, digits = 0): string {
  const text = value.toFixed(digits);
  const [whole = '', fraction] = text.split('.');
  return `${whole.padStart(width, '0')}${fraction === undefined ? '' : `.${fraction}`}`;
}

/** RA in hours, minutes and seconds, as astronomers read it (1 h = 15°). */
export function formatRa(raDeg: number | null): string {
  if (raDeg === null) return '—';
  let totalSeconds = Math.round((((raDeg % 360) + 360) % 360) * 240 * 10) / 10;
  if (totalSeconds >= 86_400) totalSeconds -= 86_400;
  const hours = Math.floor(totalSeconds / 3600);
  const minutes = Math.floor((totalSeconds - hours * 3600) / 60);
  const seconds = totalSeconds - hours * 3600 - minutes * 60;
  return `${pad(hours, 2)}h ${pad(minutes, 2)}m ${pad(seconds, 2, 1)}s`;
}

/** Dec in degrees, arcminutes and arcseconds, with its sign. */
export function formatDec(decDeg: number | null): string {
  if (decDeg === null) return '—';
  const sign = decDeg < 0 ? '−' : '+';
  const totalArcsec = Math.round(Math.abs(decDeg) * 3600);
  const degrees = Math.floor(totalArcsec / 3600);
  const arcmin = Math.floor((totalArcsec - degrees * 3600) / 60);
  const arcsec = totalArcsec - degrees * 3600 - arcmin * 60;
  return `${sign}${pad(degrees, 2)}° ${pad(arcmin, 2)}′ ${pad(arcsec, 2)}″`;
}

export function formatNumber(value: number | null, digits: number, unit = ''): string {
  if (value === null || !Number.isFinite(value)) return '—';
  return `${value.toFixed(digits)}${unit ? ` ${unit}` : ''}`;
}
