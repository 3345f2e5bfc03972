import { createHash } from 'node:crypto';
import type { Db } from '../server/db/knex';
import { insertPerson } from '../server/db/people';
import { nowIso } from '../server/db/rows';
import { createRandom } from '../server/science/random';
import type { SyntheticTarget } from '../server/science/synthetic-survey';

// An invented crowd for the demo: volunteers of varied care who have already judged part of the demo
// campaign, so that the consensus, the Desk and completeness have something to show on a fresh start.
// Their answers are drawn from each snippet's known truth (the synthetic survey's), deterministically.

export interface DemoCrowdOptions {
  campaignId: number;
  targets: SyntheticTarget[];
  passwordHash: string;
  volunteers?: number;
  /** Share of the campaign's snippets that already have verdicts. */
  judgedShare?: number;
  seed?: string;
}

const FIRST = ['Ansel', 'Brisa', 'Corin', 'Dalia', 'Eamon', 'Fenna', 'Galen', 'Hesper', 'Ilse', 'Joren'];
const LAST = ['Ashdown', 'Brightwater', 'Coldharbour', 'Dunmore', 'Eastleigh', 'Fernhill', 'Greywell'];

interface Volunteer {
  id: number;
  sensitivity: number;
  specificity: number;
  style: 'careful' | 'random' | 'always-dip';
}

interface SnippetTruth {
  id: number;
  timeStart: number;
  timeEnd: number;
  /** The time of the dip inside the snippet, when there is one, and how visible it is (0…1). */
  dipAt: number | null;
  visibility: number;
  /** A jump or a ramp in the window: careful people disagree on whether it is a dip. */
  systematic: boolean;
}

// A dip is plain to see from SNR ≈ 10 in one transit, and invisible below ≈ 3 (common practice for
// eyeballed photometry, not measured here).
const visibilityOf = (snr: number) => Math.min(1, Math.max(0, (snr - 3) / 7));

function realTruth(
  target: SyntheticTarget,
  snippet: { id: number; timeStart: number; timeEnd: number },
): SnippetTruth {
  const events: { time: number; snr: number }[] = [];
  for (const planet of target.truth.planets) {
    const perTransit = planet.expectedSnr / Math.sqrt(Math.max(1, planet.transitTimesDays.length));
    for (const time of planet.transitTimesDays) events.push({ time, snr: perTransit });
  }
  const binary = target.truth.binary;
  if (binary) {
    const noise = target.truth.noisePpmPerHour / Math.sqrt(Math.max(0.5, binary.durationHours));
    for (const time of binary.primaryTimesDays) events.push({ time, snr: binary.primaryDepthPpm / noise });
    for (const time of binary.secondaryTimesDays)
      events.push({ time, snr: binary.secondaryDepthPpm / noise });
  }
  const inside = events
    .filter((event) => event.time >= snippet.timeStart && event.time <= snippet.timeEnd)
    .sort((a, b) => b.snr - a.snr)[0];
  const within = (time: number) => time >= snippet.timeStart && time <= snippet.timeEnd;
  const { jumps, ramps } = target.truth.systematics;
  return {
    ...snippet,
    dipAt: inside?.time ?? null,
    visibility: inside ? visibilityOf(inside.snr) : 0,
    systematic: jumps.some((jump) => within(jump.timeDays)) || ramps.some((ramp) => within(ramp.startDays)),
  };
}

const clientIdOf = (seed: string, personId: number, snippetId: number) =>
  createHash('sha256').update(`${seed}:${personId}:${snippetId}`).digest('hex').slice(0, 32);

