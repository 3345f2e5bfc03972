import { type ReactNode, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button, ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { ViewSwitch } from '@/components/view-switch';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { type CandidateDetail, useCandidate } from '../api/get-candidate';
import {
  type CandidateWindows,
  useCandidateWindows,
  WINDOW_COUNTS,
  type WindowCount,
} from '../api/get-candidate-windows';
import {
  candidateStateLabels,
  candidateStateTones,
  creditLine,
  dispositionLabel,
  dispositionTones,
  formatFixed,
  formatSigmaMinutes,
} from '../lib/candidates';
import { plural } from '../lib/format';
import { BackLink } from './follow-up/back-link';
import { CandidateCaution } from './follow-up/candidate-caution';
import { CandidateEditor } from './follow-up/candidate-editor';
import { CandidateFacts } from './follow-up/candidate-facts';
import { WindowsCalendar } from './follow-up/windows-calendar';
import { WindowsList } from './follow-up/windows-list';

type View = 'list' | 'calendar';

/** One candidate: its ephemeris and state, and its next transit windows as a list or a calendar. */
export function CandidatePage({ candidateId }: { candidateId: number }) {
  const candidate = useCandidate(candidateId);

  if (candidate.isPending) return <Loading label="Loading the candidate…" />;
  if (candidate.isError) {
    const error = candidate.error;
    if (isApiError(error) && error.status === 404) {
      return (
        <EmptyState
          title="No such candidate"
          action={<ButtonLink to={paths.lab.getHref()}>All campaigns</ButtonLink>}
        >
          <p>There is no candidate with the number {candidateId}. The link may be old.</p>
        </EmptyState>
      );
    }
    return (
      <LoadFailure title="Could not load the candidate" error={error} onRetry={() => candidate.refetch()} />
    );
  }
  return <CandidateView candidate={candidate.data} />;
}

function CandidateView({ candidate }: { candidate: CandidateDetail }) {
  const [count, setCount] = useState<WindowCount>(10);
  const windows = useCandidateWindows(candidate.id, count);

  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-col gap-4">
        <BackLink to={paths.labFollowUp.getHref(candidate.campaignId)}>The follow-up list</BackLink>
        <PageHeader
          eyebrow={`Candidate · #${candidate.id}`}
          title={candidate.designation}
          description={
            <p>
              The next predicted transits from now, with their windows padded by the timing uncertainty, and
              for each observatory whether the whole window can be watched.
            </p>
          }
          actions={
            <ButtonLink variant="secondary" to={paths.labTarget.getHref(candidate.targetId)}>
              The target’s review
            </ButtonLink>
          }
        />
      </div>

      <CandidateCaution cautions={windows.data?.cautions ?? [candidate.caution]} />

      <CandidateDetails candidate={candidate} />

      <TransitWindowsSection candidateId={candidate.id} windows={windows} count={count} onCount={setCount} />
    </div>
  );
}

