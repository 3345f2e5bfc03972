import { describe, expect, it } from 'vitest';
import {
  type Campaign,
  draftFromCampaign,
  patchFromDraft,
  settingDefinitions,
  statusMoves,
} from '@/features/lab/lib/campaigns';

const campaign: Campaign = {
  id: 7,
  name: 'Southern dwarfs',
  description: '',
  status: 'draft',
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
  createdAt: '2026-12-01T10:00:00.000Z',
  updatedAt: '2026-12-01T10:00:00.000Z',
  statusChangedAt: null,
};

describe('statusMoves', () => {
  it('offers a draft going live or closing, and asks before closing', () => {
    expect(statusMoves('draft').map((move) => [move.to, move.label, move.confirm])).toEqual([
      ['live', 'Set live', false],
      ['closed', 'Close campaign', true],
    ]);
  });

  it('offers a paused campaign a resume, and a closed one nothing', () => {
    expect(statusMoves('paused').map((move) => move.label)).toEqual(['Resume', 'Close campaign']);
    expect(statusMoves('closed')).toEqual([]);
  });
});

describe('patchFromDraft', () => {
  it('when nothing changed, sends nothing', () => {
    expect(patchFromDraft(draftFromCampaign(campaign), campaign)).toEqual({ patch: {}, problems: {} });
  });

  it('sends only the settings that changed, as numbers, and an emptied detrend window as null', () => {
    const draft = { ...draftFromCampaign({ ...campaign, detrendWindowDays: 1.5 }), snippetLengthDays: '3,5' };
    draft.detrendWindowDays = '';
    const { patch, problems } = patchFromDraft(draft, { ...campaign, detrendWindowDays: 1.5 });
    expect(problems).toEqual({});
    expect(patch).toEqual({ snippetLengthDays: 3.5, detrendWindowDays: null });
  });

  it('names each setting outside its range, not a whole number, or empty, and sends none of them', () => {
    const draft = {
      ...draftFromCampaign(campaign),
      name: '  ',
      snippetOverlap: '0.9',
      verdictsToSettle: '2.5',
      settleUpper: '',
      snrThreshold: 'lots',
    };
    const { patch, problems } = patchFromDraft(draft, campaign);
    expect(problems).toEqual({
      name: 'Name the campaign',
      snippetOverlap: 'At most 0.75',
      verdictsToSettle: 'A whole number',
      settleUpper: 'Give a number',
      snrThreshold: 'Give a number',
    });
    expect(patch).toEqual({});
  });

  it('knows a default for every setting, inside its own range', () => {
    for (const setting of settingDefinitions) {
      if (setting.defaultValue === null) {
        expect(setting.nullable, setting.key).toBe(true);
        continue;
      }
      expect(setting.defaultValue, setting.key).toBeGreaterThanOrEqual(setting.min);
      expect(setting.defaultValue, setting.key).toBeLessThanOrEqual(setting.max);
      expect(campaign[setting.key], `${setting.key} matches the server's default`).toBe(setting.defaultValue);
    }
  });
});
