import { appendAudit } from '../../db/audit-log';
import { findCampaignById } from '../../db/campaigns';
import {
  type CandidateRow,
  type CandidateState,
  candidateCredits,
  type Disposition,
  dipsOfTarget,
  dipTargets,
  findCandidate,
  findCandidateForTarget,
  insertCandidate,
  listCandidates,
  updateCandidate,
} from '../../db/candidates';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { latestPeriodSearch, targetSeries } from '../../db/period-searches';
import { findTargetById } from '../../db/targets';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';

/** The caution every candidate view and export carries. */
export const NOT_CONFIRMED =
  'A candidate is not a confirmed planet: it is a target whose dips volunteers found and a scientist thought worth following up.';

/** A small telescope's photometric precision per exposure when none is chosen (common practice: ~1 mmag). */
export const DEFAULT_TELESCOPE_PRECISION_PPM = 1_000;

/**
 * Mid-transit time precision from the transit's SNR and duration: σ = Q⁻¹·T·√(τ/2T) (Carter et al.
 * 2008, ApJ 689, 499, eq. 23), with the ingress τ taken as a tenth of the duration (our assumption
 * when the light curve does not resolve it).
 */
export function transitTimeSigmaDays(durationDays: number, snr: number): number {
  return (durationDays / snr) * Math.sqrt(0.1 / 2);
}

/** The period's error from N transits of timing error σ each, by least squares over their epochs. */
export function periodSigmaDays(timeSigmaDays: number, transits: number): number | null {
  if (transits < 2) return null;
  return timeSigmaDays * Math.sqrt(12 / (transits * (transits * transits - 1)));
}

/**
 * Our own ranking for the follow-up list, 0 and up: the signal's strength (SNR, capped at 50), how well
 * the chosen telescope can see the depth (depth over three times its precision, capped at 1), and the
 * star's brightness (a factor 10 per 5 magnitudes, 1 at magnitude 10).
 */
export function priorityScore(input: {
  snr: number | null;
  depthPpm: number | null;
  magnitude: number | null;
  telescopePrecisionPpm: number;
}): number | null {
  if (input.snr === null || input.depthPpm === null) return null;
  const signal = Math.min(input.snr, 50) / 10;
  const visible = Math.min(1, input.depthPpm / (3 * input.telescopePrecisionPpm));
  const brightness = 10 ** (-0.2 * ((input.magnitude ?? 12) - 10));
  return signal * visible * brightness;
}

export interface PromoteInput {
  targetId: number;
  dipIds?: number[] | undefined;
  notes?: string | null | undefined;
  telescopePrecisionPpm?: number | undefined;
}

async function candidateView(db: Db, candidate: CandidateRow) {
  return { ...candidate, credits: await candidateCredits(db, candidate.id), caution: NOT_CONFIRMED };
}

/**
 * A scientist puts a target, with its chosen dips, on the follow-up list. The ephemeris comes from the
 * target's latest finished period search when there is one, else from its best dip (a time, no period).
 */
