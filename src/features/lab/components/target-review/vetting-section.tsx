import { Badge } from '@/components/badge';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { isApiError } from '@/lib/api-client';
import { usePeriodSearch } from '../../api/get-period-search';
import { useVetting, type Vetting, type VettingDiagnostic } from '../../api/get-vetting';
import { formatPeriodDays } from '../../lib/period-search';
import {
  decimalsForError,
  formatDiagnosticValue,
  formatMeasurement,
  formatPercent,
  hasError,
  verdictLabels,
  verdictTones,
  vettingSourceLabels,
  warningCount,
} from '../../lib/vetting';

/** `hasDips`: whether the target has settled dips; without them and without a finished search there is nothing to ask. */
export function VettingSection({ targetId, hasDips }: { targetId: number; hasDips: boolean }) {
  const search = usePeriodSearch(targetId);
  const searched = search.data?.status === 'done';
  const vetting = useVetting(targetId, { enabled: hasDips || searched });
  const nothingYet = !hasDips && !searched && !search.isPending;
  return (
    <section aria-labelledby="vetting-heading" className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id="vetting-heading" className="text-xl font-semibold text-ink">
          Vetting
        </h2>
        <p className="max-w-2xl text-base text-muted">
          What the transit would mean if a planet made it, and the tests that would catch an eclipsing binary
          or a systematic. A candidate is not a confirmed planet: these numbers decide whether it is worth a
          telescope’s time.
        </p>
      </div>
      {nothingYet ? (
        <NothingToVet message="This target has no settled dip and no finished period search yet" />
      ) : vetting.isPending ? (
        <Loading label="Vetting the target…" />
      ) : vetting.isError ? (
        isApiError(vetting.error) && vetting.error.status === 409 ? (
          <NothingToVet message={vetting.error.message} />
        ) : (
          <LoadFailure
            title="Could not vet the target"
            error={vetting.error}
            onRetry={() => vetting.refetch()}
          />
        )
      ) : (
        <VettingView vetting={vetting.data} />
      )}
    </section>
  );
}

function NothingToVet({ message }: { message: string }) {
  return (
    <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
      <span className="font-semibold text-ink">Nothing to vet yet. </span>
      {message}.
    </p>
  );
}

function VettingView({ vetting }: { vetting: Vetting }) {
  const { transit, derived } = vetting;
  const { radius, orbit } = derived;
  const measured = hasError(transit.depthErrPpm);
  const items: { label: string; value: string; detail?: string }[] = [
    {
      label: 'Planet radius',
      value: formatMeasurement(radius.radiusEarth, radius.radiusEarthErr, 'R⊕', 2),
      detail: formatMeasurement(radius.radiusJupiter, radius.radiusJupiterErr, 'RJ', 3),
    },
    { label: 'Rp / R★', value: formatMeasurement(radius.radiusRatio, radius.radiusRatioErr, '', 4) },
    ...(orbit
      ? [
          {
            label: 'Semi-major axis a',
            value: formatMeasurement(orbit.semiMajorAxisAu, orbit.semiMajorAxisErrAu, 'AU', 4),
          },
          { label: 'a / R★', value: formatMeasurement(orbit.aOverRstar, null, '', 2) },
          {
            label: 'Equilibrium temperature',
            value: formatMeasurement(orbit.equilibriumTemperatureK, null, 'K', 0),
            detail: 'zero albedo, heat spread over the planet',
          },
        ]
      : []),
    {
      label: 'Stellar density',
      value: formatMeasurement(derived.stellarDensityGcm3, null, 'g/cm³', 2),
      detail: 'from the catalogue’s mass and radius',
    },
  ];

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-col gap-2 rounded-lg border border-line bg-surface p-4 text-sm text-ink">
        <p>
          <span className="font-semibold">From </span>
          {vettingSourceLabels[vetting.source]}:{' '}
          <span className="tabular">
            {transit.periodDays === null ? 'no period' : `P = ${formatPeriodDays(transit.periodDays)}`}, depth{' '}
            {formatMeasurement(transit.depthPpm, transit.depthErrPpm, 'ppm', 0)}, duration{' '}
            {transit.durationHours.toFixed(2)} h, SNR {transit.snr.toFixed(1)}
          </span>
          .
        </p>
        {measured ? null : (
          <p className="text-muted">
            A single dip’s depth comes without an error, so the sizes below have none either.
          </p>
        )}
      </div>

      <TransitOdds vetting={vetting} />

      <div className="flex flex-col gap-3">
        <h3 className="text-lg font-semibold text-ink">Derived parameters</h3>
        <dl className="grid grid-cols-2 gap-3 md:grid-cols-3">
          {items.map((item) => (
            <div
              key={item.label}
              className="flex flex-col gap-1 rounded-lg border border-line bg-surface p-4"
            >
              <dt className="text-sm font-medium text-ink">{item.label}</dt>
              <dd className="tabular text-base text-ink sm:text-lg">{item.value}</dd>
              {item.detail ? <dd className="tabular text-xs text-muted">{item.detail}</dd> : null}
            </div>
          ))}
        </dl>
      </div>

      <Diagnostics diagnostics={vetting.diagnostics} />
    </div>
  );
}

