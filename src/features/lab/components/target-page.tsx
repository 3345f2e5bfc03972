import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button, ButtonLink, buttonClasses } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LightCurvePlot, type PlotBand, type PlotMarker } from '@/components/light-curve-plot';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { fluxToPpm } from '@/lib/light-curve';
import {
  type TargetDetail,
  type TargetDip,
  type TargetLightCurve,
  type TargetSnippet,
  useTarget,
} from '../api/get-target';
import { formatCount, plural } from '../lib/format';
import type { SeriesPart } from '../lib/period-search';
import {
  formatDays,
  formatScore,
  plantedTimeDays,
  snippetKindLabels,
  snippetKindTones,
  snippetStateLabels,
  snippetStateTones,
} from '../lib/snippets';
import { fieldLabel, formatDec, formatNumber, formatRa } from '../lib/targets';
import { DipsTable } from './target-review/dips-table';
import { PeriodSearchSection } from './target-review/period-search-section';
import { PromotionSection } from './target-review/promotion-section';
import { VettingSection } from './target-review/vetting-section';

export function TargetPage({ targetId }: { targetId: number }) {
  const target = useTarget(targetId);

  if (target.isPending) return <Loading label="Loading the target…" />;
  if (target.isError) {
    const missing = isApiError(target.error) && target.error.status === 404;
    return missing ? (
      <EmptyState
        title="No such target"
        action={<ButtonLink to={paths.lab.getHref()}>All campaigns</ButtonLink>}
      >
        <p>There is no target with the number {targetId}. The link may be old.</p>
      </EmptyState>
    ) : (
      <LoadFailure title="Could not load the target" error={target.error} onRetry={() => target.refetch()} />
    );
  }
  return <TargetView detail={target.data} />;
}

function TargetView({ detail }: { detail: TargetDetail }) {
  const { target, lightCurves, snippets, dips, candidateId } = detail;
  const [hovered, setHovered] = useState<number | null>(null);
  // The period search folds what it searched: the target's light curves other than quiet references.
  const parts = useMemo<SeriesPart[]>(
    () =>
      lightCurves
        .filter((lightCurve) => !lightCurve.isQuietReference)
        .map((lightCurve) => ({
          timeDays: lightCurve.series.timeDays,
          fluxPpm: fluxToPpm(lightCurve.series.flux),
        })),
    [lightCurves],
  );

  return (
    <div className="flex flex-col gap-10">
      <div className="flex flex-col gap-4">
        <Link
          to={paths.labCampaign.getHref(target.campaignId)}
          className="inline-flex min-h-target items-center gap-1.5 self-start rounded-md pr-3 text-sm font-medium text-muted hover:text-ink"
        >
          <span aria-hidden="true">←</span> The campaign
        </Link>
        <PageHeader
          eyebrow={`Target · #${target.id}`}
          title={target.designation}
          description={`${lightCurves.length === 1 ? 'One light curve' : `${formatCount(lightCurves.length)} light curves`}, ${plural(dips.length, 'settled dip')} and ${formatCount(snippets.length)} snippets. Planted transits are marked: this page is for staff only.`}
          actions={
            <>
              {candidateId === null ? (
                <a href="#promotion" className={buttonClasses('primary')}>
                  Promote…
                </a>
              ) : (
                <ButtonLink to={paths.labCandidate.getHref(candidateId)}>Candidate #{candidateId}</ButtonLink>
              )}
              <ButtonLink
                variant="secondary"
                to={paths.labSnippets.getHref(target.campaignId, { target: target.designation })}
              >
                Its snippets in the browser
              </ButtonLink>
            </>
          }
        />
      </div>

      <StellarParameters target={target} />

      <section aria-labelledby="light-curves-heading" className="flex flex-col gap-6">
        <h2 id="light-curves-heading" className="text-xl font-semibold text-ink">
          Light curves
        </h2>
        {lightCurves.length === 0 ? (
          <EmptyState title="No light curve yet">
            <p>
              Upload a light curve of {target.designation} on the campaign page; it is drawn here once read.
            </p>
          </EmptyState>
        ) : (
          lightCurves.map((lightCurve, index) => (
            <LightCurveSection
              key={lightCurve.id}
              lightCurve={lightCurve}
              index={index}
              designation={target.designation}
              snippets={snippets}
              dips={dips}
              hovered={hovered}
            />
          ))
        )}
      </section>

      <section aria-labelledby="dips-heading" className="flex flex-col gap-4">
        <div className="flex flex-col gap-1">
          <h2 id="dips-heading" className="text-xl font-semibold text-ink">
            Dips
          </h2>
          <p className="max-w-2xl text-base text-muted">
            The settled dips volunteers found, each drawn as a dark line on the light curve. Point at one to
            find its snippet’s band.
          </p>
        </div>
        <DipsTable dips={dips} hoveredSnippet={hovered} onHoverSnippet={setHovered} />
      </section>

      <PeriodSearchSection targetId={target.id} designation={target.designation} parts={parts} />

      <VettingSection targetId={target.id} hasDips={detail.dips.length > 0} />

      <PromotionSection
        campaignId={target.campaignId}
        targetId={target.id}
        designation={target.designation}
        dips={dips}
        candidateId={candidateId}
      />

      <section aria-labelledby="target-snippets-heading" className="flex flex-col gap-4">
        <div className="flex flex-col gap-1">
          <h2 id="target-snippets-heading" className="text-xl font-semibold text-ink">
            Snippets
          </h2>
          <p className="max-w-2xl text-base text-muted">
            Point at a snippet to find its band on the light curve above.
          </p>
        </div>
        <TargetSnippets snippets={snippets} onHover={setHovered} hovered={hovered} />
      </section>
    </div>
  );
}

