import { findCampaignById } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import { unpackDisplay } from '../../db/series-codec';
import { AppError, notFound } from '../../errors';

/** Who is asking: a signed-in person, or a visitor known by the guest key in their session. */
export type Judge =
  | { personId: number; guestKey?: undefined; lastActiveAt?: string | null }
  | { personId?: undefined; guestKey: string; lastActiveAt?: undefined };

/** Exactly what a card needs, and nothing that gives the answer away: no kind, no truth, no other verdicts, no target. */
export interface Card {
  snippetId: number;
  campaign: { id: number; name: string };
  /** The snippet's start (days), so a mark can be sent in the light curve's own time. */
  timeStart: number;
  durationHours: number;
  cadenceMinutes: number | null;
  pointCount: number;
  /** Hours since the snippet's start. */
  hours: number[];
  /** Brightness relative to the median, in ppm. */
  ppm: number[];
}

const POOL_SIZE = 60; // candidates per kind, closest to settling first, sampled at random

export type Kind = 'real' | 'planted' | 'quiet';

interface Candidate {
  id: number;
  targetId: number;
  verdictCount: number;
}

/** The pool's query, on its own so a test can check that the database walks an index for it. */
export function poolQuery(
  db: Db,
  campaignId: number,
  kind: Kind,
  verdictsMax: number,
  judge: Judge,
  exclude: number[],
) {
  const judged = judge.personId
    ? db('verdicts').select('snippet_id').where('person_id', judge.personId)
    : db('verdicts').select('snippet_id').where('guest_key', judge.guestKey);
  // In the order of snippets_pool_order_index (migrations/20261202050000_deck_pool_order.ts).
  const query = db('snippets')
    .select('id', 'target_id', 'verdict_count')
    .where({ campaign_id: campaignId, state: 'open', kind })
    .andWhere('verdict_count', '<', verdictsMax)
    .whereNotIn('id', judged)
    .orderBy([{ column: 'verdict_count', order: 'desc' }, 'id'])
    .limit(POOL_SIZE);
  if (exclude.length > 0) query.whereNotIn('id', exclude);
  return query;
}

async function pool(...args: Parameters<typeof poolQuery>): Promise<Candidate[]> {
  const rows: Record<string, unknown>[] = await poolQuery(...args);
  return rows.map((row) => ({
    id: Number(row.id),
    targetId: Number(row.target_id),
    verdictCount: Number(row.verdict_count),
  }));
}

/** Picks from a pool at random, leaning towards the snippets nearest to settling, never the given target. */
function pick(
  candidates: Candidate[],
  avoidTarget: number | null,
  random: () => number,
): Candidate | undefined {
  const allowed = candidates.filter((candidate) => candidate.targetId !== avoidTarget);
  if (allowed.length === 0) return undefined;
  const weights = allowed.map((candidate) => 1 + candidate.verdictCount);
  let roll = random() * weights.reduce((a, b) => a + b, 0);
  for (const [index, weight] of weights.entries()) {
    roll -= weight;
    if (roll < 0) return allowed[index];
  }
  return allowed[allowed.length - 1];
}

/**
 * The next cards for one judge: open snippets of a live campaign they have not judged, favouring those
 * closest to settling, at random so that two volunteers rarely get the same sequence; planted and quiet
 * controls mixed in at the campaign's rates; never two snippets of one target in a row.
 *
 * @param exclude snippets the client already holds (prefetched); the last one is the card before these
 */
export async function nextCards(
  db: Db,
  request: { campaignId: number; count: number; judge: Judge; exclude: number[]; random?: () => number },
): Promise<Card[]> {
  const random = request.random ?? Math.random;
  const campaign = await findCampaignById(db, request.campaignId);
  // A draft is the science team's own until it goes live: to the Deck it does not exist yet.
  if (!campaign || campaign.status === 'draft') throw notFound('Campaign');
  if (campaign.status !== 'live') {
    throw new AppError(
      'campaign_not_live',
      `This campaign is ${campaign.status}: it is not taking verdicts`,
      'conflict',
    );
  }
  const pools: Record<Kind, Candidate[]> = {
    real: await pool(db, campaign.id, 'real', campaign.verdictsMax, request.judge, request.exclude),
    planted: await pool(db, campaign.id, 'planted', campaign.verdictsMax, request.judge, request.exclude),
    quiet: await pool(db, campaign.id, 'quiet', campaign.verdictsMax, request.judge, request.exclude),
  };
  let previousTarget: number | null = null;
  const last = request.exclude[request.exclude.length - 1];
  if (last !== undefined) {
    const row = await db('snippets').where({ id: last }).first('target_id');
    previousTarget = row ? Number(row.target_id) : null;
  }
  const chosen: Candidate[] = [];
  for (let i = 0; i < request.count; i += 1) {
    const roll = random();
    const wanted: Kind =
      roll < campaign.plantedShare
        ? 'planted'
        : roll < campaign.plantedShare + campaign.quietShare
          ? 'quiet'
          : 'real';
    // When the wanted kind has run out, any other kind will do rather than an empty deck.
    const order: Kind[] = [
      wanted,
      ...(['real', 'planted', 'quiet'] as Kind[]).filter((kind) => kind !== wanted),
    ];
    let card: Candidate | undefined;
    for (const kind of order) {
      card = pick(pools[kind], previousTarget, random);
      if (card) {
        pools[kind] = pools[kind].filter((candidate) => candidate.id !== card!.id);
        break;
      }
    }
    if (!card) break;
    chosen.push(card);
    previousTarget = card.targetId;
  }
  if (chosen.length === 0) return [];
  const rows: Record<string, unknown>[] = await db('snippets')
    .join('light_curves', 'light_curves.id', 'snippets.light_curve_id')
    .whereIn(
      'snippets.id',
      chosen.map((card) => card.id),
    )
    .select(
      'snippets.id',
      'snippets.time_start',
      'snippets.time_end',
      'snippets.point_count',
      'snippets.display',
      'light_curves.cadence_days',
    );
  const byId = new Map(rows.map((row) => [Number(row.id), row]));
  return chosen.map((card) => {
    const row = byId.get(card.id)!;
    const display = unpackDisplay(row.display as Buffer);
    const cadenceDays = row.cadence_days === null ? null : Number(row.cadence_days);
    return {
      snippetId: card.id,
      campaign: { id: campaign.id, name: campaign.name },
      timeStart: Number(row.time_start),
      durationHours: (Number(row.time_end) - Number(row.time_start)) * 24,
      cadenceMinutes: cadenceDays === null ? null : Math.round(cadenceDays * 1440 * 100) / 100,
      pointCount: Number(row.point_count),
      hours: Array.from(display.offsetDays, (days) => Math.round(days * 24 * 1e4) / 1e4),
      ppm: Array.from(display.flux, (flux) => Math.round((flux - 1) * 1e6)),
    };
  });
}

/** The live campaign a volunteer lands on when they name none: the newest. */
export async function defaultLiveCampaign(db: Db): Promise<number | null> {
  const row = await db('campaigns').where({ status: 'live' }).orderBy('id', 'desc').first('id');
  return row ? Number(row.id) : null;
}
