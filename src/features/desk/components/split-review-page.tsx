import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Link, useLocation, useNavigate } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button, ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { LightCurvePlot, type PlotView } from '@/components/light-curve-plot';
import { Loading } from '@/components/loading';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCreateRuling } from '../api/create-ruling';
import { useSplitReview } from '../api/get-split-review';
import { queueWindow, splitsQueryOptions, useSplits } from '../api/get-splits';
import { formatCount, formatDateTime, formatHours, formatScore, formatShare } from '../lib/format';
import { reviewActionForKey } from '../lib/review-keys';
import {
  queueNeighbours,
  type Review,
  type RulingValue,
  rulingLabels,
  type SplitOrder,
  snippetKindLabels,
  snippetStateLabels,
  snippetStateTones,
  splitOrderLabels,
  splitReasonLabels,
} from '../lib/splits';
import { useAnnounce } from './desk-announcer';
import { MarkStrip } from './mark-strip';
import { NeighbourStrip } from './neighbour-strip';
import { RulingForm } from './ruling-form';
import { ScoreHistory } from './score-history';
import { VerdictTable } from './verdict-table';

export interface ReviewQueue {
  campaign: number | null;
  order: SplitOrder;
}

interface SplitReviewPageProps {
  snippetId: number;
  /** The queue the review was opened from: J and K walk it, and a ruling goes on to its next split. */
  queue: ReviewQueue;
}

function inTextField(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || Boolean(target.closest('input, textarea, select'));
}

