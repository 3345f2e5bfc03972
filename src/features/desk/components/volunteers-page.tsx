import { useEffect, useId, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Select } from '@/components/select';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { inputClasses } from '@/components/text-field';
import type { DeskVolunteerListParams } from '@/lib/query-keys';
import { useDeskVolunteers } from '../api/get-desk-volunteers';
import { useSplitCampaigns } from '../api/get-splits';
import { formatCount, formatDateTime, formatMs, formatShare } from '../lib/format';
import {
  type DeskVolunteer,
  firstOrder,
  flagLabel,
  sortDirectionWords,
  type VolunteerSort,
  volunteerSortLabels,
  volunteerSorts,
} from '../lib/volunteers';
import { type VolunteerAction, VolunteerActionPanel } from './volunteer-actions';

const pageSize = 25;
const searchDelayMs = 300;

type Filters = Omit<DeskVolunteerListParams, 'limit' | 'offset'> & { page: number };

function readFilters(search: URLSearchParams): Filters {
  const sort = search.get('sort') ?? '';
  const page = Number(search.get('page'));
  const campaign = search.get('campaign') ?? '';
  const known = (volunteerSorts as readonly string[]).includes(sort) ? (sort as VolunteerSort) : 'name';
  const order = search.get('order');
  return {
    campaign: /^\d+$/.test(campaign) && Number(campaign) > 0 ? Number(campaign) : null,
    search: search.get('search') ?? '',
    flagged: search.get('flagged') === 'true',
    sort: known,
    order: order === 'asc' || order === 'desc' ? order : firstOrder(known),
    page: Number.isInteger(page) && page > 0 ? page : 1,
  };
}

function writeFilters(filters: Filters): URLSearchParams {
  const out = new URLSearchParams();
  if (filters.search) out.set('search', filters.search);
  if (filters.flagged) out.set('flagged', 'true');
  if (filters.campaign !== null) out.set('campaign', String(filters.campaign));
  if (filters.sort !== 'name') out.set('sort', filters.sort);
  if (filters.order !== firstOrder(filters.sort)) out.set('order', filters.order);
  if (filters.page > 1) out.set('page', String(filters.page));
  return out;
}

export type Outcome = { tone: 'success' | 'danger'; text: string };

/**
 * The volunteer audit: each volunteer's verdicts, accuracy on controls, agreement with consensus and
 * speed, the automatic flags, and what a moderator can do about them.
 */
export function VolunteersPage() {
  const [search, setSearch] = useSearchParams();
  const filters = readFilters(search);
  const [outcome, setOutcome] = useState<Outcome | null>(null);

  function change(next: Partial<Filters>) {
    setSearch((current) => writeFilters({ ...readFilters(current), page: 1, ...next }), { replace: true });
  }

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Desk"
        title="Volunteers"
        description="How each volunteer judges: accuracy on controls, agreement with the consensus, speed and answer habits. Dipdeck flags the patterns of careless or automated judging; you decide what they mean."
      />
      <VolunteerFilters filters={filters} onChange={change} />
      <div aria-live="polite" className="empty:hidden">
        {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
      </div>
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The volunteer table could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <VolunteerTable filters={filters} onChange={change} onOutcome={setOutcome} />
      </ErrorBoundary>
    </div>
  );
}

