import { appendAudit } from '../../db/audit-log';
import { deleteDipsOf, findReviewSnippet, insertRuling, markRuled, type RulingValue } from '../../db/desk';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { writeTransaction } from '../../db/transaction';
import { notFound } from '../../errors';

/**
 * A moderator's ruling: the snippet becomes `ruled` with the ruling's outcome (`systematic`, an
 * instrumental feature, counts as no transit), its dips go when the ruling says there is none, and
 * the ruling is a known truth for everyone's reliability at the next re-estimate. On the audit log.
 * A later ruling replaces an earlier one (both stay on record).
 */
export async function ruleSnippet(
  db: Db,
  moderator: PersonRow,
  snippetId: number,
  input: { ruling: RulingValue; note?: string | null | undefined },
) {
  return writeTransaction(db, async (trx) => {
    const snippet = await findReviewSnippet(trx, snippetId);
    if (!snippet) throw notFound('Snippet');
    const note = input.note?.trim() ? input.note.trim() : null;
    const ruling = await insertRuling(trx, {
      snippetId,
      moderatorId: moderator.id,
      ruling: input.ruling,
      note,
    });
    const outcome = input.ruling === 'dip' ? 'dip' : 'flat';
    await markRuled(trx, snippetId, outcome);
    if (outcome === 'flat') await deleteDipsOf(trx, snippetId);
    await appendAudit(trx, {
      actorId: moderator.id,
      action: 'snippet.ruled',
      entityType: 'snippet',
      entityId: snippetId,
      before: { state: snippet.state, outcome: snippet.outcome },
      after: { state: 'ruled', outcome, ruling: input.ruling },
      note,
    });
    return {
      campaignId: snippet.campaign.id,
      snippet: { id: snippetId, state: 'ruled' as const, outcome },
      ruling: { id: ruling.id, ruling: ruling.ruling, note: ruling.note, createdAt: ruling.createdAt },
    };
  });
}
