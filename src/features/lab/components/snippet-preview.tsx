import { useMemo } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { LightCurvePlot, type PlotMarker } from '@/components/light-curve-plot';
import { Loading } from '@/components/loading';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { daysToHours, fluxToPpm } from '@/lib/light-curve';
import { useSnippet } from '../api/get-snippet';
import {
  formatDays,
  formatScore,
  plantedOffsetDays,
  type SnippetDetail,
  snippetKindLabels,
  snippetKindTones,
  snippetStateLabels,
  snippetStateTones,
} from '../lib/snippets';

/** The snippet as volunteers see it, with what staff may know: the planted truth and the score. */
export function SnippetPreview({ snippetId, headingId }: { snippetId: number | null; headingId: string }) {
  const snippet = useSnippet(snippetId);

  return (
    <section
      aria-labelledby={headingId}
      className="flex min-w-0 flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-5"
    >
      <h2 id={headingId} className="text-lg font-semibold text-ink">
        {snippetId === null ? 'Preview' : `Snippet #${snippetId}`}
      </h2>
      {snippetId === null ? (
        <p className="text-base text-muted">
          Point at a snippet in the list, or choose Preview, to see its light curve here.
        </p>
      ) : snippet.isPending ? (
        <Loading label="Loading the snippet…" />
      ) : snippet.isError ? (
        <Alert tone="danger" title="Could not load the snippet">
          {isApiError(snippet.error) ? snippet.error.message : 'Something went wrong.'}
        </Alert>
      ) : (
        <SnippetDetails snippet={snippet.data} stale={snippet.data.id !== snippetId} />
      )}
    </section>
  );
}

function SnippetDetails({ snippet, stale }: { snippet: SnippetDetail; stale: boolean }) {
  const x = useMemo(() => daysToHours(snippet.display.offsetDays), [snippet.display.offsetDays]);
  const y = useMemo(() => fluxToPpm(snippet.display.flux), [snippet.display.flux]);
  const truth = snippet.plantedTruth;
  const markers = useMemo<PlotMarker[]>(() => {
    if (!truth) return [];
    const offset = plantedOffsetDays(truth, snippet);
    return offset === null ? [] : [{ x: offset * 24, label: 'planted t0' }];
  }, [truth, snippet]);
  const lengthHours = (snippet.timeEnd - snippet.timeStart) * 24;

  return (
    <div className={`flex flex-col gap-4 transition-opacity ${stale ? 'opacity-60' : ''}`}>
      <div className="flex flex-wrap items-center gap-2">
        <Badge tone={snippetKindTones[snippet.kind]}>{snippetKindLabels[snippet.kind]}</Badge>
        <Badge tone={snippetStateTones[snippet.state]}>{snippetStateLabels[snippet.state]}</Badge>
        <Link
          to={paths.labTarget.getHref(snippet.targetId)}
          className="tabular inline-flex min-h-target items-center rounded-sm px-1 text-sm font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
        >
          {snippet.designation}
        </Link>
      </div>
      {x.length > 0 ? (
        <LightCurvePlot
          x={x}
          y={y}
          xLabel="hours from snippet start"
          yLabel="flux (ppm)"
          xUnit="h"
          yUnit="ppm"
          height={220}
          markers={markers}
          label={`Snippet ${snippet.id} of ${snippet.designation}: ${snippet.display.offsetDays.length} points over ${lengthHours.toFixed(1)} hours${
            markers.length ? ', with the planted transit centre marked' : ''
          }`}
        />
      ) : (
        <p className="text-sm text-muted">This snippet has no points to show.</p>
      )}
      <dl className="grid grid-cols-2 gap-x-4 gap-y-3 text-sm">
        <Fact label="Time" value={`${formatDays(snippet.timeStart)} – ${formatDays(snippet.timeEnd)}`} wide />
        <Fact label="Points" value={String(snippet.pointCount)} />
        <Fact label="Verdicts" value={String(snippet.verdictCount)} />
        <Fact label="Consensus score" value={formatScore(snippet.consensusScore)} />
        <Fact
          label="Said dip"
          value={snippet.dipShare === null ? '—' : `${Math.round(snippet.dipShare * 100)} %`}
        />
        {snippet.sourceSnippetId !== null ? (
          <Fact label="Made from" value={`snippet #${snippet.sourceSnippetId}`} />
        ) : null}
      </dl>
      {truth ? (
        <div className="flex flex-col gap-2 rounded-md border-l-4 border-amber bg-amber-wash/60 p-3">
          <p className="text-sm font-semibold text-amber-ink">Planted transit (staff only)</p>
          <dl className="grid grid-cols-2 gap-x-4 gap-y-2 text-sm">
            <Fact label="Centre t0" value={formatDays(truth.t0Days)} />
            <Fact label="Depth" value={`${Math.round(truth.depthPpm)} ppm`} />
            <Fact label="Duration" value={`${truth.durationHours.toFixed(2)} h`} />
            {truth.impact !== undefined ? <Fact label="Impact b" value={truth.impact.toFixed(2)} /> : null}
            {truth.expectedSnr !== undefined ? (
              <Fact label="Expected SNR" value={truth.expectedSnr.toFixed(1)} />
            ) : null}
          </dl>
        </div>
      ) : null}
    </div>
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
