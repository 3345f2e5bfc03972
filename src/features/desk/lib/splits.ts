import { z } from 'zod';

export const snippetKinds = ['real', 'planted', 'quiet'] as const;
export type SnippetKind = (typeof snippetKinds)[number];

export const snippetStates = ['open', 'settled', 'split', 'ruled'] as const;
export type SnippetState = (typeof snippetStates)[number];

export const splitReasons = ['max_verdicts', 'reliable_disagreement', 'outcome_changed'] as const;
export type SplitReason = (typeof splitReasons)[number];

export const rulingValues = ['dip', 'flat', 'systematic'] as const;
export type RulingValue = (typeof rulingValues)[number];

export const verdictAnswers = ['dip', 'flat', 'unsure'] as const;
export type VerdictAnswer = (typeof verdictAnswers)[number];

export const splitOrders = ['oldest', 'needed'] as const;
export type SplitOrder = (typeof splitOrders)[number];

const campaignRef = z.object({ id: z.number().int(), name: z.string() });
const targetRef = z.object({ id: z.number().int(), designation: z.string() });
const outcome = z.enum(['dip', 'flat']).nullable();

export const splitRowSchema = z.object({
  snippetId: z.number().int(),
  campaign: campaignRef,
  target: targetRef,
  kind: z.enum(snippetKinds),
  splitReason: z.enum(splitReasons).nullable(),
  splitAt: z.string().nullable(),
  consensusScore: z.number().nullable(),
  dipShare: z.number().nullable(),
  verdictCount: z.number().int(),
  onCandidate: z.boolean(),
});

export type SplitRow = z.infer<typeof splitRowSchema>;

export const splitPageSchema = z.object({ splits: z.array(splitRowSchema), total: z.number().int() });
export type SplitPage = z.infer<typeof splitPageSchema>;

export const reviewVerdictSchema = z.object({
  personId: z.number().int(),
  displayName: z.string(),
  /** A suspended volunteer's verdict is listed but carries no weight. */
  suspended: z.boolean().optional(),
  answer: z.enum(verdictAnswers),
  markHours: z.number().nullable(),
  createdAt: z.string(),
  sensitivity: z.number(),
  specificity: z.number(),
  weight: z.number(),
});

export type ReviewVerdict = z.infer<typeof reviewVerdictSchema>;

export const rulingSchema = z.object({
  id: z.number().int(),
  ruling: z.enum(rulingValues),
  note: z.string().nullable(),
  moderator: z.string().nullable(),
  createdAt: z.string(),
});

export type Ruling = z.infer<typeof rulingSchema>;

export const neighbourSchema = z.object({
  snippetId: z.number().int(),
  offsetHours: z.number(),
  durationHours: z.number(),
  state: z.enum(snippetStates),
  outcome,
  consensusScore: z.number().nullable(),
});

export type Neighbour = z.infer<typeof neighbourSchema>;

export const reviewSchema = z.object({
  snippet: z.object({
    id: z.number().int(),
    campaign: campaignRef,
    target: targetRef,
    kind: z.enum(snippetKinds),
    state: z.enum(snippetStates),
    outcome,
    splitReason: z.enum(splitReasons).nullable(),
    timeStart: z.number(),
    timeEnd: z.number(),
    durationHours: z.number(),
    consensusScore: z.number().nullable(),
    dipShare: z.number().nullable(),
    effectiveVotes: z.number().nullable(),
    verdictCount: z.number().int(),
  }),
  // Full resolution; a gap in the photometry may come as null.
  series: z.object({ hours: z.array(z.number()), ppm: z.array(z.number().nullable()) }),
  verdicts: z.array(reviewVerdictSchema),
  scoreHistory: z.array(z.object({ at: z.string(), verdictCount: z.number().int(), score: z.number() })),
  neighbours: z.array(neighbourSchema),
  rulings: z.array(rulingSchema),
});

export type Review = z.infer<typeof reviewSchema>;

