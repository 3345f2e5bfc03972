import type { Db } from '../../db/knex';
import type { Audience } from '../../db/newsletters';
import type { PersonalFields } from '../../mail/personal-fields';

// Who a newsletter goes to, and what it says to each of them.

const DAY_MS = 86_400_000;

/** People in the audience who can be mailed now: opted in, with an address, not suspended or deleted. */
export async function audienceIds(db: Db, audience: Audience, now = new Date()): Promise<number[]> {
  const query = db('people')
    .where({ newsletter_opt_in: true })
    .whereNotNull('email')
    .whereNull('deleted_at')
    .whereNull('suspended_at');
  if (audience.kind === 'active') {
    query.where('last_active_at', '>=', new Date(now.getTime() - audience.days * DAY_MS).toISOString());
  }
  if (audience.kind === 'campaign') {
    query.whereIn(
      'id',
      db('verdicts')
        .join('snippets', 'snippets.id', 'verdicts.snippet_id')
        .where('snippets.campaign_id', audience.campaignId)
        .whereNull('verdicts.withdrawn_at')
        .whereNotNull('verdicts.person_id')
        .distinct('verdicts.person_id'),
    );
  }
  return (await query.orderBy('id').pluck('id')).map(Number);
}

/** The personal fields of one reader: this month's verdicts (UTC), the dips and candidates they are credited on, their busiest campaign. */
export async function personalFieldsOf(
  db: Db,
  person: { id: number; displayName: string },
  now = new Date(),
): Promise<PersonalFields> {
  const monthStart = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), 1)).toISOString();
  const [verdicts] = await db('verdicts')
    .where({ person_id: person.id })
    .whereNull('withdrawn_at')
    .where('created_at', '>=', monthStart)
    .count<{ n: number }[]>({ n: '*' });
  const [dips] = await db('dip_finders').where({ person_id: person.id }).count<{ n: number }[]>({ n: '*' });
  const [candidates] = await db('candidate_dips')
    .join('dip_finders', 'dip_finders.dip_id', 'candidate_dips.dip_id')
    .where('dip_finders.person_id', person.id)
    .countDistinct<{ n: number }[]>({ n: 'candidate_dips.candidate_id' });
  const top: { name?: string } | undefined = await db('verdicts')
    .join('snippets', 'snippets.id', 'verdicts.snippet_id')
    .join('campaigns', 'campaigns.id', 'snippets.campaign_id')
    .where('verdicts.person_id', person.id)
    .whereNull('verdicts.withdrawn_at')
    .groupBy('campaigns.id', 'campaigns.name')
    .orderBy([
      { column: 'n', order: 'desc' },
      { column: 'campaigns.id', order: 'asc' },
    ])
    .first('campaigns.name')
    .count({ n: '*' });
  return {
    displayName: person.displayName,
    verdictsThisMonth: Number(verdicts?.n ?? 0),
    dipsCredited: Number(dips?.n ?? 0),
    candidatesCredited: Number(candidates?.n ?? 0),
    topCampaign: top?.name ? String(top.name) : null,
  };
}