/** One split snippet at a time: its light curve, every verdict and mark, and the moderator's ruling. */
export function SplitReviewPage({ snippetId, queue }: SplitReviewPageProps) {
  const review = useSplitReview(snippetId);
  const windowParams = { campaign: queue.campaign, order: queue.order, limit: queueWindow, offset: 0 };
  const queueWindowQuery = useSplits(windowParams);
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const location = useLocation();
  const announce = useAnnounce();
  const ruling = useCreateRuling();
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const [note, setNote] = useState('');
  const [pending, setPending] = useState<RulingValue | null>(null);
  const [error, setError] = useState<string | null>(null);

  const queueIds = useMemo(
    () => queueWindowQuery.data?.splits.map((split) => split.snippetId) ?? [],
    [queueWindowQuery.data],
  );
  const around = queueNeighbours(queueIds, snippetId);
  const queueTotal = queueWindowQuery.data?.total ?? null;

  // Arriving from the previous split by key or ruling, the heading takes focus so a screen reader
  // starts on the new snippet; opening a review from the queue leaves focus where the browser puts it.
  const moved = (location.state as { moved?: boolean } | null)?.moved === true;
  const loaded = review.isSuccess;
  useEffect(() => {
    if (moved && loaded) headingRef.current?.focus({ preventScroll: true });
  }, [moved, loaded]);

  function go(id: number) {
    navigate(paths.deskSplit.getHref(id, queue), { state: { moved: true } });
  }

  function step(direction: 'next' | 'previous') {
    const target = direction === 'next' ? around.next : around.previous;
    if (target !== null) {
      go(target);
      return;
    }
    if (!queueWindowQuery.data) return;
    announce(
      queueIds.length === 0
        ? 'The split queue is empty.'
        : direction === 'next'
          ? 'This is the last split in the queue.'
          : 'This is the first split in the queue.',
      'note',
    );
  }

  async function firstLeftInQueue(): Promise<number | null> {
    const fresh = await queryClient.fetchQuery({ ...splitsQueryOptions(windowParams), staleTime: 0 });
    return fresh.splits.find((split) => split.snippetId !== snippetId)?.snippetId ?? null;
  }

  function rule(value: RulingValue) {
    const shown = review.data;
    if (!shown || pending !== null) return;
    // Where to go on is decided from the queue as it was: the ruled snippet leaves it when it refreshes.
    const after = around.afterRuling;
    const designation = shown.snippet.target.designation;
    setPending(value);
    setError(null);
    ruling.mutate(
      { snippetId, ruling: value, note },
      {
        onSuccess: async () => {
          const said = `Ruled ${value} on ${designation} (snippet #${snippetId})`;
          const next = after ?? (await firstLeftInQueue().catch(() => null));
          if (next !== null) {
            announce(`${said}.`);
            go(next);
          } else {
            announce(`${said}. That was the last split in the queue.`);
            navigate(paths.desk.getHref(queue));
          }
        },
        onError: (failure) => {
          setPending(null);
          setError(isApiError(failure) ? failure.message : 'Something went wrong. Try again.');
        },
      },
    );
  }

  // The listener stays put and calls the handler of the latest render, so a key acts on what is shown.
  const onKeyDown = useRef<(event: KeyboardEvent) => void>(() => {});
  onKeyDown.current = (event) => {
    if (event.repeat || event.defaultPrevented) return;
    const action = reviewActionForKey({
      key: event.key,
      altKey: event.altKey,
      ctrlKey: event.ctrlKey,
      metaKey: event.metaKey,
      shiftKey: event.shiftKey,
      inTextField: inTextField(event.target),
    });
    if (!action) return;
    switch (action.type) {
      case 'leave-note':
        if (event.target === noteRef.current) noteRef.current?.blur();
        return;
      case 'focus-note':
        if (!noteRef.current) return;
        // Otherwise the N itself would land in the note.
        event.preventDefault();
        noteRef.current.focus();
        return;
      case 'rule':
        if (!review.data) return;
        event.preventDefault();
        rule(action.ruling);
        return;
      case 'next':
      case 'previous':
        event.preventDefault();
        step(action.type);
        return;
    }
  };
  useEffect(() => {
    const listener = (event: KeyboardEvent) => onKeyDown.current(event);
    document.addEventListener('keydown', listener);
    return () => document.removeEventListener('keydown', listener);
  }, []);

  const backToQueue = (
    <Link
      to={paths.desk.getHref(queue)}
      className="inline-flex min-h-target items-center gap-1.5 self-start rounded-md pr-3 text-sm font-medium text-muted hover:text-ink"
    >
      <span aria-hidden="true">←</span> Split queue
    </Link>
  );

  if (review.isPending) {
    return (
      <div className="flex flex-col gap-4">
        {backToQueue}
        <Loading label={`Loading snippet #${snippetId}…`} />
      </div>
    );
  }
  if (review.isError) {
    const missing = isApiError(review.error) && review.error.status === 404;
    return (
      <div className="flex flex-col gap-6">
        {backToQueue}
        {missing ? (
          <EmptyState
            title={`There is no snippet #${snippetId}`}
            action={<ButtonLink to={paths.desk.getHref(queue)}>Back to the split queue</ButtonLink>}
          >
            <p>
              No snippet has this number. It may have been removed with its light curve, or the address is
              mistyped.
            </p>
          </EmptyState>
        ) : (
          <Alert tone="danger" title={`Could not load snippet #${snippetId}`}>
            <p>{isApiError(review.error) ? review.error.message : 'Something went wrong.'}</p>
            <Button variant="secondary" className="mt-2" onClick={() => review.refetch()}>
              Try again
            </Button>
          </Alert>
        )}
      </div>
    );
  }

  const data = review.data;
  const { snippet } = data;

  return (
    <div className="flex flex-col gap-6" data-review-snippet-id={snippet.id}>
      <header className="flex flex-col gap-3 border-b border-line pb-5">
        <div className="flex flex-wrap items-center justify-between gap-3">
          {backToQueue}
          <QueueSteps
            position={around.position}
            total={queueTotal}
            order={queue.order}
            canPrevious={around.previous !== null}
            canNext={around.next !== null}
            onStep={step}
          />
        </div>
        <div className="flex flex-col gap-2">
          <p className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink">
            Desk · {snippet.campaign.name} · snippet #{snippet.id}
          </p>
          <h1 ref={headingRef} tabIndex={-1} className="tabular text-2xl font-semibold text-ink md:text-3xl">
            {snippet.target.designation}
          </h1>
          <div className="flex flex-wrap items-center gap-2">
            <Badge tone={snippetStateTones[snippet.state]}>
              {snippetStateLabels[snippet.state]}
              {snippet.outcome ? ` · ${snippet.outcome}` : ''}
            </Badge>
            <Badge tone={snippet.kind === 'planted' ? 'amber' : 'slate'}>
              {snippetKindLabels[snippet.kind]}
            </Badge>
            <span className="text-sm text-muted">
              {snippet.splitReason ? splitReasonLabels[snippet.splitReason] : 'Why it split was not recorded'}
            </span>
          </div>
        </div>
      </header>

      {/* On a phone the ruling comes straight after the chart; on a wide screen it stays beside it. */}
      <div className="grid grid-cols-1 gap-6 xl:grid-cols-[minmax(0,1fr)_21rem] xl:items-start">
        <div className="min-w-0 xl:col-start-1 xl:row-start-1">
          <SnippetChart review={data} />
        </div>
        <div className="xl:sticky xl:top-20 xl:col-start-2 xl:row-span-2 xl:row-start-1">
          <RulingForm
            state={snippet.state}
            note={note}
            onNote={setNote}
            noteRef={noteRef}
            onRule={rule}
            pending={pending}
            error={error}
          />
        </div>
        <div className="min-w-0 xl:col-start-1 xl:row-start-2">
          <Facts review={data} />
        </div>
      </div>

      <VerdictTable verdicts={data.verdicts} />
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
        <ScoreHistory history={data.scoreHistory} />
        <NeighbourStrip snippetId={snippet.id} neighbours={data.neighbours} queue={queue} />
      </div>
      <EarlierRulings rulings={data.rulings} />
    </div>
  );
}

interface QueueStepsProps {
  position: number | null;
  total: number | null;
  order: SplitOrder;
  canPrevious: boolean;
  canNext: boolean;
  onStep: (direction: 'next' | 'previous') => void;
}

