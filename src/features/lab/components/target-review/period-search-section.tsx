import { useQueryClient } from '@tanstack/react-query';
import { type FormEvent, useEffect, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { TextField } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { queryKeys } from '@/lib/query-keys';
import { type PeriodSearch, usePeriodSearch } from '../../api/get-period-search';
import { useStartPeriodSearch } from '../../api/start-period-search';
import { formatDateTime } from '../../lib/format';
import { isSearchUnderway, progressPercent, type SeriesPart } from '../../lib/period-search';
import { PeriodSearchResultView } from './period-search-result';

interface PeriodSearchSectionProps {
  targetId: number;
  designation: string;
  parts: readonly SeriesPart[];
}

const statusLabels = { queued: 'Queued', running: 'Running', done: 'Done', failed: 'Failed' } as const;
const statusTones = { queued: 'slate', running: 'amber', done: 'success', failed: 'danger' } as const;

export function PeriodSearchSection({ targetId, designation, parts }: PeriodSearchSectionProps) {
  const search = usePeriodSearch(targetId);
  const queryClient = useQueryClient();
  const status = search.data?.status ?? null;
  const previous = useRef(status);

  // Vetting uses the latest search once it is done; a search ending while watched changes its answer.
  useEffect(() => {
    if (isSearchUnderway(previous.current) && !isSearchUnderway(status)) {
      void queryClient.invalidateQueries({ queryKey: queryKeys.targets.vetting(targetId) });
    }
    previous.current = status;
  }, [status, queryClient, targetId]);

  return (
    <section aria-labelledby="period-search-heading" className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id="period-search-heading" className="text-xl font-semibold text-ink">
          Period search
        </h2>
        <p className="max-w-2xl text-base text-muted">
          Box least squares (BLS) over the target’s light curves, run by a background worker: the period whose
          folded transit fits best, with the fold at half and at twice that period to catch an eclipsing
          binary or a missed harmonic.
        </p>
      </div>
      {search.isPending ? (
        <Loading label="Reading the period search…" />
      ) : search.isError ? (
        <LoadFailure
          title="Could not read the period search"
          error={search.error}
          onRetry={() => search.refetch()}
        />
      ) : (
        <>
          <SearchState periodSearch={search.data} />
          <RunSearchForm targetId={targetId} periodSearch={search.data} />
          {search.data?.status === 'done' && search.data.result ? (
            <PeriodSearchResultView result={search.data.result} parts={parts} designation={designation} />
          ) : null}
        </>
      )}
    </section>
  );
}

function SearchState({ periodSearch }: { periodSearch: PeriodSearch | null }) {
  if (!periodSearch) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        No period search has been run for this target yet.
      </p>
    );
  }
  const { status } = periodSearch;
  return (
    <div className="flex flex-col gap-3" aria-live="polite">
      <p className="flex flex-wrap items-center gap-2 text-sm text-muted">
        <Badge tone={statusTones[status]}>{statusLabels[status]}</Badge>
        <span>
          Search #{periodSearch.id}, started {formatDateTime(periodSearch.createdAt)}
          {periodSearch.settings?.minPeriodDays !== undefined
            ? `; periods from ${periodSearch.settings.minPeriodDays} d to ${
                periodSearch.settings.maxPeriodDays
                  ? `${periodSearch.settings.maxPeriodDays} d`
                  : 'half the span'
              }`
            : ''}
        </span>
      </p>
      {isSearchUnderway(status) ? <SearchProgress periodSearch={periodSearch} /> : null}
      {status === 'failed' ? (
        <Alert tone="danger" title="The period search failed">
          <p>{periodSearch.error ?? 'The worker gave no reason.'}</p>
        </Alert>
      ) : null}
    </div>
  );
}

function SearchProgress({ periodSearch }: { periodSearch: PeriodSearch }) {
  const percent = progressPercent(periodSearch.progress);
  const stage =
    periodSearch.progress?.stage ?? (periodSearch.status === 'queued' ? 'waiting for a worker' : 'starting');
  return (
    <div className="flex max-w-xl flex-col gap-1.5">
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span className="text-ink first-letter:uppercase">{stage}</span>
        <span className="tabular text-muted">{percent} %</span>
      </div>
      <div
        role="progressbar"
        aria-label="Period search progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={`${percent} %: ${stage}`}
        className="h-3 w-full overflow-hidden rounded-full border border-edge bg-paper"
      >
        <div className="h-full bg-amber transition-[width] duration-300" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}

function parsePeriod(text: string): number | null | 'invalid' {
  const trimmed = text.trim();
  if (trimmed === '') return null;
  const value = Number(trimmed);
  return Number.isFinite(value) && value > 0 ? value : 'invalid';
}

function RunSearchForm({ targetId, periodSearch }: { targetId: number; periodSearch: PeriodSearch | null }) {
  const start = useStartPeriodSearch(targetId);
  const [minText, setMinText] = useState('');
  const [maxText, setMaxText] = useState('');
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const underway = isSearchUnderway(periodSearch?.status);
  const serverFields = isApiError(start.error) ? start.error.fields : {};
  const fieldError = (field: string) => localErrors[field] ?? serverFields[field];
  const generalError =
    start.error && Object.keys(serverFields).length === 0
      ? isApiError(start.error)
        ? start.error.message
        : 'Something went wrong.'
      : null;

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const min = parsePeriod(minText);
    const max = parsePeriod(maxText);
    const errors: Record<string, string> = {};
    if (min === 'invalid') errors.minPeriodDays = 'A number of days above 0';
    if (max === 'invalid') errors.maxPeriodDays = 'A number of days above 0';
    if (typeof min === 'number' && typeof max === 'number' && max <= min) {
      errors.maxPeriodDays = 'Must be longer than the shortest period';
    }
    setLocalErrors(errors);
    if (Object.keys(errors).length > 0) return;
    start.mutate({
      ...(typeof min === 'number' ? { minPeriodDays: min } : {}),
      ...(typeof max === 'number' ? { maxPeriodDays: max } : {}),
    });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3">
      <details className="max-w-xl rounded-md border border-line bg-surface">
        <summary className="flex min-h-target cursor-pointer items-center px-3 text-sm font-medium text-ink">
          Period range (optional)
        </summary>
        <div className="grid gap-3 border-t border-line p-3 sm:grid-cols-2">
          <TextField
            label="Shortest period (days)"
            inputMode="decimal"
            placeholder="0.5"
            value={minText}
            onChange={(event) => setMinText(event.target.value)}
            error={fieldError('minPeriodDays')}
          />
          <TextField
            label="Longest period (days)"
            inputMode="decimal"
            placeholder="half the span"
            value={maxText}
            onChange={(event) => setMaxText(event.target.value)}
            error={fieldError('maxPeriodDays')}
          />
        </div>
      </details>
      {generalError ? (
        <Alert tone="danger" title="The period search could not start">
          <p>{generalError}</p>
        </Alert>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={start.isPending} disabled={underway}>
          {periodSearch ? 'Run the period search again' : 'Run period search'}
        </Button>
        {underway ? (
          <span className="text-sm text-muted">A search is underway; wait for it to end.</span>
        ) : null}
      </div>
    </form>
  );
}
