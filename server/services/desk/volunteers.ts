import { enqueue, type Queues } from '../../../worker/queues';
import { appendAudit } from '../../db/audit-log';
import {
  type AuditPerson,
  auditVerdicts,
  flagClearances,
  listAuditPeople,
  markPersonSnippetsForRescore,
  saveFlagClearance,
} from '../../db/desk';
import type { Db } from '../../db/knex';
import { findPersonById, type PersonRow, updatePerson } from '../../db/people';
import { nowIso } from '../../db/rows';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';
import { type FlagCode, volunteerFlags, volunteerStats } from '../../science/volunteer-audit';

export const AUDIT_SORTS = [
  'name',
  'verdicts',
  'controlAccuracy',
  'agreement',
  'medianMs',
  'topShare',
  'lastActive',
] as const;

export interface VolunteerAuditQuery {
  campaign?: number | undefined;
  search?: string | undefined;
  flagged?: boolean | undefined;
  sort: (typeof AUDIT_SORTS)[number];
  order: 'asc' | 'desc';
  limit: number;
  offset: number;
}

export type VolunteerView = Awaited<ReturnType<typeof auditRows>>[number];

async function auditRows(db: Db, people: AuditPerson[], campaignId?: number) {
  const ids = people.map((person) => person.id);
  const verdicts = await auditVerdicts(db, ids, campaignId);
  const clearances = await flagClearances(db, ids);
  return people.map((person) => {
    const stats = volunteerStats(verdicts.get(person.id) ?? []);
    const flags = volunteerFlags(stats).map((flag) => {
      const cleared = clearances.find((c) => c.personId === person.id && c.flagCode === flag.code);
      return {
        ...flag,
        cleared: cleared ? { by: cleared.clearedBy, note: cleared.note, at: cleared.clearedAt } : null,
      };
    });
    return {
      id: person.id,
      displayName: person.displayName,
      email: person.email,
      suspended: person.suspendedAt !== null,
      suspendedReason: person.suspendedReason,
      verdicts: stats.verdicts,
      controls: stats.controls,
      agreement: stats.agreement,
      medianMs: stats.medianMs,
      topAnswer: stats.topAnswer,
      lastActiveAt: person.lastActiveAt,
      maxPerMinute: stats.maxPerMinute,
      flags,
    };
  });
}

const sortValue = (row: VolunteerView, sort: VolunteerAuditQuery['sort']): number | string | null => {
  switch (sort) {
    case 'name':
      return row.displayName.toLowerCase();
    case 'verdicts':
      return row.verdicts;
    case 'controlAccuracy':
      return row.controls.accuracy;
    case 'agreement':
      return row.agreement.share;
    case 'medianMs':
      return row.medianMs;
    case 'topShare':
      return row.topAnswer?.share ?? null;
    case 'lastActive':
      return row.lastActiveAt;
  }
};

/**
 * The volunteer audit: each volunteer's numbers and automatic flags, sorted and filtered. Computed from
 * the verdicts on each request (a campaign's volunteers and their verdicts fit in memory at the
 * sizes we run; a nightly summary table is the way on when they do not).
 */
export async function volunteerAudit(db: Db, query: VolunteerAuditQuery) {
  let rows = await auditRows(db, await listAuditPeople(db, query.search), query.campaign);
  if (query.flagged !== undefined) {
    rows = rows.filter((row) => row.flags.some((flag) => !flag.cleared) === query.flagged);
  }
  const direction = query.order === 'asc' ? 1 : -1;
  rows.sort((a, b) => {
    const x = sortValue(a, query.sort);
    const y = sortValue(b, query.sort);
    if (x === y) return a.id - b.id;
    if (x === null) return 1; // unknowns last either way
    if (y === null) return -1;
    return (x < y ? -1 : 1) * direction;
  });
  return { volunteers: rows.slice(query.offset, query.offset + query.limit), total: rows.length };
}

async function oneVolunteer(db: Db, personId: number): Promise<VolunteerView> {
  const person = await findPersonById(db, personId);
  // The Desk sees volunteers only: a staff member's id must not show their address or take a warning.
  if (!person || person.deletedAt || person.role !== 'volunteer') throw notFound('Volunteer');
  const [row] = await auditRows(db, [
    {
      id: person.id,
      displayName: person.displayName,
      email: person.email,
      role: person.role,
      suspendedAt: person.suspendedAt,
      suspendedReason: person.suspendedReason,
      lastActiveAt: person.lastActiveAt,
    },
  ]);
  return row!;
}

