import { z } from 'zod';

export const campaignStatuses = ['draft', 'live', 'paused', 'closed'] as const;
export type CampaignStatus = (typeof campaignStatuses)[number];

export const campaignStatusLabels: Record<CampaignStatus, string> = {
  draft: 'Draft',
  live: 'Live',
  paused: 'Paused',
  closed: 'Closed',
};

export const campaignStatusTones = {
  draft: 'slate',
  live: 'success',
  paused: 'amber',
  closed: 'danger',
} as const satisfies Record<CampaignStatus, 'slate' | 'success' | 'amber' | 'danger'>;

const count = z.number().int().nonnegative();

export const campaignCountsSchema = z.object({
  targets: count,
  lightCurves: count,
  snippets: z.object({ open: count, settled: count, split: count, ruled: count }),
  controls: z.object({ planted: count, quiet: count }),
});

export type CampaignCounts = z.infer<typeof campaignCountsSchema>;

export const campaignSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  description: z.string(),
  status: z.enum(campaignStatuses),
  snippetLengthDays: z.number(),
  snippetOverlap: z.number(),
  longestTransitHours: z.number(),
  detrendWindowDays: z.number().nullable(),
  plantedShare: z.number(),
  quietShare: z.number(),
  plantedSnrMin: z.number(),
  plantedSnrMax: z.number(),
  verdictsToSettle: z.number(),
  verdictsMax: z.number(),
  settleUpper: z.number(),
  settleLower: z.number(),
  feedbackRate: z.number(),
  snrThreshold: z.number(),
  createdAt: z.string(),
  updatedAt: z.string(),
  statusChangedAt: z.string().nullable(),
  counts: campaignCountsSchema.optional(),
});

export type Campaign = z.infer<typeof campaignSchema>;

export const campaignResponseSchema = z.object({ campaign: campaignSchema });

/** Which status may follow which; closed is final. Mirrors the server's rule so only moves it accepts are offered. */
export const nextStatuses: Record<CampaignStatus, readonly CampaignStatus[]> = {
  draft: ['live', 'closed'],
  live: ['paused', 'closed'],
  paused: ['live', 'closed'],
  closed: [],
};

export interface StatusMove {
  to: CampaignStatus;
  label: string;
  /** What the move does, said before it is made. */
  explanation: string;
  /** Closing cannot be undone, so it asks first. */
  confirm: boolean;
}

export function statusMoves(from: CampaignStatus): StatusMove[] {
  return nextStatuses[from].map((to) => {
    if (to === 'live') {
      return {
        to,
        label: from === 'paused' ? 'Resume' : 'Set live',
        explanation: 'Its open snippets go to volunteers on the Deck.',
        confirm: false,
      };
    }
    if (to === 'paused') {
      return {
        to,
        label: 'Pause',
        explanation: 'The Deck stops showing its snippets until you resume; verdicts so far are kept.',
        confirm: false,
      };
    }
    return {
      to,
      label: 'Close campaign',
      explanation:
        'Closing is final: the Deck stops showing its snippets, and its settings and uploads can no longer change.',
      confirm: true,
    };
  });
}

export type SettingKey =
  | 'snippetLengthDays'
  | 'snippetOverlap'
  | 'longestTransitHours'
  | 'detrendWindowDays'
  | 'plantedShare'
  | 'quietShare'
  | 'plantedSnrMin'
  | 'plantedSnrMax'
  | 'verdictsToSettle'
  | 'verdictsMax'
  | 'settleUpper'
  | 'settleLower'
  | 'feedbackRate'
  | 'snrThreshold';

export interface SettingDefinition {
  key: SettingKey;
  label: string;
  unit?: string;
  min: number;
  max: number;
  integer?: boolean;
  /** Empty means "let Dipdeck choose"; the hint says what it chooses. */
  nullable?: boolean;
  defaultValue: number | null;
  hint: string;
}

export interface SettingGroup {
  title: string;
  description: string;
  settings: readonly SettingDefinition[];
}