function VolunteerFilters({
  filters,
  onChange,
}: {
  filters: Filters;
  onChange: (next: Partial<Filters>) => void;
}) {
  const searchId = useId();
  const campaignId = useId();
  const sortId = useId();
  const [text, setText] = useState(filters.search);
  const campaigns = useSplitCampaigns();
  const known = campaigns.data ?? [];

  // Typing should not fire one request per key; only a settled search goes into the address.
  // biome-ignore lint/correctness/useExhaustiveDependencies: onChange is a new function every render.
  useEffect(() => {
    if (text.trim() === filters.search) return;
    const timer = window.setTimeout(() => onChange({ search: text.trim() }), searchDelayMs);
    return () => window.clearTimeout(timer);
  }, [text, filters.search]);

  return (
    <div className="grid gap-4 rounded-lg border border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr]">
      <div className="flex flex-col gap-1.5 sm:col-span-2 lg:col-span-1">
        <label htmlFor={searchId} className="text-sm font-medium text-ink">
          Search volunteers
        </label>
        <input
          id={searchId}
          type="search"
          value={text}
          onChange={(event) => setText(event.target.value)}
          placeholder="Name or e-mail"
          className={inputClasses}
        />
      </div>
      {known.length > 0 || filters.campaign !== null ? (
        <div className="flex flex-col gap-1.5">
          <label htmlFor={campaignId} className="text-sm font-medium text-ink">
            Campaign
          </label>
          <Select
            id={campaignId}
            value={filters.campaign === null ? '' : String(filters.campaign)}
            onChange={(event) =>
              onChange({ campaign: event.target.value ? Number(event.target.value) : null })
            }
          >
            <option value="">Every campaign</option>
            {known.map((campaign) => (
              <option key={campaign.id} value={campaign.id}>
                {campaign.name}
              </option>
            ))}
            {filters.campaign !== null && !known.some((campaign) => campaign.id === filters.campaign) ? (
              <option value={filters.campaign}>Campaign #{filters.campaign}</option>
            ) : null}
          </Select>
        </div>
      ) : null}
      <div className="flex flex-col justify-end">
        <CheckboxField
          label="Flagged only"
          checked={filters.flagged}
          onChange={(event) => onChange({ flagged: event.target.checked })}
        />
      </div>
      {/* Column headers sort on a wide screen; a phone shows cards, so it sorts here. */}
      <div className="flex flex-col gap-1.5 md:hidden">
        <label htmlFor={sortId} className="text-sm font-medium text-ink">
          Sort by
        </label>
        <Select
          id={sortId}
          value={`${filters.sort}:${filters.order}`}
          onChange={(event) => {
            const [sort, order] = event.target.value.split(':') as [VolunteerSort, 'asc' | 'desc'];
            onChange({ sort, order });
          }}
        >
          {volunteerSorts.flatMap((sort) =>
            (['asc', 'desc'] as const).map((order) => (
              <option key={`${sort}:${order}`} value={`${sort}:${order}`}>
                {volunteerSortLabels[sort]}, {sortDirectionWords(sort, order)}
              </option>
            )),
          )}
        </Select>
      </div>
    </div>
  );
}

interface VolunteerTableProps {
  filters: Filters;
  onChange: (next: Partial<Filters>) => void;
  onOutcome: (outcome: Outcome) => void;
}

const columnCount = 8;

