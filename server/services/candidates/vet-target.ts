import { findCampaignById } from '../../db/campaigns';
import { dipsOfTarget } from '../../db/candidates';
import type { Db } from '../../db/knex';
import { latestPeriodSearch, targetSeries } from '../../db/period-searches';
import { findTargetById } from '../../db/targets';
import { AppError, notFound } from '../../errors';
import { fitTransitShape } from '../../science/transit-shape';
import { derivedParameters, type TransitMeasurement, vettingDiagnostics } from '../../science/vetting';

interface DiagnosticsSummary {
  depthErrPpm?: number | null;
  oddEvenDifferenceSigma?: number | null;
  depthSecondaryPpm?: number | null;
  depthSecondaryErrPpm?: number | null;
}

/**
 * A target's derived parameters and vetting diagnostics: from its latest finished period search when
 * there is one, else from its strongest dip as a single transit.
 */
export async function vetTarget(db: Db, targetId: number) {
  const target = await findTargetById(db, targetId);
  if (!target) throw notFound('Target');
  const campaign = await findCampaignById(db, target.campaignId);
  if (target.stellarRadiusRsun === null || target.stellarMassMsun === null || target.teffK === null) {
    throw new AppError(
      'no_stellar_parameters',
      'The catalogue gives this star no radius, mass or temperature; add them to vet it',
      'conflict',
    );
  }
  const star = {
    radiusRsun: target.stellarRadiusRsun,
    massMsun: target.stellarMassMsun,
    teffK: target.teffK,
  };
  const search = await latestPeriodSearch(db, target.id);
  let transit: TransitMeasurement | null = null;
  let t0Days: number | null = null;
  let source: 'period-search' | 'dip' = 'period-search';
  if (search?.status === 'done' && search.result?.best) {
    const best = search.result.best as Record<string, number>;
    const atBest = ((search.result.diagnostics as { atBest?: DiagnosticsSummary } | null)?.atBest ??
      {}) as DiagnosticsSummary;
    t0Days = best.t0Days ?? null;
    transit = {
      periodDays: best.periodDays!,
      depthPpm: best.depthPpm!,
      depthErrPpm: best.depthErrPpm ?? null,
      durationHours: best.durationHours!,
      snr: best.snr!,
      oddEvenDifferenceSigma: atBest.oddEvenDifferenceSigma ?? null,
      depthSecondaryPpm: atBest.depthSecondaryPpm ?? null,
      depthSecondaryErrPpm: atBest.depthSecondaryErrPpm ?? null,
    };
  } else {
    const strongest = (await dipsOfTarget(db, target.campaignId, target.id))
      .filter((dip) => dip.depthPpm && dip.depthPpm > 0 && dip.durationHours && dip.snr)
      .sort((a, b) => (b.snr ?? 0) - (a.snr ?? 0))[0];
    if (strongest) {
      source = 'dip';
      t0Days = strongest.timeCenter;
      transit = {
        periodDays: null,
        depthPpm: strongest.depthPpm!,
        // The dip's SNR is depth / σ_depth (measure-dip.ts), so its depth error follows from it.
        depthErrPpm: strongest.depthPpm! / strongest.snr!,
        durationHours: strongest.durationHours!,
        snr: strongest.snr!,
      };
    }
  }
  if (!transit) {
    throw new AppError(
      'nothing_to_vet',
      'This target has no finished period search and no measured dip yet',
      'conflict',
    );
  }
  if (t0Days !== null) {
    // The light curve's own days, as the search's t0 and the dips' times are.
    const series = await targetSeries(db, target.id);
    transit.shape = series
      ? fitTransitShape({
          timeDays: series.timeDays,
          flux: series.flux,
          periodDays: transit.periodDays,
          t0Days,
          durationHours: transit.durationHours,
        })
      : null;
  }
  return {
    vetting: {
      source,
      transit,
      star,
      derived: derivedParameters(transit, star),
      diagnostics: vettingDiagnostics(transit, star, campaign?.snrThreshold),
    },
  };
}