// Ranges and defaults match the server's campaign settings, so most mistakes are caught before sending.
export const settingGroups: readonly SettingGroup[] = [
  {
    title: 'Snippets',
    description: 'How each light curve is cleaned and cut into the windows volunteers judge.',
    settings: [
      {
        key: 'snippetLengthDays',
        label: 'Snippet length',
        unit: 'days',
        min: 0.25,
        max: 10,
        defaultValue: 2,
        hint: 'At least twice the longest transit, so a whole dip fits with flat light around it.',
      },
      {
        key: 'snippetOverlap',
        label: 'Overlap between snippets',
        unit: 'share',
        min: 0,
        max: 0.75,
        defaultValue: 0.25,
        hint: '0.25 means each snippet repeats the last quarter of the one before, so no dip is cut in two.',
      },
      {
        key: 'longestTransitHours',
        label: 'Longest transit',
        unit: 'hours',
        min: 1,
        max: 48,
        defaultValue: 12,
        hint: 'The longest dip you expect; the detrending must not flatten dips this long.',
      },
      {
        key: 'detrendWindowDays',
        label: 'Detrending window',
        unit: 'days',
        min: 0.1,
        max: 30,
        nullable: true,
        defaultValue: null,
        hint: 'Leave empty to use three times the longest transit.',
      },
    ],
  },
  {
    title: 'Controls',
    description: 'Snippets whose answer is known, mixed in to measure how reliable each volunteer is.',
    settings: [
      {
        key: 'plantedShare',
        label: 'Planted share',
        unit: 'share',
        min: 0,
        max: 0.5,
        defaultValue: 0.1,
        hint: 'Share of snippets that carry a planted transit.',
      },
      {
        key: 'quietShare',
        label: 'Quiet share',
        unit: 'share',
        min: 0,
        max: 0.5,
        defaultValue: 0.05,
        hint: 'Share of snippets cut from quiet reference light curves, known to hold no dip.',
      },
      {
        key: 'plantedSnrMin',
        label: 'Planted SNR, lowest',
        min: 3,
        max: 200,
        defaultValue: 7,
        hint: 'The faintest planted transit, as signal-to-noise ratio.',
      },
      {
        key: 'plantedSnrMax',
        label: 'Planted SNR, highest',
        min: 3,
        max: 200,
        defaultValue: 30,
        hint: 'The clearest planted transit.',
      },
    ],
  },
  {
    title: 'Consensus',
    description: 'When a snippet has enough verdicts to be settled, or goes to a moderator as split.',
    settings: [
      {
        key: 'verdictsToSettle',
        label: 'Verdicts to settle',
        min: 1,
        max: 50,
        integer: true,
        defaultValue: 5,
        hint: 'The fewest verdicts before a snippet can be settled.',
      },
      {
        key: 'verdictsMax',
        label: 'Most verdicts',
        min: 1,
        max: 200,
        integer: true,
        defaultValue: 15,
        hint: 'A snippet still undecided after this many verdicts is split and waits on the Desk.',
      },
      {
        key: 'settleUpper',
        label: 'Upper threshold',
        unit: 'consensus score',
        min: 0.5,
        max: 0.9999,
        defaultValue: 0.95,
        hint: 'At or above this consensus score the snippet is settled as holding a dip.',
      },
      {
        key: 'settleLower',
        label: 'Lower threshold',
        unit: 'consensus score',
        min: 0.0001,
        max: 0.5,
        defaultValue: 0.05,
        hint: 'At or below this consensus score the snippet is settled as flat.',
      },
    ],
  },
  {
    title: 'Feedback and search',
    description: 'What volunteers learn after a control, and how strong a periodic signal must be.',
    settings: [
      {
        key: 'feedbackRate',
        label: 'Feedback rate',
        unit: 'share',
        min: 0,
        max: 1,
        defaultValue: 0.5,
        hint: 'Share of controls after which a volunteer is told the right answer.',
      },
      {
        key: 'snrThreshold',
        label: 'SNR threshold',
        min: 3,
        max: 50,
        defaultValue: 7.1,
        hint: 'The period search reports a signal at or above this signal-to-noise ratio.',
      },
    ],
  },
];

export const settingDefinitions: readonly SettingDefinition[] = settingGroups.flatMap(
  (group) => group.settings,
);

/** The form's text for every setting: numbers as typed, an empty nullable setting as ''. */
export type SettingsDraft = Record<SettingKey, string> & { name: string; description: string };

export function draftFromCampaign(campaign: Campaign): SettingsDraft {
  const draft = { name: campaign.name, description: campaign.description } as SettingsDraft;
  for (const setting of settingDefinitions) {
    const value = campaign[setting.key];
    draft[setting.key] = value === null ? '' : String(value);
  }
  return draft;
}

export type SettingsPatch = Partial<Record<SettingKey, number | null>> & {
  name?: string;
  description?: string;
};

/**
 * Reads the form: the settings that changed, as the API wants them, and the problems the server would
 * refuse anyway (ranges, whole numbers). Settings left as they were are not sent, so a campaign's
 * unchanged settings are never rewritten.
 */
export function patchFromDraft(
  draft: SettingsDraft,
  campaign: Campaign,
): { patch: SettingsPatch; problems: Record<string, string> } {
  const patch: SettingsPatch = {};
  const problems: Record<string, string> = {};
  const name = draft.name.trim();
  if (name === '') problems.name = 'Name the campaign';
  else if (name.length > 120) problems.name = 'At most 120 characters';
  else if (name !== campaign.name) patch.name = name;
  const description = draft.description.trim();
  if (description.length > 4000) problems.description = 'At most 4000 characters';
  else if (description !== campaign.description) patch.description = description;

  for (const setting of settingDefinitions) {
    const text = draft[setting.key].trim().replace(',', '.');
    let value: number | null;
    if (text === '') {
      if (!setting.nullable) {
        problems[setting.key] = 'Give a number';
        continue;
      }
      value = null;
    } else {
      value = Number(text);
      if (!Number.isFinite(value)) {
        problems[setting.key] = 'Give a number';
        continue;
      }
      if (setting.integer && !Number.isInteger(value)) {
        problems[setting.key] = 'A whole number';
        continue;
      }
      if (value < setting.min) {
        problems[setting.key] = `At least ${setting.min}`;
        continue;
      }
      if (value > setting.max) {
        problems[setting.key] = `At most ${setting.max}`;
        continue;
      }
    }
    if (value !== campaign[setting.key]) patch[setting.key] = value;
  }
  return { patch, problems };
}

/** The snippets the Deck can still show, and those that are decided; for the list and the counts. */
export function snippetTotal(counts: CampaignCounts): number {
  const { open, settled, split, ruled } = counts.snippets;
  return open + settled + split + ruled;
}