function VolunteerTable({ filters, onChange, onOutcome }: VolunteerTableProps) {
  const { page, ...rest } = filters;
  const volunteers = useDeskVolunteers({ ...rest, limit: pageSize, offset: (page - 1) * pageSize });
  const [open, setOpen] = useState<{ volunteerId: number; action: VolunteerAction } | null>(null);

  if (volunteers.isPending) return <Loading label="Loading volunteers…" />;
  if (volunteers.isError) {
    return (
      <LoadFailure
        title="Could not load the volunteers"
        error={volunteers.error}
        onRetry={() => volunteers.refetch()}
      />
    );
  }

  const { total } = volunteers.data;
  if (volunteers.data.volunteers.length === 0) {
    const filtered = Boolean(filters.search || filters.flagged || filters.campaign !== null);
    return (
      <EmptyState title={filtered ? 'No volunteer matches' : 'No volunteers yet'}>
        <p>
          {filtered
            ? filters.flagged
              ? 'No volunteer matching these filters has a flag that is not cleared.'
              : 'Nobody matches. Try part of a name or an e-mail address.'
            : 'Volunteers appear here once they have given verdicts.'}
        </p>
      </EmptyState>
    );
  }

  function sortHeader(sort: VolunteerSort, align: 'left' | 'right' = 'left') {
    const active = filters.sort === sort;
    const nextOrder = active ? (filters.order === 'asc' ? 'desc' : 'asc') : firstOrder(sort);
    return (
      <Th
        aria-sort={active ? (filters.order === 'asc' ? 'ascending' : 'descending') : 'none'}
        className={`py-0 ${align === 'right' ? 'text-right' : ''}`}
      >
        <button
          type="button"
          onClick={() => onChange({ sort, order: nextOrder })}
          className={`-mx-2 inline-flex min-h-target items-center gap-1 rounded-md px-2 text-left uppercase hover:bg-amber-wash hover:text-ink ${
            active ? 'text-ink' : ''
          }`}
        >
          {volunteerSortLabels[sort]}
          <span
            aria-hidden="true"
            className={`tabular text-[0.7rem] ${active ? 'text-amber-ink' : 'text-edge'}`}
          >
            {active ? (filters.order === 'asc' ? '▲' : '▼') : '↕'}
          </span>
          <span className="sr-only">
            {active ? `, sorted ${sortDirectionWords(sort, filters.order)}` : ', sort'}
          </span>
        </button>
      </Th>
    );
  }

  return (
    <div className="flex min-w-0 flex-col gap-4" aria-busy={volunteers.isFetching || undefined}>
      <Table
        caption={`Volunteers, sorted by ${volunteerSortLabels[filters.sort].toLowerCase()}, ${sortDirectionWords(filters.sort, filters.order)}`}
      >
        <TableHead>
          {sortHeader('name')}
          {sortHeader('verdicts', 'right')}
          {sortHeader('controlAccuracy', 'right')}
          {sortHeader('agreement', 'right')}
          {sortHeader('medianMs', 'right')}
          {sortHeader('topShare')}
          {sortHeader('lastActive')}
          <Th>Flags</Th>
        </TableHead>
        <TableBody>
          {volunteers.data.volunteers.map((volunteer) => {
            const action = open?.volunteerId === volunteer.id ? open.action : null;
            return [
              <VolunteerRow
                key={volunteer.id}
                volunteer={volunteer}
                openAction={action}
                onOpen={(next) => setOpen(next ? { volunteerId: volunteer.id, action: next } : null)}
              />,
              action ? (
                <tr key={`${volunteer.id}-action`} className="block md:table-row">
                  <td
                    colSpan={columnCount}
                    className="block md:table-cell md:border-b md:border-line md:bg-paper md:px-4 md:py-4"
                  >
                    <VolunteerActionPanel
                      volunteer={volunteer}
                      action={action}
                      onClose={() => setOpen(null)}
                      onOutcome={(result) => {
                        onOutcome(result);
                        if (result.tone === 'success') setOpen(null);
                      }}
                    />
                  </td>
                </tr>
              ) : null,
            ];
          })}
        </TableBody>
      </Table>
      <Pager
        noun="volunteers"
        page={page}
        pageSize={pageSize}
        total={total}
        onPage={(next) => onChange({ page: next })}
      />
    </div>
  );
}

interface VolunteerRowProps {
  volunteer: DeskVolunteer;
  openAction: VolunteerAction | null;
  onOpen: (action: VolunteerAction | null) => void;
}

