import { z } from 'zod';
import type { DeskVolunteerListParams } from '@/lib/query-keys';

export const flagCodes = ['too_fast', 'chance_accuracy', 'one_answer', 'burst'] as const;

export const flagSchema = z.object({
  // The server may learn new flags before the client has a label for them; the code is shown then.
  code: z.string(),
  reason: z.string(),
  cleared: z.object({ by: z.string().nullable(), note: z.string(), at: z.string() }).nullable(),
});

export type VolunteerFlag = z.infer<typeof flagSchema>;

export const deskVolunteerSchema = z.object({
  id: z.number().int(),
  displayName: z.string(),
  email: z.string(),
  suspended: z.boolean(),
  suspendedReason: z.string().nullable(),
  verdicts: z.number().int(),
  controls: z.object({ seen: z.number().int(), correct: z.number().int(), accuracy: z.number().nullable() }),
  agreement: z.object({
    compared: z.number().int(),
    agreed: z.number().int(),
    share: z.number().nullable(),
  }),
  medianMs: z.number().nullable(),
  topAnswer: z.object({ answer: z.string(), share: z.number() }).nullable(),
  lastActiveAt: z.string().nullable(),
  maxPerMinute: z.number(),
  flags: z.array(flagSchema),
});

export type DeskVolunteer = z.infer<typeof deskVolunteerSchema>;

export const volunteerResponseSchema = z.object({ volunteer: deskVolunteerSchema });

export const flagLabels: Record<string, string> = {
  too_fast: 'Too fast',
  chance_accuracy: 'Accuracy near chance',
  one_answer: 'One answer only',
  burst: 'Bursts of verdicts',
};

export function flagLabel(code: string): string {
  return flagLabels[code] ?? code.replaceAll('_', ' ');
}

export type VolunteerSort = DeskVolunteerListParams['sort'];

export const volunteerSorts = [
  'name',
  'verdicts',
  'controlAccuracy',
  'agreement',
  'medianMs',
  'topShare',
  'lastActive',
] as const satisfies readonly VolunteerSort[];

export const volunteerSortLabels: Record<VolunteerSort, string> = {
  name: 'Volunteer',
  verdicts: 'Verdicts',
  controlAccuracy: 'Control accuracy',
  agreement: 'Agreement',
  medianMs: 'Median time',
  topShare: 'Top answer',
  lastActive: 'Last active',
};

/**
 * The order a column starts in when first chosen: names A to Z, median time fastest first (speed is
 * what the Desk looks for there), everything else highest first.
 */
export function firstOrder(sort: VolunteerSort): 'asc' | 'desc' {
  return sort === 'name' || sort === 'medianMs' ? 'asc' : 'desc';
}

export function sortDirectionWords(sort: VolunteerSort, order: 'asc' | 'desc'): string {
  if (sort === 'name') return order === 'asc' ? 'A to Z' : 'Z to A';
  if (sort === 'medianMs') return order === 'asc' ? 'fastest first' : 'slowest first';
  if (sort === 'lastActive') return order === 'asc' ? 'longest ago first' : 'most recent first';
  return order === 'asc' ? 'lowest first' : 'highest first';
}

export const activeFlags = (volunteer: DeskVolunteer) => volunteer.flags.filter((flag) => !flag.cleared);