function TransitOdds({ vetting }: { vetting: Vetting }) {
  const { orbit, singleTransitPeriodRange: range } = vetting.derived;
  if (orbit) {
    return (
      <div className="flex flex-col gap-2 rounded-lg border-2 border-amber bg-amber-wash p-4 md:p-6">
        <h3 className="text-sm font-semibold tracking-[0.08em] text-amber-ink uppercase">
          Geometric transit probability
        </h3>
        <p className="tabular text-3xl font-semibold text-ink">
          {formatPercent(orbit.transitProbability)}
          {hasError(orbit.transitProbabilityErr) ? (
            <span className="ml-2 text-base font-normal text-muted">
              ±{' '}
              {formatPercent(
                orbit.transitProbabilityErr,
                decimalsForError(orbit.transitProbabilityErr * 100) ?? 2,
              )}
            </span>
          ) : null}
        </p>
        <p className="max-w-3xl text-lg text-ink">{orbit.statement}</p>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-2 rounded-lg border-2 border-amber bg-amber-wash p-4 md:p-6">
      <h3 className="text-sm font-semibold tracking-[0.08em] text-amber-ink uppercase">
        Period allowed by a single transit
      </h3>
      {range ? (
        <>
          <p className="tabular text-3xl font-semibold text-ink">
            {formatPeriodDays(range.periodMinDays)} – {formatPeriodDays(range.periodMaxDays)}
          </p>
          <p className="max-w-3xl text-base text-ink">
            One dip gives no period. Its duration and the star’s density allow this range, for impact
            parameters from {range.impactMin} (a central transit, the shortest period) to {range.impactMax} (a
            grazing chord). Run a period search when more dips are found; the orbit and the chance of seeing
            it transit follow from a period.
          </p>
        </>
      ) : (
        <p className="max-w-3xl text-base text-ink">
          No period range: the dip is as deep as the star is wide (Rp/R★ ≥ 1), which no planet makes.
        </p>
      )}
    </div>
  );
}

function Diagnostics({ diagnostics }: { diagnostics: readonly VettingDiagnostic[] }) {
  const warnings = warningCount(diagnostics);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1">
        <h3 className="text-lg font-semibold text-ink">Diagnostics</h3>
        <p className="text-sm text-muted">
          {diagnostics.length === 0
            ? 'No diagnostic applies to this transit.'
            : warnings === 0
              ? `All ${diagnostics.length} pass.`
              : `${warnings} of ${diagnostics.length} warn: look at ${warnings === 1 ? 'it' : 'them'} before promoting.`}
        </p>
      </div>
      <ul className="flex flex-col gap-2">
        {diagnostics.map((diagnostic) => (
          <li
            key={diagnostic.code}
            data-diagnostic={diagnostic.code}
            className={`flex flex-col gap-1 rounded-lg border bg-surface p-4 sm:flex-row sm:items-start sm:gap-4 ${
              diagnostic.verdict === 'warn' ? 'border-amber' : 'border-line'
            }`}
          >
            <span className="flex shrink-0 items-center gap-2 sm:w-20">
              <Badge tone={verdictTones[diagnostic.verdict]}>
                <span aria-hidden="true" className="mr-1">
                  {diagnostic.verdict === 'warn' ? '!' : '✓'}
                </span>
                {verdictLabels[diagnostic.verdict]}
              </Badge>
            </span>
            <div className="flex min-w-0 flex-1 flex-col gap-0.5">
              <p className="flex flex-wrap items-baseline justify-between gap-x-3 text-base font-medium text-ink">
                {diagnostic.label}
                <span className="tabular text-base font-semibold">
                  {formatDiagnosticValue(diagnostic.value)}
                </span>
              </p>
              <p className="text-sm text-muted">{diagnostic.detail}</p>
            </div>
          </li>
        ))}
      </ul>
    </div>
  );
}
