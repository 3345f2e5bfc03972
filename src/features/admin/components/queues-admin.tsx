import { type RefObject, useId, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { isApiError } from '@/lib/api-client';
import { useJobs } from '../api/get-jobs';
import { useQueues } from '../api/get-queues';
import { useRetryJob } from '../api/retry-job';
import { attemptsText, distinctTraces, errorHeadline, type Job, jobTime, timeAgo } from '../lib/jobs';
import {
  backendDescriptions,
  countTone,
  type Queue,
  type QueueState,
  type QueuesOverview,
  queueLabel,
  queueStateLabels,
  queueStates,
  queuesRefreshMs,
  totalCounts,
} from '../lib/queues';

const failedJobsLimit = 20;

type Outcome = { tone: 'success' | 'danger'; text: string };

const countFormat = new Intl.NumberFormat('en-GB');
const clockFormat = new Intl.DateTimeFormat('en-GB', {
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});
const whenFormat = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});

function formatWhen(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : whenFormat.format(date);
}

export function QueuesAdmin() {
  const queues = useQueues();
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [queue, setQueue] = useState('');
  const failedHeadingRef = useRef<HTMLHeadingElement>(null);

  return (
    <div className="flex flex-col gap-10">
      <PageHeader
        eyebrow="Admin"
        title="Queues and jobs"
        description="The work Dipdeck does in the background: reading uploaded light curves, computing consensus scores, period searches, mail and housekeeping."
        actions={
          queues.data ? (
            <p className="flex items-center gap-2 text-sm text-muted">
              <span aria-hidden="true" className="size-2 rounded-full bg-success" />
              <span>
                Updated{' '}
                <span className="tabular text-ink">{clockFormat.format(new Date(queues.dataUpdatedAt))}</span>
                , every {queuesRefreshMs / 1000} s
              </span>
            </p>
          ) : null
        }
      />

      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The queue counts could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <QueuesOverviewSection />
      </ErrorBoundary>

      <section aria-labelledby="failed-jobs-heading" className="flex flex-col gap-5">
        <FailedJobsHeader
          headingRef={failedHeadingRef}
          queues={queues.data?.queues ?? []}
          queue={queue}
          onQueue={(name) => {
            setQueue(name);
            setOutcome(null);
          }}
        />
        <div aria-live="polite" className="empty:hidden">
          {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
        </div>
        <ErrorBoundary
          fallback={(_error, reset) => (
            <Alert tone="danger" title="The failed jobs could not be shown">
              <Button variant="secondary" className="mt-2" onClick={reset}>
                Try again
              </Button>
            </Alert>
          )}
        >
          <FailedJobsTable
            queue={queue}
            queues={queues.data?.queues ?? []}
            onOutcome={setOutcome}
            onGone={() => failedHeadingRef.current?.focus()}
          />
        </ErrorBoundary>
      </section>
    </div>
  );
}

function QueuesOverviewSection() {
  const queues = useQueues();

  if (queues.isPending) return <Loading label="Loading queues…" />;
  if (queues.isError && !queues.data) {
    return (
      <LoadFailure title="Could not load the queues" error={queues.error} onRetry={() => queues.refetch()} />
    );
  }

  return (
    <div className="flex flex-col gap-8">
      {queues.isError ? (
        <Alert tone="note" title="Could not refresh the counts">
          {isApiError(queues.error) ? `${queues.error.message} ` : ''}Showing the counts from{' '}
          {clockFormat.format(new Date(queues.dataUpdatedAt))}; Dipdeck keeps trying.
        </Alert>
      ) : null}
      <div className="grid gap-4 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] lg:gap-6">
        <BackendCard backend={queues.data.backend} />
        <Totals queues={queues.data.queues} />
      </div>
      <section aria-labelledby="queue-counts-heading" className="flex flex-col gap-4">
        <h2 id="queue-counts-heading" className="text-xl font-semibold text-ink">
          Jobs in each queue
        </h2>
        <CountsTable queues={queues.data.queues} />
      </section>
    </div>
  );
}

function BackendCard({ backend }: { backend: QueuesOverview['backend'] }) {
  const description = backendDescriptions[backend];
  return (
    <section
      aria-labelledby="queue-backend-heading"
      className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-5"
    >
      <div className="flex items-center justify-between gap-3">
        <p className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink">
          Queue backend
        </p>
        <Badge tone="slate">{description.badge}</Badge>
      </div>
      <h2 id="queue-backend-heading" className="text-lg font-semibold text-ink">
        {description.title}
      </h2>
      <p className="text-base text-muted">{description.body}</p>
    </section>
  );
}

// The four states that say whether the queues keep up; completed and paused are in the table below.
const totalStates = {
  waiting: 'Ready to start',
  active: 'Running now',
  delayed: 'Set to start later',
  failed: 'Out of attempts, listed below',
} as const satisfies Partial<Record<QueueState, string>>;

function Totals({ queues }: { queues: readonly Queue[] }) {
  const totals = totalCounts(queues);
  return (
    <section aria-labelledby="queue-totals-heading" className="flex flex-col gap-3">
      <h2
        id="queue-totals-heading"
        className="tabular text-xs font-medium uppercase tracking-[0.14em] text-amber-ink"
      >
        Across all {queues.length} queues
      </h2>
      <dl className="grid flex-1 grid-cols-2 gap-3 sm:grid-cols-4">
        {(Object.keys(totalStates) as (keyof typeof totalStates)[]).map((state) => {
          const tone = countTone(state, totals[state]);
          const attention = tone === 'attention';
          return (
            <div
              key={state}
              className={`flex flex-col justify-between gap-2 rounded-lg border p-4 ${
                attention ? 'border-danger bg-danger-wash' : 'border-line bg-surface'
              }`}
            >
              <dt className="flex flex-col gap-0.5">
                <span className={`text-sm font-medium ${attention ? 'text-danger' : 'text-ink'}`}>
                  {queueStateLabels[state]}
                </span>
                <span className={`text-xs ${attention ? 'text-danger' : 'text-muted'}`}>
                  {totalStates[state]}
                </span>
              </dt>
              <dd
                className={`tabular text-3xl ${
                  attention ? 'font-medium text-danger' : tone === 'zero' ? 'text-muted' : 'text-ink'
                }`}
              >
                {countFormat.format(totals[state])}
              </dd>
            </div>
          );
        })}
      </dl>
    </section>
  );
}

function CountsTable({ queues }: { queues: readonly Queue[] }) {
  if (queues.length === 0) {
    return (
      <EmptyState title="No queues reported">
        <p>The server answered, but named no queues. Check that the server started its queues.</p>
      </EmptyState>
    );
  }
  return (
    <Table caption="Jobs in each queue, by state">
      <TableHead>
        <Th>Queue</Th>
        {queueStates.map((state) => (
          <Th key={state} className="text-right">
            {queueStateLabels[state]}
          </Th>
        ))}
      </TableHead>
      <TableBody>
        {queues.map((queue) => (
          <Tr key={queue.name} card="pairs">
            <Td
              label="Queue"
              className="col-span-2 border-b border-line pb-3 before:hidden md:border-b-0 md:pb-3"
            >
              <span className="flex min-w-0 flex-col">
                <span className="font-medium text-ink">{queue.label}</span>
                <span className="tabular text-sm text-muted">{queue.name}</span>
              </span>
            </Td>
            {queueStates.map((state) => (
              <Td key={state} label={queueStateLabels[state]} className="md:text-right">
                <Count state={state} count={queue.counts[state]} />
              </Td>
            ))}
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}

const countTones = {
  zero: 'text-muted',
  plain: 'text-ink',
  attention: 'rounded-sm bg-danger-wash px-1.5 font-semibold text-danger',
} as const;

function Count({ state, count }: { state: QueueState; count: number }) {
  return (
    <span className={`tabular inline-block text-base ${countTones[countTone(state, count)]}`}>
      {countFormat.format(count)}
    </span>
  );
}

interface FailedJobsHeaderProps {
  headingRef: RefObject<HTMLHeadingElement | null>;
  queues: readonly Queue[];
  queue: string;
  onQueue: (name: string) => void;
}

function FailedJobsHeader({ headingRef, queues, queue, onQueue }: FailedJobsHeaderProps) {
  const filterId = useId();
  return (
    <div className="flex flex-col gap-4 md:flex-row md:items-end md:justify-between">
      <div className="flex max-w-2xl flex-col gap-1.5">
        <h2
          id="failed-jobs-heading"
          ref={headingRef}
          tabIndex={-1}
          className="text-xl font-semibold text-ink"
        >
          Latest failed jobs
        </h2>
        <p className="text-base text-muted">
          Jobs that used up their attempts, newest first (up to {failedJobsLimit}). Fix the cause, then retry:
          the job goes back into its queue and runs again.
        </p>
      </div>
      <div className="flex flex-col gap-1.5 md:w-56">
        <label htmlFor={filterId} className="text-sm font-medium">
          Queue
        </label>
        <Select id={filterId} value={queue} onChange={(event) => onQueue(event.target.value)}>
          <option value="">All queues</option>
          {queues.map((option) => (
            <option key={option.name} value={option.name}>
              {option.label}
            </option>
          ))}
        </Select>
      </div>
    </div>
  );
}

interface FailedJobsTableProps {
  queue: string;
  queues: readonly Queue[];
  onOutcome: (outcome: Outcome) => void;
  onGone: () => void;
}

function FailedJobsTable({ queue, queues, onOutcome, onGone }: FailedJobsTableProps) {
  const jobs = useJobs({ state: 'failed', queue, limit: failedJobsLimit });

  if (jobs.isPending) return <Loading label="Loading failed jobs…" />;
  if (jobs.isError && !jobs.data) {
    return (
      <LoadFailure title="Could not load the failed jobs" error={jobs.error} onRetry={() => jobs.refetch()} />
    );
  }

  if (jobs.data.length === 0) {
    const where = queue ? ` in ${queueLabel(queues, queue)}` : '';
    return (
      <EmptyState title={`No failed jobs${where}`}>
        <p>
          Every job{where} finished or is still on its way. A job that fails after its last attempt shows up
          here with its error, ready to retry.
        </p>
      </EmptyState>
    );
  }

  // Compared once per refresh, so "2 min ago" moves on with the list.
  const nowMs = jobs.dataUpdatedAt;

  return (
    <div aria-busy={jobs.isFetching || undefined}>
      <Table caption="Latest failed jobs, newest first">
        <TableHead>
          <Th>Job</Th>
          <Th>Queue</Th>
          <Th>Attempts</Th>
          <Th>Failed</Th>
          <Th>Error</Th>
          <Th className="text-right">
            <span className="sr-only">Action</span>
          </Th>
        </TableHead>
        <TableBody>
          {jobs.data.map((job) => (
            <JobRow
              key={job.id}
              job={job}
              queueName={queueLabel(queues, job.queue)}
              nowMs={nowMs}
              onOutcome={onOutcome}
              onGone={onGone}
            />
          ))}
        </TableBody>
      </Table>
    </div>
  );
}

interface JobRowProps {
  job: Job;
  queueName: string;
  nowMs: number;
  onOutcome: (outcome: Outcome) => void;
  onGone: () => void;
}

function JobRow({ job, queueName, nowMs, onOutcome, onGone }: JobRowProps) {
  const retry = useRetryJob();
  const when = jobTime(job);
  const title = `${job.name} (${job.id})`;

  function retryJob() {
    // mutateAsync, not mutate: the row leaves the list once the refresh lands, and the outcome must
    // still be told after it has gone.
    retry.mutateAsync(job.id).then(
      () => {
        onOutcome({
          tone: 'success',
          text: `${title} is back in the ${queueName} queue and will run again.`,
        });
        onGone();
      },
      (error: unknown) => {
        onOutcome({
          tone: 'danger',
          text: `Could not retry ${title}: ${isApiError(error) ? error.message : 'something went wrong.'}`,
        });
        // Refused because it is no longer failed or no longer exists: the refresh takes the row away.
        if (isApiError(error) && (error.status === 404 || error.status === 409)) onGone();
      },
    );
  }

  return (
    <Tr align="top">
      <Td label="Job">
        <span className="flex min-w-0 flex-col text-right md:text-left">
          <span className="font-medium break-all text-ink md:break-normal md:whitespace-nowrap">
            {job.name}
          </span>
          <span className="tabular text-sm break-all text-muted md:break-normal md:whitespace-nowrap">
            {job.id}
          </span>
        </span>
      </Td>
      <Td label="Queue">
        <span className="text-ink md:whitespace-nowrap">{queueName}</span>
      </Td>
      <Td label="Attempts">
        <span className="tabular text-slate">{attemptsText(job)}</span>
      </Td>
      <Td label="Failed">
        {when ? (
          <time dateTime={when} title={formatWhen(when)} className="flex flex-col text-right md:text-left">
            <span className="text-ink md:whitespace-nowrap">{timeAgo(when, nowMs) ?? formatWhen(when)}</span>
            <span className="tabular text-xs text-muted md:whitespace-nowrap">{formatWhen(when)}</span>
          </time>
        ) : (
          <span className="text-muted">Not recorded</span>
        )}
      </Td>
      <Td label="Error" card="block" className="md:w-full md:min-w-72">
        <JobError job={job} />
      </Td>
      <Td label="Action" className="pt-1 before:hidden md:pt-3 md:text-right">
        <Button
          variant="secondary"
          aria-label={`Retry ${title}`}
          busy={retry.isPending}
          onClick={retryJob}
          className="w-full md:w-28"
        >
          Retry
        </Button>
      </Td>
    </Tr>
  );
}

function JobError({ job }: { job: Job }) {
  const traces = distinctTraces(job.stacktrace);
  const repeated = job.stacktrace.length > 1 && traces.length === 1;
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <p className="text-sm font-medium break-words text-danger">{errorHeadline(job.error)}</p>
      {job.progress.stage ? (
        <p className="text-xs text-muted">
          Stopped at “{job.progress.stage}”,{' '}
          <span className="tabular">{Math.round(job.progress.percent)} %</span> done
        </p>
      ) : null}
      {traces.length > 0 ? (
        <details className="group">
          <summary className="-ml-1 inline-flex min-h-target cursor-pointer list-none items-center gap-1.5 rounded-md px-1 text-sm font-medium text-ink hover:text-amber-ink [&::-webkit-details-marker]:hidden">
            <svg
              aria-hidden="true"
              viewBox="0 0 12 12"
              className="size-3 transition-transform group-open:rotate-90"
              fill="currentColor"
            >
              <path d="M4 2l5 4-5 4z" />
            </svg>
            Stack trace
            {repeated ? (
              <span className="font-normal text-muted">
                (the same in all {job.stacktrace.length} attempts)
              </span>
            ) : traces.length > 1 ? (
              <span className="font-normal text-muted">({traces.length} attempts, latest first)</span>
            ) : null}
          </summary>
          <div className="mt-1 flex flex-col gap-2">
            {traces.map((trace) => (
              <pre
                key={trace}
                className="tabular max-h-64 overflow-auto rounded-md border border-line bg-paper p-3 text-xs break-all whitespace-pre-wrap text-slate"
              >
                {trace}
              </pre>
            ))}
          </div>
        </details>
      ) : (
        <p className="text-xs text-muted">No stack trace was kept.</p>
      )}
    </div>
  );
}
