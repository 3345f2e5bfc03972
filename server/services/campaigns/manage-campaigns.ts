import { appendAudit } from '../../db/audit-log';
import {
  type CampaignCounts,
  type CampaignRow,
  campaignCounts,
  findCampaignById,
  insertCampaign,
  listCampaigns as queryCampaigns,
  updateCampaign,
} from '../../db/campaigns';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { nowIso } from '../../db/rows';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';
import {
  CAMPAIGN_DEFAULTS,
  type CampaignPatch,
  type CampaignSettings,
  type CampaignStatusValue,
  settingsProblems,
} from './campaign-settings';

export interface CampaignView extends CampaignSettings {
  id: number;
  status: CampaignStatusValue;
  createdAt: string;
  updatedAt: string;
  statusChangedAt: string | null;
  counts?: CampaignCounts;
}

const SETTING_KEYS = Object.keys({ name: '', ...CAMPAIGN_DEFAULTS }) as (keyof CampaignSettings)[];

function settingsOf(row: CampaignRow): CampaignSettings {
  return Object.fromEntries(
    SETTING_KEYS.map((key) => [key, row[key as keyof CampaignRow]]),
  ) as CampaignSettings;
}

export function toCampaignView(row: CampaignRow, counts?: CampaignCounts): CampaignView {
  return {
    id: row.id,
    ...settingsOf(row),
    status: row.status,
    createdAt: row.createdAt,
    updatedAt: row.updatedAt,
    statusChangedAt: row.statusChangedAt,
    ...(counts ? { counts } : {}),
  };
}

function assertConsistent(settings: CampaignSettings): void {
  const problems = settingsProblems(settings);
  if (Object.keys(problems).length > 0) {
    throw new AppError('validation_failed', 'Some settings do not fit together', 'invalid', problems);
  }
}

// Which status may follow which. A closed campaign stays closed: its record is final.
const NEXT_STATUS: Record<CampaignStatusValue, CampaignStatusValue[]> = {
  draft: ['live', 'closed'],
  live: ['paused', 'closed'],
  paused: ['live', 'closed'],
  closed: [],
};

export async function createCampaign(
  db: Db,
  actor: PersonRow,
  input: Partial<CampaignSettings> & { name: string },
): Promise<CampaignView> {
  const settings: CampaignSettings = { ...CAMPAIGN_DEFAULTS, ...input };
  assertConsistent(settings);
  return writeTransaction(db, async (trx) => {
    const row = await insertCampaign(trx, { ...settings, createdBy: actor.id });
    await appendAudit(trx, {
      actorId: actor.id,
      action: 'campaign.created',
      entityType: 'campaign',
      entityId: row.id,
      after: settings,
    });
    return toCampaignView(row);
  });
}

export async function listCampaigns(db: Db): Promise<CampaignView[]> {
  const rows = await queryCampaigns(db);
  return Promise.all(rows.map(async (row) => toCampaignView(row, await campaignCounts(db, row.id))));
}

export async function getCampaign(db: Db, id: number): Promise<CampaignView> {
  const row = await findCampaignById(db, id);
  if (!row) throw notFound('Campaign');
  return toCampaignView(row, await campaignCounts(db, id));
}

/**
 * Changes settings and/or status. New settings apply to snippets cut afterwards: each light curve keeps
 * the settings it was cut with. Every change is on the audit log with its before and after.
 */
export async function changeCampaign(
  db: Db,
  actor: PersonRow,
  id: number,
  patch: CampaignPatch,
): Promise<CampaignView> {
  return writeTransaction(db, async (trx) => {
    const before = await findCampaignById(trx, id);
    if (!before) throw notFound('Campaign');
    const { status, ...settingsPatch } = patch;
    if (before.status === 'closed' && Object.keys(settingsPatch).length > 0) {
      throw new AppError(
        'campaign_closed',
        'This campaign is closed; its settings can no longer change',
        'conflict',
      );
    }
    const changes: Record<string, unknown> = {};
    if (Object.keys(settingsPatch).length > 0) {
      const merged = { ...settingsOf(before), ...settingsPatch } as CampaignSettings;
      assertConsistent(merged);
      Object.assign(changes, settingsPatch);
    }
    if (status !== undefined && status !== before.status) {
      if (!NEXT_STATUS[before.status].includes(status)) {
        throw new AppError(
          'status_not_allowed',
          `A ${before.status} campaign cannot become ${status}${before.status === 'closed' ? ': closed is final' : ''}`,
          'conflict',
          {
            status: `From ${before.status} it can become: ${NEXT_STATUS[before.status].join(', ') || 'nothing'}`,
          },
        );
      }
      changes.status = status;
      changes.statusChangedAt = nowIso();
    }
    if (Object.keys(changes).length === 0) return toCampaignView(before, await campaignCounts(trx, id));
    const after = await updateCampaign(trx, id, changes);
    const changedKeys = Object.keys(changes).filter((key) => key !== 'statusChangedAt');
    const pick = (row: CampaignRow) =>
      Object.fromEntries(changedKeys.map((key) => [key, row[key as keyof CampaignRow]]));
    await appendAudit(trx, {
      actorId: actor.id,
      action: changes.status ? 'campaign.status_changed' : 'campaign.settings_changed',
      entityType: 'campaign',
      entityId: id,
      before: pick(before),
      after: pick(after),
    });
    return toCampaignView(after, await campaignCounts(trx, id));
  });
}