async function volunteerToChange(db: Db, personId: number): Promise<PersonRow> {
  const person = await findPersonById(db, personId);
  if (!person || person.deletedAt) throw notFound('Volunteer');
  if (person.role !== 'volunteer') {
    throw new AppError(
      'cannot_suspend_staff',
      'Staff accounts are suspended by an admin, from Admin → People',
      'conflict',
    );
  }
  return person;
}

/**
 * Suspends a volunteer from the Desk: their verdicts stop counting and every snippet they judged is
 * rescored (a settled one whose outcome would change goes to the Desk). Reversible with restore.
 */
export async function suspendVolunteer(db: Db, moderator: PersonRow, personId: number, reason: string) {
  const person = await volunteerToChange(db, personId);
  const marked = await writeTransaction(db, async (trx) => {
    if (person.suspendedAt) return { snippets: 0, campaignIds: [] };
    await updatePerson(trx, personId, { suspendedAt: nowIso(), suspendedReason: reason });
    await appendAudit(trx, {
      actorId: moderator.id,
      action: 'volunteer.suspended',
      entityType: 'person',
      entityId: personId,
      before: { suspended: false },
      after: { suspended: true },
      note: reason,
    });
    return markPersonSnippetsForRescore(trx, personId);
  });
  return {
    volunteer: await oneVolunteer(db, personId),
    rescoring: marked.snippets,
    campaignIds: marked.campaignIds,
  };
}

/** Lifts a suspension: the verdicts count again, and the snippets they touched are rescored. */
export async function restoreVolunteer(
  db: Db,
  moderator: PersonRow,
  personId: number,
  note: string | null | undefined,
) {
  const person = await volunteerToChange(db, personId);
  const marked = await writeTransaction(db, async (trx) => {
    if (!person.suspendedAt) return { snippets: 0, campaignIds: [] };
    await updatePerson(trx, personId, { suspendedAt: null, suspendedReason: null });
    await appendAudit(trx, {
      actorId: moderator.id,
      action: 'volunteer.restored',
      entityType: 'person',
      entityId: personId,
      before: { suspended: true, reason: person.suspendedReason },
      after: { suspended: false },
      note: note ?? null,
    });
    return markPersonSnippetsForRescore(trx, personId);
  });
  return {
    volunteer: await oneVolunteer(db, personId),
    rescoring: marked.snippets,
    campaignIds: marked.campaignIds,
  };
}

/** A moderator looked at a flag and found it harmless: it stays visible, marked cleared, with why. */
export async function clearFlag(
  db: Db,
  moderator: PersonRow,
  personId: number,
  code: FlagCode,
  note: string,
) {
  await oneVolunteer(db, personId);
  await writeTransaction(db, async (trx) => {
    await saveFlagClearance(trx, { personId, flagCode: code, clearedBy: moderator.id, note });
    await appendAudit(trx, {
      actorId: moderator.id,
      action: 'volunteer.flag_cleared',
      entityType: 'person',
      entityId: personId,
      after: { flag: code },
      note,
    });
  });
  return { volunteer: await oneVolunteer(db, personId) };
}

/**
 * A warning to a volunteer: on the audit log, so that the next moderator sees it, and e-mailed to the
 * volunteer by the mail queue (`emailed` says it was queued; a person without an address gets none).
 */
export async function recordWarning(
  db: Db,
  queues: Queues | undefined,
  moderator: PersonRow,
  personId: number,
  note: string,
) {
  await oneVolunteer(db, personId);
  await appendAudit(db, {
    actorId: moderator.id,
    action: 'volunteer.warned',
    entityType: 'person',
    entityId: personId,
    note,
  });
  const person = await findPersonById(db, personId);
  const mailable = Boolean(queues && person?.email && !person.deletedAt);
  if (mailable) await enqueue(queues!, 'mail', 'moderator-warning', { personId, note });
  return { recorded: true, emailed: mailable };
}