function VolunteerRow({ volunteer, openAction, onOpen }: VolunteerRowProps) {
  const toggle = (action: VolunteerAction) =>
    onOpen(openAction && sameAction(openAction, action) ? null : action);
  const { controls, agreement } = volunteer;

  return (
    <Tr card="pairs" align="top" selected={openAction !== null}>
      <Td label="Volunteer" card="block" className="col-span-2 md:min-w-48">
        <span className="flex min-w-0 flex-col">
          <span className="flex flex-wrap items-center gap-2 font-medium text-ink">
            {volunteer.displayName}
            {volunteer.suspended ? <Badge tone="danger">Suspended</Badge> : null}
          </span>
          <Email address={volunteer.email} />
          {volunteer.suspended && volunteer.suspendedReason ? (
            <span className="text-sm text-danger">Suspended: {volunteer.suspendedReason}</span>
          ) : null}
        </span>
        <span className="mt-2 flex flex-wrap gap-2">
          <Button
            variant="secondary"
            className="text-sm"
            aria-label={`Record a warning for ${volunteer.displayName}`}
            aria-expanded={openAction?.type === 'warning'}
            onClick={() => toggle({ type: 'warning' })}
          >
            Warn
          </Button>
          {volunteer.suspended ? (
            <Button
              variant="secondary"
              className="text-sm"
              aria-label={`Restore ${volunteer.displayName}`}
              aria-expanded={openAction?.type === 'restore'}
              onClick={() => toggle({ type: 'restore' })}
            >
              Restore
            </Button>
          ) : (
            <Button
              variant="danger"
              className="text-sm"
              aria-label={`Suspend ${volunteer.displayName}`}
              aria-expanded={openAction?.type === 'suspend'}
              onClick={() => toggle({ type: 'suspend' })}
            >
              Suspend
            </Button>
          )}
        </span>
      </Td>
      <Td label="Verdicts" className="md:text-right">
        <span className="tabular text-ink">{formatCount(volunteer.verdicts)}</span>
      </Td>
      <Td label="Control accuracy" className="md:text-right">
        <span className="flex flex-col items-end whitespace-nowrap">
          <span className="tabular text-ink">{formatShare(controls.accuracy)}</span>
          <span className="tabular text-xs text-muted">
            {formatCount(controls.correct)} of {formatCount(controls.seen)}
          </span>
        </span>
      </Td>
      <Td label="Agreement" className="md:text-right">
        <span className="flex flex-col items-end whitespace-nowrap">
          <span className="tabular text-ink">{formatShare(agreement.share)}</span>
          <span className="tabular text-xs text-muted">
            {formatCount(agreement.agreed)} of {formatCount(agreement.compared)}
          </span>
        </span>
      </Td>
      <Td label="Median time" className="md:text-right">
        <span className="flex flex-col items-end whitespace-nowrap">
          <span className="tabular text-ink">{formatMs(volunteer.medianMs)}</span>
          <span className="tabular text-xs text-muted">max {formatCount(volunteer.maxPerMinute)}/min</span>
        </span>
      </Td>
      <Td label="Top answer">
        <span className="tabular text-sm whitespace-nowrap text-ink">
          {volunteer.topAnswer
            ? `${volunteer.topAnswer.answer} ${formatShare(volunteer.topAnswer.share)}`
            : '—'}
        </span>
      </Td>
      <Td label="Last active">
        <span className="tabular text-sm text-slate">{formatDateTime(volunteer.lastActiveAt)}</span>
      </Td>
      <Td label="Flags" card="block" className="col-span-2 md:min-w-40">
        {volunteer.flags.length === 0 ? (
          <span className="text-sm text-muted">None</span>
        ) : (
          <ul className="flex flex-col gap-2">
            {volunteer.flags.map((flag) => (
              <li key={flag.code} className="flex flex-col gap-1">
                <span className="flex flex-wrap items-center gap-2">
                  <Badge tone={flag.cleared ? 'slate' : 'danger'}>{flagLabel(flag.code)}</Badge>
                  {flag.cleared ? null : (
                    <Button
                      variant="quiet"
                      className="min-h-target px-2 text-sm underline decoration-line underline-offset-4"
                      aria-label={`Clear the “${flagLabel(flag.code)}” flag of ${volunteer.displayName}`}
                      onClick={() => toggle({ type: 'clear-flag', code: flag.code })}
                    >
                      Clear
                    </Button>
                  )}
                </span>
                <span className="text-sm text-ink">{flag.reason}</span>
                {flag.cleared ? (
                  <span className="text-sm text-muted">
                    Cleared by {flag.cleared.by ?? 'a former moderator'}: {flag.cleared.note}
                  </span>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </Td>
    </Tr>
  );
}

/** An address that breaks after its @ when it must, rather than in the middle of a word. */
function Email({ address }: { address: string }) {
  const at = address.indexOf('@');
  return (
    <span className="text-sm wrap-anywhere text-muted">
      {at < 0 ? (
        address
      ) : (
        <>
          {address.slice(0, at + 1)}
          <wbr />
          {address.slice(at + 1)}
        </>
      )}
    </span>
  );
}

function sameAction(a: VolunteerAction, b: VolunteerAction): boolean {
  return a.type === b.type && (a.type !== 'clear-flag' || (b.type === 'clear-flag' && a.code === b.code));
}
