import { appendAudit } from '../../db/audit-log';
import { findCampaignById } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { upsertTarget } from '../../db/targets';
import { writeTransaction } from '../../db/transaction';
import { AppError, notFound } from '../../errors';
import { CatalogueError, type CatalogueRowReport, parseCatalogue } from './parse-catalogue';

export interface CatalogueImport {
  created: number;
  updated: number;
  rejected: number;
  rows: (CatalogueRowReport & { outcome?: 'created' | 'updated' })[];
}

/** Inserts or updates the catalogue's stars by designation, all in one transaction, with a report per row. */
export async function importCatalogue(
  db: Db,
  actor: PersonRow,
  campaignId: number,
  bytes: Buffer | undefined,
): Promise<CatalogueImport> {
  const campaign = await findCampaignById(db, campaignId);
  if (!campaign) throw notFound('Campaign');
  if (campaign.status === 'closed')
    throw new AppError('campaign_closed', 'This campaign is closed', 'conflict');
  if (!bytes || bytes.length === 0)
    throw new AppError('empty_file', 'The catalogue file is empty', 'invalid', { file: 'Empty file' });
  if (bytes.includes(0)) {
    throw new AppError('unsupported_file_type', 'The catalogue must be a CSV text file', 'unsupported_type', {
      file: 'Not text',
    });
  }
  let parsed: ReturnType<typeof parseCatalogue>;
  try {
    parsed = parseCatalogue(bytes.toString('utf8'));
  } catch (error) {
    if (error instanceof CatalogueError)
      throw new AppError('bad_catalogue', error.message, 'invalid', { file: error.message });
    throw error;
  }
  return writeTransaction(db, async (trx) => {
    const outcomes = new Map<number, 'created' | 'updated'>();
    for (const { line, fields } of parsed.targets) {
      const { created } = await upsertTarget(trx, campaignId, fields);
      outcomes.set(line, created ? 'created' : 'updated');
    }
    const created = [...outcomes.values()].filter((o) => o === 'created').length;
    const rejected = parsed.report.filter((row) => row.status === 'rejected').length;
    await appendAudit(trx, {
      actorId: actor.id,
      action: 'catalogue.imported',
      entityType: 'campaign',
      entityId: campaignId,
      after: { created, updated: outcomes.size - created, rejected },
    });
    return {
      created,
      updated: outcomes.size - created,
      rejected,
      rows: parsed.report.map((row) =>
        outcomes.has(row.line) ? { ...row, outcome: outcomes.get(row.line)! } : row,
      ),
    };
  });
}