function StellarParameters({ target }: { target: TargetDetail['target'] }) {
  const assumed = new Set(target.assumedFields);
  const items = [
    { key: 'raDeg', label: 'RA', value: formatRa(target.raDeg), detail: formatNumber(target.raDeg, 5, '°') },
    {
      key: 'decDeg',
      label: 'Dec',
      value: formatDec(target.decDeg),
      detail: formatNumber(target.decDeg, 5, '°'),
    },
    { key: 'magnitude', label: 'Magnitude', value: formatNumber(target.magnitude, 2) },
    {
      key: 'stellarRadiusRsun',
      label: 'Stellar radius',
      value: formatNumber(target.stellarRadiusRsun, 3, 'R☉'),
    },
    { key: 'stellarMassMsun', label: 'Stellar mass', value: formatNumber(target.stellarMassMsun, 3, 'M☉') },
    { key: 'teffK', label: 'Effective temperature', value: formatNumber(target.teffK, 0, 'K') },
  ];
  return (
    <section aria-labelledby="stellar-heading" className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id="stellar-heading" className="text-xl font-semibold text-ink">
          The star
        </h2>
        {assumed.size > 0 ? (
          <p className="max-w-2xl text-base text-muted">
            The catalogue left out {[...assumed].map(fieldLabel).join(', ')}; Sun-like values are assumed, so
            planet sizes derived from them are rough.
          </p>
        ) : null}
      </div>
      <dl className="grid grid-cols-2 gap-3 md:grid-cols-3 lg:grid-cols-6">
        {items.map((item) => (
          <div
            key={item.key}
            className={`flex flex-col gap-1 rounded-lg border p-4 ${
              assumed.has(item.key) ? 'border-amber border-dashed bg-surface' : 'border-line bg-surface'
            }`}
          >
            <dt className="flex flex-wrap items-center gap-2 text-sm font-medium text-ink">
              {item.label}
              {assumed.has(item.key) ? <Badge tone="amber">assumed</Badge> : null}
            </dt>
            <dd className="tabular text-lg text-ink">{item.value}</dd>
            {item.detail ? <dd className="tabular text-xs text-muted">{item.detail}</dd> : null}
          </div>
        ))}
      </dl>
    </section>
  );
}

function timeAxisLabel(lightCurve: TargetLightCurve): string {
  const system = lightCurve.timeSystem;
  const reference = system?.bjdRefDays;
  const scale = system?.timesys ? `BJD_${system.timesys}` : 'BJD';
  if (typeof reference === 'number' && reference !== 0) return `time (${scale} − ${reference}, days)`;
  return system?.timesys ? `time (${scale}, days)` : 'time (days)';
}

function snippetsOf(lightCurve: TargetLightCurve, snippets: readonly TargetSnippet[]): TargetSnippet[] {
  return snippets.filter(
    (snippet) => snippet.timeEnd > lightCurve.timeStart && snippet.timeStart < lightCurve.timeEnd,
  );
}

interface LightCurveSectionProps {
  lightCurve: TargetLightCurve;
  index: number;
  designation: string;
  snippets: readonly TargetSnippet[];
  dips: readonly TargetDip[];
  hovered: number | null;
}

