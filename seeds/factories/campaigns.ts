import type { Db } from '../../server/db/knex';
import { nowIso } from '../../server/db/rows';

export interface CampaignOverrides {
  name?: string;
  description?: string;
  status?: 'draft' | 'live' | 'paused' | 'closed';
  surveyTeamId?: number | null;
  createdBy?: number | null;
}

export async function createSurveyTeam(db: Db, name: string, description: string): Promise<number> {
  const [row] = await db('survey_teams')
    .insert({ name, description, created_at: nowIso(), updated_at: nowIso() })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}

export async function createCampaign(db: Db, overrides: CampaignOverrides = {}): Promise<number> {
  const now = nowIso();
  const [row] = await db('campaigns')
    .insert({
      name: overrides.name ?? `Campaign ${Date.now()}`,
      description: overrides.description ?? '',
      status: overrides.status ?? 'draft',
      survey_team_id: overrides.surveyTeamId ?? null,
      created_by: overrides.createdBy ?? null,
      status_changed_at: now,
      created_at: now,
      updated_at: now,
    })
    .returning('id');
  return Number(typeof row === 'object' ? row.id : row);
}
