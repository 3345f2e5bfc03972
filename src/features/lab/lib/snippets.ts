import { z } from 'zod';

export const snippetKinds = ['real', 'planted', 'quiet'] as const;
export type SnippetKind = (typeof snippetKinds)[number];

export const snippetStates = ['open', 'settled', 'split', 'ruled'] as const;
export type SnippetState = (typeof snippetStates)[number];

export const snippetKindLabels: Record<SnippetKind, string> = {
  real: 'Real',
  planted: 'Planted',
  quiet: 'Quiet',
};

export const snippetKindTones = {
  real: 'slate',
  planted: 'amber',
  quiet: 'slate',
} as const satisfies Record<SnippetKind, 'slate' | 'amber'>;

export const snippetStateLabels: Record<SnippetState, string> = {
  open: 'Open',
  settled: 'Settled',
  split: 'Split',
  ruled: 'Ruled',
};

export const snippetStateTones = {
  open: 'slate',
  settled: 'success',
  split: 'danger',
  ruled: 'amber',
} as const satisfies Record<SnippetState, 'slate' | 'success' | 'danger' | 'amber'>;

// The server may add more to the truth (limb darkening, period); those are shown but not required.
export const plantedTruthSchema = z
  .object({
    t0Days: z.number(),
    depthPpm: z.number(),
    durationHours: z.number(),
    impact: z.number().optional(),
    expectedSnr: z.number().optional(),
  })
  .catchall(z.unknown());

export type PlantedTruth = z.infer<typeof plantedTruthSchema>;

export const snippetRowSchema = z.object({
  id: z.number().int(),
  targetId: z.number().int(),
  designation: z.string(),
  kind: z.enum(snippetKinds),
  state: z.enum(snippetStates),
  timeStart: z.number(),
  timeEnd: z.number(),
  pointCount: z.number().int(),
  verdictCount: z.number().int(),
  consensusScore: z.number().nullable(),
});

export type SnippetRow = z.infer<typeof snippetRowSchema>;

export const snippetDetailSchema = snippetRowSchema.extend({
  campaignId: z.number().int(),
  dipShare: z.number().nullable(),
  sourceSnippetId: z.number().int().nullable(),
  plantedTruth: plantedTruthSchema.nullable(),
  display: z.object({ offsetDays: z.array(z.number()), flux: z.array(z.number()) }),
});

export type SnippetDetail = z.infer<typeof snippetDetailSchema>;

export const snippetSorts = ['id', 'timeStart', 'verdictCount', 'consensusScore'] as const;
export type SnippetSort = (typeof snippetSorts)[number];

export const snippetSortLabels: Record<SnippetSort, string> = {
  id: 'Snippet',
  timeStart: 'Time',
  verdictCount: 'Verdicts',
  consensusScore: 'Consensus score',
};

/**
 * The planted transit's centre in days after the snippet starts. The truth holds t0 on the light
 * curve's own time axis; a t0 that already lies inside [0, length] but not inside the snippet's time
 * range is taken as an offset.
 */
export function plantedOffsetDays(
  truth: Pick<PlantedTruth, 't0Days'>,
  snippet: { timeStart: number; timeEnd: number },
): number | null {
  const lengthDays = snippet.timeEnd - snippet.timeStart;
  if (truth.t0Days >= snippet.timeStart && truth.t0Days <= snippet.timeEnd) {
    return truth.t0Days - snippet.timeStart;
  }
  if (truth.t0Days >= 0 && truth.t0Days <= lengthDays) return truth.t0Days;
  return null;
}

/** The planted t0 on the light curve's time axis (see plantedOffsetDays). */
export function plantedTimeDays(
  truth: Pick<PlantedTruth, 't0Days'>,
  snippet: { timeStart: number; timeEnd: number },
): number | null {
  const offset = plantedOffsetDays(truth, snippet);
  return offset === null ? null : snippet.timeStart + offset;
}

export function formatScore(score: number | null): string {
  return score === null ? '—' : score.toFixed(2);
}

/** Light-curve times are long day numbers (BJD − reference); four decimals is ~9 s. */
export function formatDays(days: number): string {
  return days.toFixed(4);
}