function LightCurveSection({
  lightCurve,
  index,
  designation,
  snippets,
  dips,
  hovered,
}: LightCurveSectionProps) {
  const x = lightCurve.series.timeDays;
  const y = useMemo(() => fluxToPpm(lightCurve.series.flux), [lightCurve.series.flux]);
  const own = useMemo(() => snippetsOf(lightCurve, snippets), [lightCurve, snippets]);

  // Real and quiet snippets are the windows volunteers see; planted ones share those windows, so they
  // are drawn as marks at their planted t0 instead of a second band.
  const bands = useMemo<PlotBand[]>(
    () =>
      own
        .filter((snippet) => snippet.kind !== 'planted')
        .map((snippet) => ({
          start: snippet.timeStart,
          end: snippet.timeEnd,
          tone:
            snippet.kind === 'quiet'
              ? 'slate'
              : snippet.consensusScore !== null && snippet.consensusScore >= 0.5
                ? 'amber'
                : 'muted',
          label: snippet.consensusScore === null ? undefined : formatScore(snippet.consensusScore),
          emphasis: snippet.id === hovered,
        })),
    [own, hovered],
  );
  const markers = useMemo<PlotMarker[]>(
    () =>
      own.flatMap((snippet) => {
        if (snippet.kind !== 'planted' || !snippet.plantedTruth) return [];
        const at = plantedTimeDays(snippet.plantedTruth, snippet);
        return at === null ? [] : [{ x: at, label: `#${snippet.id}` }];
      }),
    [own],
  );
  const ownDips = useMemo(
    () =>
      dips.filter((dip) => dip.timeCenter >= lightCurve.timeStart && dip.timeCenter <= lightCurve.timeEnd),
    [dips, lightCurve],
  );
  // Dips are drawn as solid ink lines, so they never read as the amber dashed marks of planted transits.
  const allMarkers = useMemo<PlotMarker[]>(
    () => [...markers, ...ownDips.map((dip) => ({ x: dip.timeCenter, tone: 'ink' as const }))],
    [markers, ownDips],
  );
  const hoveredPlanted = own.find((snippet) => snippet.id === hovered && snippet.kind === 'planted');
  const highlighted = useMemo<PlotBand[]>(
    () =>
      hoveredPlanted
        ? [
            ...bands,
            { start: hoveredPlanted.timeStart, end: hoveredPlanted.timeEnd, tone: 'amber', emphasis: true },
          ]
        : bands,
    [bands, hoveredPlanted],
  );
  const spanDays = lightCurve.timeEnd - lightCurve.timeStart;
  const cadenceMinutes = lightCurve.cadenceDays === null ? null : lightCurve.cadenceDays * 24 * 60;

  return (
    <article
      aria-labelledby={`light-curve-${lightCurve.id}`}
      className="flex min-w-0 flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-6"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h3 id={`light-curve-${lightCurve.id}`} className="text-lg font-semibold text-ink">
          Light curve {index + 1}
          <span className="tabular ml-2 text-sm font-normal text-muted">#{lightCurve.id}</span>
        </h3>
        <span className="flex flex-wrap gap-2">
          {lightCurve.isQuietReference ? <Badge tone="slate">Quiet reference</Badge> : null}
          <Badge tone="slate">{own.filter((snippet) => snippet.kind !== 'planted').length} windows</Badge>
          {ownDips.length > 0 ? <Badge tone="slate">{plural(ownDips.length, 'dip')}</Badge> : null}
          {markers.length > 0 ? <Badge tone="amber">{markers.length} planted</Badge> : null}
        </span>
      </div>
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="This light curve could not be drawn">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        {x.length > 0 ? (
          <LightCurvePlot
            x={x}
            y={y}
            xLabel={timeAxisLabel(lightCurve)}
            yLabel="flux (ppm)"
            xUnit="d"
            yUnit="ppm"
            height={320}
            zoomable
            bands={highlighted}
            markers={allMarkers}
            label={`Light curve of ${designation}: ${formatCount(lightCurve.pointCount)} points over ${spanDays.toFixed(1)} days, ${bands.length} snippet windows shaded${
              ownDips.length
                ? `, dips at ${ownDips.map((dip) => dip.timeCenter.toFixed(3)).join(', ')} days drawn as lines`
                : ''
            }${markers.length ? `, ${markers.length} planted transits marked` : ''}`}
          />
        ) : (
          <p className="text-sm text-muted">The stored light curve has no points to draw.</p>
        )}
      </ErrorBoundary>
      <Legend />
      <dl className="grid grid-cols-2 gap-x-6 gap-y-3 border-t border-line pt-4 text-sm sm:grid-cols-3 lg:grid-cols-6">
        <Fact
          label="Time span"
          value={`${formatDays(lightCurve.timeStart)} – ${formatDays(lightCurve.timeEnd)}`}
          wide
        />
        <Fact label="Points" value={formatCount(lightCurve.pointCount)} />
        <Fact label="Cadence" value={cadenceMinutes === null ? '—' : `${cadenceMinutes.toFixed(1)} min`} />
        <Fact label="Noise per point" value={formatNumber(lightCurve.noisePpm, 0, 'ppm')} />
        <Fact label="Noise over 1 h" value={formatNumber(lightCurve.noise1hPpm, 0, 'ppm')} />
        <Fact
          label="Time system"
          value={
            [lightCurve.timeSystem?.timesys, lightCurve.timeSystem?.timeref].filter(Boolean).join(' · ') ||
            '—'
          }
          wide
        />
      </dl>
    </article>
  );
}

