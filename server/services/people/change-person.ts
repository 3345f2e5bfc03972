import type { Role } from '../../auth/roles';
import { appendAudit } from '../../db/audit-log';
import { markPersonSnippetsForRescore } from '../../db/desk';
import type { Db } from '../../db/knex';
import { findPersonById, type PersonRow, updatePerson } from '../../db/people';
import { nowIso } from '../../db/rows';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';

export interface PersonChangeInput {
  role?: Role | undefined;
  suspended?: boolean | undefined;
  reason?: string | undefined;
}

/** An admin changes someone's role or suspends/restores them; each change is on the audit log. */
export async function changePerson(
  db: Db,
  actor: PersonRow,
  personId: number,
  change: PersonChangeInput,
): Promise<PersonRow> {
  if (personId === actor.id && (change.suspended === true || (change.role && change.role !== actor.role))) {
    throw new AppError(
      'cannot_change_self',
      'You cannot change your own role or suspend yourself; ask another admin',
      'conflict',
    );
  }
  return writeTransaction(db, async (trx) => {
    const before = await findPersonById(trx, personId);
    if (!before || before.deletedAt) throw notFound('Person');
    let after = before;
    if (change.role !== undefined && change.role !== before.role) {
      after = (await updatePerson(trx, personId, { role: change.role }))!;
      await appendAudit(trx, {
        actorId: actor.id,
        action: 'person.role_changed',
        entityType: 'person',
        entityId: personId,
        before: { role: before.role },
        after: { role: change.role },
      });
    }
    const isSuspended = before.suspendedAt !== null;
    if (change.suspended !== undefined && change.suspended !== isSuspended) {
      after = (await updatePerson(trx, personId, {
        suspendedAt: change.suspended ? nowIso() : null,
        suspendedReason: change.suspended ? (change.reason ?? null) : null,
      }))!;
      await appendAudit(trx, {
        actorId: actor.id,
        action: change.suspended ? 'person.suspended' : 'person.restored',
        entityType: 'person',
        entityId: personId,
        before: { suspended: isSuspended },
        after: { suspended: change.suspended },
        note: change.reason ?? null,
      });
      // A suspended volunteer's verdicts stop counting (and count again on restoring): the consensus
      // sweep rescores what they touched.
      await markPersonSnippetsForRescore(trx, personId);
    }
    return after;
  });
}
