import { z } from 'zod';

// A campaign's settings, with the ranges that make sense for a transit search. Defaults match the
// database's (migrations/20261201000000_first_data_model.ts).
const settingsShape = {
  name: z.string().trim().min(1, 'Name the campaign').max(120, 'At most 120 characters'),
  description: z.string().trim().max(4000, 'At most 4000 characters'),
  snippetLengthDays: z.number().min(0.25, 'At least 0.25 days').max(10, 'At most 10 days'),
  snippetOverlap: z.number().min(0, 'At least 0').max(0.75, 'At most 0.75'),
  longestTransitHours: z.number().min(1, 'At least 1 hour').max(48, 'At most 48 hours'),
  detrendWindowDays: z.number().min(0.1, 'At least 0.1 days').max(30, 'At most 30 days').nullable(),
  plantedShare: z.number().min(0, 'At least 0').max(0.5, 'At most 0.5'),
  quietShare: z.number().min(0, 'At least 0').max(0.5, 'At most 0.5'),
  plantedSnrMin: z.number().min(3, 'At least 3').max(100, 'At most 100'),
  plantedSnrMax: z.number().min(3, 'At least 3').max(200, 'At most 200'),
  verdictsToSettle: z.number().int('A whole number').min(1, 'At least 1').max(50, 'At most 50'),
  verdictsMax: z.number().int('A whole number').min(1, 'At least 1').max(200, 'At most 200'),
  settleUpper: z.number().min(0.5, 'At least 0.5').max(0.9999, 'At most 0.9999'),
  settleLower: z.number().min(0.0001, 'At least 0.0001').max(0.5, 'At most 0.5'),
  feedbackRate: z.number().min(0, 'At least 0').max(1, 'At most 1'),
  snrThreshold: z.number().min(3, 'At least 3').max(50, 'At most 50'),
};

export type CampaignSettings = z.output<z.ZodObject<typeof settingsShape>>;

export const CAMPAIGN_DEFAULTS: Omit<CampaignSettings, 'name'> = {
  description: '',
  snippetLengthDays: 2,
  snippetOverlap: 0.25,
  longestTransitHours: 12,
  detrendWindowDays: null,
  plantedShare: 0.1,
  quietShare: 0.05,
  plantedSnrMin: 7,
  plantedSnrMax: 30,
  verdictsToSettle: 5,
  verdictsMax: 15,
  settleUpper: 0.95,
  settleLower: 0.05,
  feedbackRate: 0.5,
  snrThreshold: 7.1,
};

/** Rules between settings; each names the field to correct. Checked on the merged, final settings. */
export function settingsProblems(settings: CampaignSettings): Record<string, string> {
  const problems: Record<string, string> = {};
  if (settings.plantedSnrMax < settings.plantedSnrMin) {
    problems.plantedSnrMax = 'Must be at least the smallest planted SNR';
  }
  if (settings.verdictsMax < settings.verdictsToSettle) {
    problems.verdictsMax = 'Must be at least the verdicts needed to settle';
  }
  if (settings.settleLower >= settings.settleUpper)
    problems.settleLower = 'Must be below the upper threshold';
  if (settings.plantedShare + settings.quietShare > 0.6) {
    problems.quietShare = 'Planted and quiet controls together may be at most 60% of the cards';
  }
  // A window shorter than twice the transit would flatten the transit itself (Hippke et al. 2019, §2.3).
  if (
    settings.detrendWindowDays !== null &&
    settings.detrendWindowDays < (2 * settings.longestTransitHours) / 24
  ) {
    problems.detrendWindowDays = `Must be at least twice the longest transit (${((2 * settings.longestTransitHours) / 24).toFixed(2)} days)`;
  }
  if (settings.snippetLengthDays < (2 * settings.longestTransitHours) / 24) {
    problems.snippetLengthDays =
      'Must be at least twice the longest transit, so a whole transit fits with room around it';
  }
  return problems;
}

const settingsObject = z.object(settingsShape);

export const campaignCreateSchema = settingsObject.partial().extend({ name: settingsShape.name }).strict();

export const CAMPAIGN_STATUSES = ['draft', 'live', 'paused', 'closed'] as const;
export type CampaignStatusValue = (typeof CAMPAIGN_STATUSES)[number];

export const campaignPatchSchema = settingsObject
  .partial()
  .extend({ status: z.enum(CAMPAIGN_STATUSES).optional() })
  .strict()
  .refine((patch) => Object.keys(patch).length > 0, { message: 'Give at least one change', path: ['_'] });

export type CampaignPatch = z.output<typeof campaignPatchSchema>;