export async function promoteCandidate(
  db: Db,
  scientist: PersonRow,
  campaignId: number,
  input: PromoteInput,
) {
  const campaign = await findCampaignById(db, campaignId);
  if (!campaign) throw notFound('Campaign');
  const target = await findTargetById(db, input.targetId);
  if (!target || target.campaignId !== campaignId) {
    throw new AppError('validation_failed', 'No such target in this campaign', 'invalid', {
      targetId: 'Not a target of this campaign',
    });
  }
  const dips = await dipsOfTarget(db, campaignId, target.id);
  const chosen = input.dipIds ? dips.filter((dip) => input.dipIds!.includes(dip.id)) : dips;
  if (input.dipIds && chosen.length !== new Set(input.dipIds).size) {
    throw new AppError('validation_failed', 'Some dips are not this target’s', 'invalid', {
      dipIds: 'Every dip must be a settled dip of this target',
    });
  }
  const search = await latestPeriodSearch(db, target.id);
  const best = search?.status === 'done' ? (search.result?.best as Record<string, number> | null) : null;
  const transits = Number(
    (search?.result?.diagnostics as { atBest?: { transitsWithData?: number } } | null)?.atBest
      ?.transitsWithData ?? 0,
  );
  const bjdRef = Number(search?.result?.bjdRefDays ?? (await targetSeries(db, target.id))?.bjdRefDays ?? 0);
  const strongest = [...chosen].sort((a, b) => (b.snr ?? 0) - (a.snr ?? 0))[0];
  const fields = best
    ? (() => {
        const sigma = transitTimeSigmaDays(best.durationHours! / 24, best.snr!);
        return {
          periodDays: best.periodDays!,
          periodSigmaDays: periodSigmaDays(sigma, transits),
          t0Bjd: best.t0Days! + bjdRef,
          t0SigmaDays: sigma,
          depthPpm: best.depthPpm!,
          durationHours: best.durationHours!,
          snr: best.snr!,
        };
      })()
    : {
        periodDays: null,
        periodSigmaDays: null,
        t0Bjd: strongest ? strongest.timeCenter + bjdRef : null,
        t0SigmaDays:
          strongest?.timeSigma ??
          (strongest?.durationHours && strongest.snr
            ? transitTimeSigmaDays(strongest.durationHours / 24, strongest.snr)
            : null),
        depthPpm: strongest?.depthPpm ?? null,
        durationHours: strongest?.durationHours ?? null,
        snr: strongest?.snr ?? null,
      };
  const priority = priorityScore({
    snr: fields.snr,
    depthPpm: fields.depthPpm,
    magnitude: target.magnitude,
    telescopePrecisionPpm: input.telescopePrecisionPpm ?? DEFAULT_TELESCOPE_PRECISION_PPM,
  });
  const alreadyCandidate = () =>
    new AppError('already_a_candidate', 'This target is already on the follow-up list', 'conflict');
  const id = await writeTransaction(db, async (trx) => {
    if (await findCandidateForTarget(trx, campaignId, target.id)) throw alreadyCandidate();
    // On PostgreSQL a promotion of the same target can pass the check at the same time: the index decides.
    const candidateId = await insertCandidate(trx, {
      ...fields,
      priority,
      notes: input.notes?.trim() || null,
      campaignId,
      targetId: target.id,
      promotedBy: scientist.id,
      dipIds: chosen.map((dip) => dip.id),
    });
    if (candidateId === undefined) throw alreadyCandidate();
    await appendAudit(trx, {
      actorId: scientist.id,
      action: 'candidate.promoted',
      entityType: 'candidate',
      entityId: candidateId,
      after: { targetId: target.id, dipIds: chosen.map((dip) => dip.id), periodDays: fields.periodDays },
      note: input.notes ?? null,
    });
    return candidateId;
  });
  return { candidate: await candidateView(db, (await findCandidate(db, id))!) };
}

export async function campaignCandidates(db: Db, campaignId: number) {
  if (!(await findCampaignById(db, campaignId))) throw notFound('Campaign');
  const candidates = await listCandidates(db, campaignId);
  return {
    caution: NOT_CONFIRMED,
    candidates: await Promise.all(candidates.map((candidate) => candidateView(db, candidate))),
  };
}

/**
 * The candidate review's list: targets with settled dips, strongest first — by best SNR, then the
 * number of dips, then the mean consensus score (our own ranking).
 */
export async function campaignDipTargets(db: Db, campaignId: number) {
  if (!(await findCampaignById(db, campaignId))) throw notFound('Campaign');
  const targets = await dipTargets(db, campaignId);
  targets.sort(
    (a, b) =>
      (b.bestSnr ?? -1) - (a.bestSnr ?? -1) ||
      b.dipCount - a.dipCount ||
      (b.meanScore ?? -1) - (a.meanScore ?? -1) ||
      a.targetId - b.targetId,
  );
  return { targets };
}

export interface CandidateChange {
  state?: CandidateState | undefined;
  disposition?: Disposition | undefined;
  notes?: string | null | undefined;
}

/** One candidate with its ephemeris, dips and credits. */
export async function candidateDetail(db: Db, candidateId: number) {
  const candidate = await findCandidate(db, candidateId);
  if (!candidate) throw notFound('Candidate');
  return { candidate: await candidateView(db, candidate) };
}

/** Moves a candidate through its states or sets its disposition; on the audit log with before and after. */
export async function changeCandidate(
  db: Db,
  scientist: PersonRow,
  candidateId: number,
  change: CandidateChange,
) {
  await writeTransaction(db, async (trx) => {
    const before = await findCandidate(trx, candidateId);
    if (!before) throw notFound('Candidate');
    await updateCandidate(trx, candidateId, change);
    const pick = (candidate: CandidateRow) => ({
      state: candidate.state,
      disposition: candidate.disposition,
      notes: candidate.notes,
    });
    await appendAudit(trx, {
      actorId: scientist.id,
      action: 'candidate.changed',
      entityType: 'candidate',
      entityId: candidateId,
      before: pick(before),
      after: { ...pick(before), ...change },
    });
  });
  return { candidate: await candidateView(db, (await findCandidate(db, candidateId))!) };
}
