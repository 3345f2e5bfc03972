import type { CampaignConsensusSettings, ReliabilityRow } from '../../db/consensus';
import { DEFAULT_PRIORS } from '../../science/consensus/em';
import { reliabilityFromCounts } from '../../science/consensus/posterior';
import type { ConsensusPriors, Reliability } from '../../science/consensus/types';

/** The campaign's priors: its typical volunteer once a full re-estimate has fitted one, else the defaults. */
export function campaignPriors(settings: CampaignConsensusSettings): ConsensusPriors {
  return {
    sensitivity: settings.typicalSensitivity ?? DEFAULT_PRIORS.sensitivity,
    specificity: settings.typicalSpecificity ?? DEFAULT_PRIORS.specificity,
    dipRate: DEFAULT_PRIORS.dipRate,
  };
}

/**
 * π: the last re-estimate's. Before the first one, the planted share plus one per cent for real dips:
 * planted dips are the only dips known to be there, and real ones are rare (our own starting choice).
 */
export function campaignDipRate(settings: CampaignConsensusSettings): number {
  if (settings.priorDipRate !== null) return settings.priorDipRate;
  return Math.min(0.5, Math.max(0.01, settings.plantedShare + 0.01));
}

/**
 * A volunteer's reliability between two full re-estimates: the campaign's prior, plus the expected
 * counts the last re-estimate found on snippets that are not controls, plus their exact control counts
 * as of now. A newcomer without a row gets the campaign's typical volunteer.
 */
export function currentReliability(row: ReliabilityRow | undefined, priors: ConsensusPriors): Reliability {
  return reliabilityFromCounts(
    {
      dipSeen: (row?.dipSeen ?? 0) + (row?.plantedSeen ?? 0),
      dipSaid: (row?.dipSaid ?? 0) + (row?.plantedFound ?? 0),
      flatSeen: (row?.flatSeen ?? 0) + (row?.quietSeen ?? 0),
      flatSaid: (row?.flatSaid ?? 0) + (row?.quietCorrect ?? 0),
    },
    priors,
  );
}