/** Adds the crowd and their verdicts; answers how many verdicts. The consensus jobs do the rest. */
export async function seedDemoCrowd(db: Db, options: DemoCrowdOptions): Promise<number> {
  const seed = options.seed ?? 'larkspur-crowd';
  const random = createRandom(seed);
  const count = options.volunteers ?? 60;
  const volunteers: Volunteer[] = [];
  for (let i = 0; i < count; i += 1) {
    const name = `${FIRST[i % FIRST.length]} ${LAST[Math.floor(i / FIRST.length) % LAST.length]}`;
    const person = await insertPerson(db, {
      email: `crowd-${String(i + 1).padStart(2, '0')}@demo.dipdeck.test`,
      displayName: name,
      passwordHash: options.passwordHash,
      creditByName: i % 3 !== 0,
    });
    if (!person) throw new Error(`demo volunteer ${i + 1} already exists`);
    // One in ten answers at random and one in twenty says dip to everything: the Desk's audit finds them.
    const style = i % 10 === 9 ? 'random' : i % 20 === 4 ? 'always-dip' : 'careful';
    volunteers.push({
      id: person.id,
      sensitivity: random.uniform(0.6, 0.97),
      specificity: random.uniform(0.8, 0.99),
      style,
    });
  }

  const byDesignation = new Map(options.targets.map((target) => [target.designation, target]));
  const rows: Record<string, unknown>[] = await db('snippets')
    .join('targets', 'targets.id', 'snippets.target_id')
    .where('snippets.campaign_id', options.campaignId)
    .orderBy('snippets.id')
    .select(
      'snippets.id',
      'snippets.kind',
      'snippets.time_start',
      'snippets.time_end',
      'snippets.planted_truth',
      'targets.designation',
    );
  const now = nowIso();
  const verdicts: Record<string, unknown>[] = [];
  const counted = new Map<number, number>();
  for (const row of rows) {
    if (random.next() >= (options.judgedShare ?? 0.4)) continue;
    const snippet = { id: Number(row.id), timeStart: Number(row.time_start), timeEnd: Number(row.time_end) };
    let truth: SnippetTruth;
    if (row.kind === 'planted') {
      const planted = JSON.parse(String(row.planted_truth)) as { t0Days: number; expectedSnr: number };
      truth = {
        ...snippet,
        dipAt: planted.t0Days,
        visibility: visibilityOf(planted.expectedSnr),
        systematic: false,
      };
    } else if (row.kind === 'quiet') {
      truth = { ...snippet, dipAt: null, visibility: 0, systematic: false };
    } else {
      const target = byDesignation.get(String(row.designation));
      truth = target
        ? realTruth(target, snippet)
        : { ...snippet, dipAt: null, visibility: 0, systematic: false };
    }
    const judges = new Set<Volunteer>();
    // Most snippets have a few verdicts; one in ten already has the campaign's maximum, where the hard
    // ones go to the Desk.
    const wanted = random.next() < 0.1 ? 15 : 3 + Math.floor(random.next() * 7);
    while (judges.size < wanted) judges.add(volunteers[Math.floor(random.next() * volunteers.length)]!);
    for (const volunteer of judges) {
      const answer = answerOf(volunteer, truth, random.next());
      const markTime =
        answer === 'dip'
          ? truth.dipAt !== null && volunteer.style === 'careful'
            ? truth.dipAt + random.normal(0, 0.015)
            : truth.timeStart + random.next() * (truth.timeEnd - truth.timeStart)
          : null;
      verdicts.push({
        client_id: clientIdOf(seed, volunteer.id, truth.id),
        snippet_id: truth.id,
        person_id: volunteer.id,
        answer,
        mark_time: markTime === null ? null : Math.min(truth.timeEnd, Math.max(truth.timeStart, markTime)),
        elapsed_ms: 2_000 + Math.floor(random.next() * 9_000),
        created_at: now,
        updated_at: now,
      });
      counted.set(truth.id, (counted.get(truth.id) ?? 0) + 1);
    }
  }
  await db.transaction(async (trx) => {
    for (let i = 0; i < verdicts.length; i += 400) {
      const batch = verdicts.slice(i, i + 400);
      const ids: { id: number; client_id: string }[] = await trx('verdicts')
        .insert(batch)
        .returning(['id', 'client_id']);
      await trx('verdict_receipts').insert(
        ids.map((row) => ({ client_id: row.client_id, verdict_id: row.id, created_at: now })),
      );
    }
    for (const [snippetId, n] of counted) {
      await trx('snippets').where({ id: snippetId }).update({ verdict_count: n, needs_rescore: true });
    }
  });
  return verdicts.length;
}

function answerOf(volunteer: Volunteer, truth: SnippetTruth, draw: number): 'dip' | 'flat' | 'unsure' {
  if (volunteer.style === 'always-dip') return 'dip';
  if (volunteer.style === 'random') return draw < 0.5 ? 'dip' : 'flat';
  if (draw > 0.96) return 'unsure';
  const saysDip =
    truth.dipAt === null && truth.systematic
      ? 0.45
      : truth.dipAt !== null
        ? volunteer.sensitivity * truth.visibility + (1 - truth.visibility) * (1 - volunteer.specificity)
        : 1 - volunteer.specificity;
  return draw / 0.96 < saysDip ? 'dip' : 'flat';
}