export const rulingResponseSchema = z.object({
  snippet: z.object({ id: z.number().int(), state: z.literal('ruled'), outcome: z.enum(['dip', 'flat']) }),
  ruling: z.object({
    id: z.number().int(),
    ruling: z.enum(rulingValues),
    note: z.string().nullable(),
    createdAt: z.string(),
  }),
});

export type RulingResponse = z.infer<typeof rulingResponseSchema>;

export const splitReasonLabels: Record<SplitReason, string> = {
  max_verdicts: 'Most verdicts, still undecided',
  reliable_disagreement: 'Reliable volunteers disagree',
  outcome_changed: 'Outcome changed after settling',
};

export const snippetKindLabels: Record<SnippetKind, string> = {
  real: 'Real',
  planted: 'Planted',
  quiet: 'Quiet',
};

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

export const rulingLabels: Record<RulingValue, string> = {
  dip: 'Dip',
  flat: 'Flat',
  systematic: 'Systematic',
};

export const answerLabels: Record<VerdictAnswer, string> = {
  dip: 'Dip',
  flat: 'Flat',
  unsure: 'Unsure',
};

export const answerTones = {
  dip: 'amber',
  flat: 'slate',
  unsure: 'slate',
} as const satisfies Record<VerdictAnswer, 'amber' | 'slate'>;

export const splitOrderLabels: Record<SplitOrder, string> = {
  oldest: 'Oldest first',
  needed: 'Candidates first',
};

/** The campaigns that have split snippets, in the order they first appear, each once. */
export function campaignsOf(splits: readonly SplitRow[]): { id: number; name: string }[] {
  const seen = new Map<number, string>();
  for (const split of splits)
    if (!seen.has(split.campaign.id)) seen.set(split.campaign.id, split.campaign.name);
  return [...seen].map(([id, name]) => ({ id, name }));
}

/**
 * Where J and K lead from a snippet in the queue, and where the review goes on after a ruling. A snippet
 * that is not in the queue (already ruled, or further down than the window the review loaded) leads to
 * the queue's first split.
 */
export function queueNeighbours(
  queue: readonly number[],
  snippetId: number,
): { position: number | null; next: number | null; previous: number | null; afterRuling: number | null } {
  const index = queue.indexOf(snippetId);
  const others = queue.filter((id) => id !== snippetId);
  if (index < 0) {
    return { position: null, next: others[0] ?? null, previous: null, afterRuling: others[0] ?? null };
  }
  return {
    position: index + 1,
    next: queue[index + 1] ?? null,
    previous: index > 0 ? queue[index - 1]! : null,
    // The last split in the queue goes on to the first one left, so a moderator never runs out early.
    afterRuling: queue[index + 1] ?? others[0] ?? null,
  };
}

/** Marks counted into equal bins across [fromHours, toHours); marks outside are left out. */
export function markHistogram(
  marksHours: readonly number[],
  fromHours: number,
  toHours: number,
  binCount: number,
): number[] {
  const counts = new Array<number>(binCount).fill(0);
  const span = toHours - fromHours;
  if (span <= 0 || binCount <= 0) return counts;
  for (const mark of marksHours) {
    if (mark < fromHours || mark > toHours) continue;
    const bin = Math.min(binCount - 1, Math.floor(((mark - fromHours) / span) * binCount));
    counts[bin]! += 1;
  }
  return counts;
}

export interface QueueView {
  campaign: number | null;
  order: SplitOrder;
  page: number;
}

/** The queue as the address carries it (`?campaign=2&order=needed&page=3`); anything unreadable is left out. */
export function readQueue(search: URLSearchParams): QueueView {
  const campaign = search.get('campaign') ?? '';
  const page = Number(search.get('page'));
  return {
    campaign: /^\d+$/.test(campaign) && Number(campaign) > 0 ? Number(campaign) : null,
    order: search.get('order') === 'needed' ? 'needed' : 'oldest',
    page: Number.isInteger(page) && page > 0 ? page : 1,
  };
}