function TransitWindowsSection({
  candidateId,
  windows: query,
  count,
  onCount,
}: {
  candidateId: number;
  windows: ReturnType<typeof useCandidateWindows>;
  count: WindowCount;
  onCount: (count: WindowCount) => void;
}) {
  if (query.isPending) return <Loading label="Loading the transit windows…" />;
  if (query.isError) {
    const error = query.error;
    if (isApiError(error) && error.code === 'no_ephemeris') {
      return (
        <NoWindows title="No period yet, so no transit windows">
          <p>
            This candidate has a single transit and no period, so the next transits cannot be predicted. Run a
            period search on the target’s review page once more dips are settled, then promote it again.
          </p>
          <p className="mt-2 text-sm">The server said: {error.message}</p>
        </NoWindows>
      );
    }
    if (isApiError(error) && error.code === 'no_position') {
      return (
        <NoWindows title="No sky position, so no observability">
          <p>
            The target has no right ascension and declination in the catalogue, so its transits cannot be
            placed in the sky. Add them to the catalogue and upload it again.
          </p>
        </NoWindows>
      );
    }
    return (
      <Alert tone="danger" title={`Could not load the transit windows of candidate #${candidateId}`}>
        <p>{isApiError(error) ? error.message : 'Something went wrong.'}</p>
        <Button variant="secondary" className="mt-2" onClick={() => query.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  return (
    <WindowsSection
      answer={query.data}
      count={count}
      onCount={onCount}
      refreshing={query.isPlaceholderData}
    />
  );
}

function NoWindows({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section aria-labelledby="windows-heading" className="flex flex-col gap-4">
      <h2 id="windows-heading" className="text-xl font-semibold text-ink">
        Transit windows
      </h2>
      <Alert tone="note" title={title}>
        {children}
      </Alert>
    </section>
  );
}

function WindowsSection({
  answer,
  count,
  onCount,
  refreshing,
}: {
  answer: CandidateWindows;
  count: WindowCount;
  onCount: (count: WindowCount) => void;
  refreshing: boolean;
}) {
  const { candidate, windows, leftOutNearSun } = answer;
  const [view, setView] = useState<View>('list');
  const countId = useId();
  const noObservatories = windows.length > 0 && windows.every((window) => window.observatories.length === 0);

  return (
    <section aria-labelledby="windows-heading" className="flex flex-col gap-4">
      <div className="flex flex-col gap-3 md:flex-row md:items-end md:justify-between">
        <div className="flex flex-col gap-1">
          <h2 id="windows-heading" className="text-xl font-semibold text-ink">
            Next {plural(windows.length, 'transit window')}
          </h2>
          <p className="max-w-2xl text-base text-muted">
            Period {formatFixed(candidate.periodDays, 6, 'd')}. The mid-transit uncertainty grows with each
            epoch as the period’s error adds up
            {windows.length > 1
              ? `: ${formatSigmaMinutes(windows[0]!.sigmaDays)} for the first window, ${formatSigmaMinutes(windows[windows.length - 1]!.sigmaDays)} for the last`
              : ''}
            .
          </p>
        </div>
        <div className="flex flex-wrap items-end gap-3">
          <div className="flex flex-col gap-1.5">
            <label htmlFor={countId} className="text-sm font-medium text-ink">
              Windows to show
            </label>
            <Select
              id={countId}
              value={count}
              onChange={(event) => onCount(Number(event.target.value) as WindowCount)}
            >
              {WINDOW_COUNTS.map((value) => (
                <option key={value} value={value}>
                  {value}
                </option>
              ))}
            </Select>
          </div>
          <ViewToggle view={view} onView={setView} />
        </div>
      </div>

      <div aria-live="polite" className="flex flex-col gap-3 empty:hidden">
        {refreshing ? <Loading label="Loading more windows…" /> : null}
        {leftOutNearSun > 0 ? (
          <Alert tone="note" title={`${plural(leftOutNearSun, 'window')} left out near the Sun`}>
            The target is within 30° of the Sun at {leftOutNearSun === 1 ? 'that transit' : 'those transits'},
            so {leftOutNearSun === 1 ? 'it is' : 'they are'} never proposed.
          </Alert>
        ) : null}
      </div>

      {noObservatories ? (
        <Alert tone="note" title="No observatories yet">
          Windows are checked against each observatory’s horizon, Sun limit and lowest target altitude.{' '}
          <Link
            to={paths.labObservatories.getHref()}
            className="font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
          >
            Add an observatory
          </Link>{' '}
          to see which windows can be watched.
        </Alert>
      ) : null}

      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The transit windows could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        {windows.length === 0 ? (
          <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
            No window to propose: every transit in this range has the target too near the Sun. Ask for more
            windows to look further ahead.
          </p>
        ) : view === 'list' ? (
          <WindowsList windows={windows} />
        ) : (
          <WindowsCalendar windows={windows} />
        )}
      </ErrorBoundary>
    </section>
  );
}

const viewLabels: Record<View, string> = { list: 'List', calendar: 'Calendar' };

function ViewToggle({ view, onView }: { view: View; onView: (view: View) => void }) {
  return <ViewSwitch legend="View" labels={viewLabels} value={view} onChange={onView} />;
}

function CandidateDetails({ candidate }: { candidate: CandidateDetail }) {
  return (
    <section
      aria-labelledby="candidate-details-heading"
      className="grid grid-cols-1 gap-5 rounded-lg border border-line bg-surface p-4 md:p-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]"
    >
      <div className="flex min-w-0 flex-col gap-3">
        <h2
          id="candidate-details-heading"
          className="flex flex-wrap items-center gap-2 text-lg font-semibold text-ink"
        >
          Ephemeris and state
          <Badge tone={candidateStateTones[candidate.state]}>{candidateStateLabels[candidate.state]}</Badge>
          <Badge tone={dispositionTones[candidate.disposition]}>
            {dispositionLabel(candidate.disposition)}
          </Badge>
        </h2>
        <CandidateFacts candidate={candidate} />
        <p className="text-sm text-ink">{creditLine(candidate.credits)}</p>
      </div>
      <div className="border-t border-line pt-4 lg:border-t-0 lg:border-l lg:pt-0 lg:pl-5">
        <CandidateEditor candidate={candidate} />
      </div>
    </section>
  );
}
