import { appendAudit } from '../../db/audit-log';
import type { Db } from '../../db/knex';
import { findPersonById, type PersonRow, updatePerson } from '../../db/people';
import { writeTransaction } from '../../db/transaction';
import { notFound } from '../../errors';

export interface OwnAccountChange {
  displayName?: string | undefined;
  newsletterOptIn?: boolean | undefined;
  creditByName?: boolean | undefined;
}

/**
 * A person changes their own name and consents. Consent changes (newsletter, being named on
 * candidates) go on the audit log with their time, as a record of what the person agreed to.
 */
export async function updateOwnAccount(
  db: Db,
  personId: number,
  change: OwnAccountChange,
): Promise<PersonRow> {
  return writeTransaction(db, async (trx) => {
    const before = await findPersonById(trx, personId);
    if (!before || before.deletedAt) throw notFound('Person');
    const after = (await updatePerson(trx, personId, change))!;
    for (const consent of ['newsletterOptIn', 'creditByName'] as const) {
      if (change[consent] !== undefined && change[consent] !== before[consent]) {
        await appendAudit(trx, {
          actorId: personId,
          action: `person.consent_changed`,
          entityType: 'person',
          entityId: personId,
          before: { [consent]: before[consent] },
          after: { [consent]: after[consent] },
        });
      }
    }
    return after;
  });
}
