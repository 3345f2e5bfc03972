import { appendAudit } from '../../db/audit-log';
import { findCandidate } from '../../db/candidates';
import type { Db } from '../../db/knex';
import {
  deleteObservatory,
  findObservatory,
  insertObservatory,
  listObservatories,
  type ObservatoryRow,
  updateObservatory,
} from '../../db/observatories';
import type { PersonRow } from '../../db/people';
import { findTargetById } from '../../db/targets';
import { AppError, notFound } from '../../errors';
import {
  bjdTdbToUtc,
  MIN_SUN_SEPARATION_DEG,
  nextTransitWindows,
  observability,
  sunSeparationDeg,
  utcToBjdTdb,
} from '../../science/ephemeris';
import { NOT_CONFIRMED } from './manage-candidates';

export const SUN_CAUTION = `Windows with the target closer than ${MIN_SUN_SEPARATION_DEG}° to the Sun are never proposed: pointing a telescope that near the Sun risks the instrument and the eyes of anyone at it.`;

export async function observatories(db: Db) {
  return { observatories: await listObservatories(db) };
}

export async function addObservatory(
  db: Db,
  scientist: PersonRow,
  input: Omit<ObservatoryRow, 'id' | 'createdAt'>,
) {
  const observatory = await insertObservatory(db, { ...input, createdBy: scientist.id });
  if (!observatory) throw nameTaken();
  await appendAudit(db, {
    actorId: scientist.id,
    action: 'observatory.created',
    entityType: 'observatory',
    entityId: observatory.id,
    after: input,
  });
  return { observatory };
}

const nameTaken = () =>
  new AppError('observatory_exists', 'An observatory of that name exists', 'conflict', {
    name: 'Already taken',
  });

export async function changeObservatory(
  db: Db,
  scientist: PersonRow,
  id: number,
  changes: Partial<Omit<ObservatoryRow, 'id' | 'createdAt'>>,
) {
  return db.transaction(async (trx) => {
    const before = await findObservatory(trx, id);
    if (!before) throw notFound('Observatory');
    const observatory = await updateObservatory(trx, id, changes);
    if (!observatory) throw nameTaken();
    await appendAudit(trx, {
      actorId: scientist.id,
      action: 'observatory.changed',
      entityType: 'observatory',
      entityId: id,
      before,
      after: changes,
    });
    return { observatory };
  });
}

export async function removeObservatory(db: Db, scientist: PersonRow, id: number) {
  await db.transaction(async (trx) => {
    const before = await findObservatory(trx, id);
    if (!before || !(await deleteObservatory(trx, id))) throw notFound('Observatory');
    await appendAudit(trx, {
      actorId: scientist.id,
      action: 'observatory.removed',
      entityType: 'observatory',
      entityId: id,
      before,
    });
  });
  return { removed: id };
}

/**
 * A candidate's next transit windows from now (BJD_TDB and UTC), and for each observatory whether the
 * whole window can be watched. Windows with the target within 30° of the Sun are left out, and the
 * answer says how many and why.
 */
export async function candidateWindows(db: Db, candidateId: number, count: number, now = new Date()) {
  const candidate = await findCandidate(db, candidateId);
  if (!candidate) throw notFound('Candidate');
  const target = await findTargetById(db, candidate.targetId);
  if (candidate.periodDays === null || candidate.t0Bjd === null || candidate.durationHours === null) {
    throw new AppError(
      'no_ephemeris',
      'This candidate has no period yet (a single transit): run a period search, then promote again',
      'conflict',
    );
  }
  if (!target || target.raDeg === null || target.decDeg === null) {
    throw new AppError('no_position', 'The target has no sky position in the catalogue', 'conflict');
  }
  const sky = { raDeg: target.raDeg, decDeg: target.decDeg };
  const sites = await listObservatories(db);
  const windows = nextTransitWindows(
    {
      t0BjdTdb: candidate.t0Bjd,
      t0SigmaDays: candidate.t0SigmaDays ?? 0,
      periodDays: candidate.periodDays,
      periodSigmaDays: candidate.periodSigmaDays ?? 0,
    },
    { afterBjdTdb: utcToBjdTdb(now, sky), count: count * 2, durationHours: candidate.durationHours },
  );
  const proposed = [];
  let nearSun = 0;
  for (const window of windows) {
    if (proposed.length >= count) break;
    const midUtc = bjdTdbToUtc(window.midBjdTdb, sky);
    const separation = sunSeparationDeg(midUtc, sky);
    if (separation < MIN_SUN_SEPARATION_DEG) {
      nearSun += 1;
      continue;
    }
    proposed.push({
      ...window,
      startUtc: bjdTdbToUtc(window.startBjdTdb, sky).toISOString(),
      midUtc: midUtc.toISOString(),
      endUtc: bjdTdbToUtc(window.endBjdTdb, sky).toISOString(),
      sunSeparationDeg: separation,
      observatories: sites.map((site) => ({
        observatoryId: site.id,
        name: site.name,
        ...observability(window, sky, site),
      })),
    });
  }
  return {
    candidate: {
      id: candidate.id,
      campaignId: candidate.campaignId,
      targetId: candidate.targetId,
      designation: candidate.designation,
      periodDays: candidate.periodDays,
    },
    windows: proposed,
    leftOutNearSun: nearSun,
    cautions: [NOT_CONFIRMED, SUN_CAUTION],
  };
}
