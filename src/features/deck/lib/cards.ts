import { z } from 'zod';

export const answers = ['dip', 'flat', 'unsure'] as const;
export type Answer = (typeof answers)[number];

export const answerLabels: Record<Answer, string> = { dip: 'Dip', flat: 'Flat', unsure: 'Unsure' };

export const cardSchema = z.object({
  snippetId: z.number().int(),
  campaign: z.object({ id: z.number().int(), name: z.string() }),
  /** The snippet's start in the light curve's time (days). */
  timeStart: z.number(),
  durationHours: z.number(),
  cadenceMinutes: z.number().nullable(),
  pointCount: z.number().int(),
  /** Hours since the snippet's start. */
  hours: z.array(z.number()),
  /** Brightness relative to the median, in ppm. */
  ppm: z.array(z.number()),
});

export type Card = z.infer<typeof cardSchema>;

export const deckReasons = ['suspended', 'no_live_campaign', 'nothing_left'] as const;
export type DeckReason = (typeof deckReasons)[number];

export const feedbackSchema = z
  .union([
    z.object({ kind: z.literal('quiet') }),
    z.object({ kind: z.literal('planted'), t0Days: z.number(), durationHours: z.number() }),
  ])
  .nullable();

export type Feedback = z.infer<typeof feedbackSchema>;

export const revealSchema = z.object({ designation: z.string(), feedback: feedbackSchema });
export type Reveal = z.infer<typeof revealSchema>;

/** A mark in hours from the snippet's start, as the server wants it: days in the light curve's time. */
export function markTimeDays(card: Pick<Card, 'timeStart'>, markHours: number): number {
  return card.timeStart + markHours / 24;
}

/** Where a planted dip was, in the card's hours: its centre and a band of its duration. */
export function plantedBandHours(
  card: Pick<Card, 'timeStart'>,
  feedback: { t0Days: number; durationHours: number },
): { centreHours: number; startHours: number; endHours: number } {
  const centreHours = (feedback.t0Days - card.timeStart) * 24;
  return {
    centreHours,
    startHours: centreHours - feedback.durationHours / 2,
    endHours: centreHours + feedback.durationHours / 2,
  };
}