function QueueSteps({ position, total, order, canPrevious, canNext, onStep }: QueueStepsProps) {
  const where =
    total === null
      ? 'Reading the queue…'
      : total === 0
        ? 'The queue is empty'
        : position === null
          ? `Not in the queue · ${formatCount(total)} waiting`
          : `${formatCount(position)} of ${formatCount(total)} · ${splitOrderLabels[order].toLowerCase()}`;
  return (
    <nav aria-label="Split queue" className="flex items-center gap-2">
      <p className="tabular text-sm text-muted">{where}</p>
      <Button
        variant="secondary"
        className="text-sm"
        aria-keyshortcuts="K ArrowLeft"
        disabled={!canPrevious}
        onClick={() => onStep('previous')}
      >
        <span aria-hidden="true">←</span> Previous
      </Button>
      <Button
        variant="secondary"
        className="text-sm"
        aria-keyshortcuts="J ArrowRight"
        disabled={!canNext}
        onClick={() => onStep('next')}
      >
        Next <span aria-hidden="true">→</span>
      </Button>
    </nav>
  );
}

function SnippetChart({ review }: { review: Review }) {
  const { snippet, series, verdicts } = review;
  const [view, setView] = useState<PlotView | null>(null);
  const marks = useMemo(
    () => verdicts.flatMap((verdict) => (verdict.markHours === null ? [] : [verdict.markHours])),
    [verdicts],
  );
  // The axis spans the whole snippet even where the photometry has a gap at either end, so every mark
  // has its place: a point without flux at each end widens the data without drawing anything.
  const { x, y } = useMemo(() => {
    const hours = [...series.hours];
    const ppm: (number | null)[] = [...series.ppm];
    if (hours.length > 0 && hours[0]! > 0) {
      hours.unshift(0);
      ppm.unshift(null);
    }
    if (hours.length > 0 && hours[hours.length - 1]! < snippet.durationHours) {
      hours.push(snippet.durationHours);
      ppm.push(null);
    }
    return { x: hours, y: ppm };
  }, [series, snippet.durationHours]);

  return (
    <section
      aria-label="Light curve"
      className="flex min-w-0 flex-col gap-2 rounded-lg border border-line bg-surface p-3 md:p-4"
    >
      {series.hours.length > 0 ? (
        <>
          <LightCurvePlot
            x={x}
            y={y}
            zoomable
            height={300}
            xLabel="hours from snippet start"
            yLabel="flux (ppm)"
            xUnit="h"
            yUnit="ppm"
            onView={setView}
            label={`Snippet ${snippet.id} of ${snippet.target.designation} at full resolution: ${formatCount(series.hours.length)} points over ${formatHours(snippet.durationHours)}.`}
          />
          <MarkStrip
            marksHours={marks}
            durationHours={snippet.durationHours}
            verdictCount={verdicts.length}
            view={view}
          />
        </>
      ) : (
        <p className="text-sm text-muted">This snippet has no points to show.</p>
      )}
    </section>
  );
}

function Facts({ review }: { review: Review }) {
  const { snippet } = review;
  const items = [
    { label: 'Consensus score', value: formatScore(snippet.consensusScore) },
    { label: 'Said dip', value: formatShare(snippet.dipShare) },
    { label: 'Verdicts', value: formatCount(snippet.verdictCount) },
    {
      label: 'Effective votes',
      value: snippet.effectiveVotes === null ? '—' : snippet.effectiveVotes.toFixed(1),
    },
    { label: 'Length', value: formatHours(snippet.durationHours) },
    { label: 'Time', value: `${snippet.timeStart.toFixed(3)}–${snippet.timeEnd.toFixed(3)} d` },
  ];
  return (
    <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3">
      {items.map((item) => (
        <div
          key={item.label}
          className="flex min-w-0 flex-col gap-0.5 rounded-lg border border-line bg-surface px-3 py-2.5"
        >
          <dt className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">{item.label}</dt>
          <dd className="tabular break-words text-ink">{item.value}</dd>
        </div>
      ))}
    </dl>
  );
}

function EarlierRulings({ rulings }: { rulings: Review['rulings'] }) {
  return (
    <section aria-labelledby="desk-rulings-heading" className="flex flex-col gap-3">
      <h2 id="desk-rulings-heading" className="text-lg font-semibold text-ink">
        Earlier rulings
      </h2>
      {rulings.length === 0 ? (
        <p className="text-base text-muted">No moderator has ruled on this snippet before.</p>
      ) : (
        <ol className="flex flex-col gap-2">
          {rulings.map((item) => (
            <li
              key={item.id}
              className="flex flex-col gap-1 rounded-lg border border-line bg-surface px-4 py-3"
            >
              <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm">
                <Badge tone={item.ruling === 'dip' ? 'amber' : 'slate'}>{rulingLabels[item.ruling]}</Badge>
                <span className="text-ink">{item.moderator ?? 'A former moderator'}</span>
                <span className="tabular text-muted">{formatDateTime(item.createdAt)}</span>
              </p>
              {item.note ? <p className="text-base whitespace-pre-line text-ink">{item.note}</p> : null}
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}