function Legend() {
  const items = [
    { swatch: 'bg-amber/30 border-amber', text: 'snippet with consensus score ≥ 0.50' },
    { swatch: 'bg-edge/15 border-edge', text: 'other snippet window' },
    { swatch: 'bg-slate/15 border-slate', text: 'quiet control' },
  ];
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-2 text-xs text-muted">
      {items.map((item) => (
        <li key={item.text} className="flex items-center gap-2">
          <span aria-hidden="true" className={`h-3 w-5 rounded-sm border ${item.swatch}`} />
          {item.text}
        </li>
      ))}
      <li className="flex items-center gap-2">
        <span aria-hidden="true" className="h-3 w-0.5 bg-ink" />
        dip volunteers found (settled), at its centre
      </li>
      <li className="flex items-center gap-2">
        <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 fill-amber">
          <path d="M0 0h12L6 10z" />
        </svg>
        planted transit centre, with its snippet number
      </li>
    </ul>
  );
}

function Fact({ label, value, wide = false }: { label: string; value: string; wide?: boolean }) {
  return (
    <div className={`flex flex-col ${wide ? 'col-span-2' : ''}`}>
      <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">{label}</dt>
      <dd className="tabular text-ink">{value}</dd>
    </div>
  );
}

function TargetSnippets({
  snippets,
  hovered,
  onHover,
}: {
  snippets: readonly TargetSnippet[];
  hovered: number | null;
  onHover: (id: number | null) => void;
}) {
  if (snippets.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        No snippets have been cut for this target yet.
      </p>
    );
  }
  return (
    <Table caption="Snippets of this target">
      <TableHead>
        <Th>Snippet</Th>
        <Th>Kind · state</Th>
        <Th>Time</Th>
        <Th className="text-right">Consensus score</Th>
        <Th>Planted</Th>
      </TableHead>
      <TableBody>
        {snippets.map((snippet) => (
          <Tr
            key={snippet.id}
            selected={snippet.id === hovered}
            onMouseEnter={() => onHover(snippet.id)}
            onMouseLeave={() => onHover(null)}
          >
            <Td label="Snippet">
              <span className="tabular font-medium text-ink">#{snippet.id}</span>
            </Td>
            <Td label="Kind · state">
              <span className="flex flex-wrap justify-end gap-1.5 md:justify-start">
                <Badge tone={snippetKindTones[snippet.kind]}>{snippetKindLabels[snippet.kind]}</Badge>
                <Badge tone={snippetStateTones[snippet.state]}>{snippetStateLabels[snippet.state]}</Badge>
              </span>
            </Td>
            <Td label="Time">
              <span className="tabular text-sm text-ink md:whitespace-nowrap">
                {formatDays(snippet.timeStart)} – {formatDays(snippet.timeEnd)}
              </span>
            </Td>
            <Td label="Consensus score" className="md:text-right">
              <span
                className={`tabular ${
                  snippet.consensusScore !== null && snippet.consensusScore >= 0.5
                    ? 'text-amber-ink'
                    : 'text-slate'
                }`}
              >
                {formatScore(snippet.consensusScore)}
              </span>
            </Td>
            <Td label="Planted">
              {snippet.plantedTruth ? (
                <span className="tabular text-sm text-amber-ink md:whitespace-nowrap">
                  {Math.round(snippet.plantedTruth.depthPpm)} ppm ·{' '}
                  {snippet.plantedTruth.durationHours.toFixed(1)} h
                </span>
              ) : (
                <span className="text-sm text-muted">—</span>
              )}
            </Td>
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}
