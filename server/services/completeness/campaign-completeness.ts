import { findCampaignById } from '../../db/campaigns';
import { type ControlSnippetRow, listControlSnippets } from '../../db/completeness';
import type { Db } from '../../db/knex';
import { notFound } from '../../errors';
import {
  type CompletenessTable,
  type ControlOutcome,
  completenessTable,
  type PlantedControl,
} from '../../science/completeness';

// An outcome counts once the snippet is settled or ruled; an open or split control is pending even if
// an older outcome is still on its row.
function settledOutcome(row: ControlSnippetRow): ControlOutcome {
  return row.state === 'settled' || row.state === 'ruled' ? row.outcome : null;
}

const finiteOrNull = (value: unknown): number | null =>
  typeof value === 'number' && Number.isFinite(value) ? value : null;

/**
 * How completely the campaign's volunteers find planted dips, by injected SNR, depth and duration, and
 * how often they call a quiet control a dip (see completenessTable for what counts).
 */
export async function campaignCompleteness(db: Db, campaignId: number): Promise<CompletenessTable> {
  const campaign = await findCampaignById(db, campaignId);
  if (!campaign) throw notFound('Campaign');
  const rows = await listControlSnippets(db, campaignId);
  const planted: PlantedControl[] = [];
  const quiet: { outcome: ControlOutcome }[] = [];
  for (const row of rows) {
    const outcome = settledOutcome(row);
    if (row.kind === 'quiet') {
      quiet.push({ outcome });
      continue;
    }
    planted.push({
      expectedSnr: finiteOrNull(row.plantedTruth?.expectedSnr),
      depthPpm: finiteOrNull(row.plantedTruth?.depthPpm),
      durationHours: finiteOrNull(row.plantedTruth?.durationHours),
      outcome,
    });
  }
  return completenessTable(planted, quiet, {
    snrRange: { min: campaign.plantedSnrMin, max: campaign.plantedSnrMax },
  });
}
