import { type FormEvent, useId, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { inputClasses } from '@/components/text-field';
import type { AuditListParams } from '@/lib/query-keys';
import { useAuditLog } from '../api/get-audit-log';
import { type AuditEntry, describeChange } from '../lib/audit';
import { formatDateTime } from '../lib/format';

const pageSize = 25;
/** More changed keys than this fold away behind "more", so one big entry does not fill the screen. */
const linesShown = 6;

interface AuditFilters {
  action: string;
  entityType: string;
  actorId: string;
  /** Calendar days (yyyy-mm-dd) as the date inputs give them; '' for no bound. */
  fromDay: string;
  toDay: string;
  page: number;
}

const dayPattern = /^\d{4}-\d{2}-\d{2}$/;

function readFilters(search: URLSearchParams): AuditFilters {
  const page = Number(search.get('page'));
  const day = (name: string) => {
    const value = search.get(name) ?? '';
    return dayPattern.test(value) ? value : '';
  };
  const actor = search.get('actor') ?? '';
  return {
    action: search.get('action') ?? '',
    entityType: search.get('entityType') ?? '',
    actorId: /^\d+$/.test(actor) ? actor : '',
    fromDay: day('from'),
    toDay: day('to'),
    page: Number.isInteger(page) && page > 0 ? page : 1,
  };
}

function writeFilters(filters: AuditFilters): URLSearchParams {
  const out = new URLSearchParams();
  if (filters.action) out.set('action', filters.action);
  if (filters.entityType) out.set('entityType', filters.entityType);
  if (filters.actorId) out.set('actor', filters.actorId);
  if (filters.fromDay) out.set('from', filters.fromDay);
  if (filters.toDay) out.set('to', filters.toDay);
  if (filters.page > 1) out.set('page', String(filters.page));
  return out;
}

/** A day in the moderator's own time zone, from its first to its last millisecond, as UTC instants. */
function dayBounds(day: string, end: boolean): string {
  if (!day) return '';
  const [year, month, date] = day.split('-').map(Number) as [number, number, number];
  const local = end ? new Date(year, month - 1, date, 23, 59, 59, 999) : new Date(year, month - 1, date);
  return Number.isNaN(local.getTime()) ? '' : local.toISOString();
}

function toParams(filters: AuditFilters): AuditListParams {
  return {
    action: filters.action.trim(),
    entityType: filters.entityType.trim(),
    actorId: filters.actorId ? Number(filters.actorId) : null,
    from: dayBounds(filters.fromDay, false),
    to: dayBounds(filters.toDay, true),
    limit: pageSize,
    offset: (filters.page - 1) * pageSize,
  };
}

/** The audit log: every staff action, newest first, to read and filter; nothing here edits or deletes. */
export function AuditPage() {
  const [search, setSearch] = useSearchParams();
  const filters = readFilters(search);

  function change(next: Partial<AuditFilters>) {
    setSearch((current) => writeFilters({ ...readFilters(current), page: 1, ...next }), { replace: true });
  }

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Desk"
        title="Audit log"
        description="Every ruling, suspension, cleared flag, warning and role change, with who made it and what changed. The log is kept as written: nobody can edit or delete an entry."
      />
      {/* The key gives the form the address's values again when the address changes (back, clear). */}
      <AuditFilterForm key={search.toString()} filters={filters} onApply={change} />
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The audit log could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <AuditTable filters={filters} onPage={(page) => change({ page })} />
      </ErrorBoundary>
    </div>
  );
}

function AuditFilterForm({
  filters,
  onApply,
}: {
  filters: AuditFilters;
  onApply: (next: Partial<AuditFilters>) => void;
}) {
  const ids = { action: useId(), entity: useId(), actor: useId(), from: useId(), to: useId() };
  const [draft, setDraft] = useState(filters);
  const set = (name: keyof Omit<AuditFilters, 'page'>, value: string) =>
    setDraft((current) => ({ ...current, [name]: value }));
  const filtered = Boolean(
    filters.action || filters.entityType || filters.actorId || filters.fromDay || filters.toDay,
  );

  function submit(event: FormEvent) {
    event.preventDefault();
    onApply({
      action: draft.action.trim(),
      entityType: draft.entityType.trim(),
      actorId: draft.actorId.trim(),
      fromDay: draft.fromDay,
      toDay: draft.toDay,
    });
  }

  const field = (
    id: string,
    label: string,
    name: keyof Omit<AuditFilters, 'page'>,
    extra: { type?: string; placeholder?: string; inputMode?: 'numeric' } = {},
  ) => (
    <div className="flex min-w-0 flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      <input
        id={id}
        type={extra.type ?? 'text'}
        value={draft[name]}
        placeholder={extra.placeholder}
        inputMode={extra.inputMode}
        spellCheck={false}
        onChange={(event) => set(name, event.target.value)}
        className={`${inputClasses} ${extra.type === 'date' ? '' : 'tabular'}`}
      />
    </div>
  );

  return (
    <form
      onSubmit={submit}
      aria-label="Filter the audit log"
      className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4"
    >
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-5">
        {field(ids.action, 'Action', 'action', { placeholder: 'e.g. snippet.ruled' })}
        {field(ids.entity, 'Entity type', 'entityType', { placeholder: 'e.g. snippet' })}
        {field(ids.actor, 'Actor id', 'actorId', { inputMode: 'numeric', placeholder: 'Person id' })}
        {field(ids.from, 'From', 'fromDay', { type: 'date' })}
        {field(ids.to, 'To', 'toDay', { type: 'date' })}
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit">Apply filters</Button>
        {filtered ? (
          <Button
            variant="secondary"
            onClick={() => onApply({ action: '', entityType: '', actorId: '', fromDay: '', toDay: '' })}
          >
            Clear filters
          </Button>
        ) : null}
      </div>
    </form>
  );
}

function AuditTable({ filters, onPage }: { filters: AuditFilters; onPage: (page: number) => void }) {
  const log = useAuditLog(toParams(filters));

  if (log.isPending) return <Loading label="Loading the audit log…" />;
  if (log.isError) {
    return (
      <LoadFailure title="Could not load the audit log" error={log.error} onRetry={() => log.refetch()} />
    );
  }

  const { total } = log.data;
  if (log.data.entries.length === 0) {
    return (
      <EmptyState title={total > 0 ? 'This page is empty' : 'No entries match'}>
        <p>
          {total > 0
            ? 'The log has fewer entries than this page starts at.'
            : 'Nothing in the audit log matches these filters. Actions are matched in full, such as snippet.ruled.'}
        </p>
      </EmptyState>
    );
  }

  return (
    <div className="flex min-w-0 flex-col gap-4" aria-busy={log.isFetching || undefined}>
      <Table caption="Audit log entries, newest first">
        <TableHead>
          <Th>When</Th>
          <Th>Actor</Th>
          <Th>Action</Th>
          <Th>Entity</Th>
          <Th>Change</Th>
          <Th>Note</Th>
        </TableHead>
        <TableBody>
          {log.data.entries.map((entry) => (
            <AuditRow key={entry.id} entry={entry} />
          ))}
        </TableBody>
      </Table>
      <Pager noun="entries" page={filters.page} pageSize={pageSize} total={total} onPage={onPage} />
    </div>
  );
}

function AuditRow({ entry }: { entry: AuditEntry }) {
  return (
    <Tr align="top">
      <Td label="When">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {formatDateTime(entry.createdAt)}
        </span>
      </Td>
      <Td label="Actor">
        {entry.actor ? (
          <span className="flex flex-col text-right md:text-left">
            <span className="text-sm text-ink">{entry.actor.displayName}</span>
            <span className="tabular text-xs text-muted">#{entry.actor.id}</span>
          </span>
        ) : (
          <span className="text-sm text-muted">Dipdeck</span>
        )}
      </Td>
      <Td label="Action">
        <span className="tabular text-sm break-all text-ink">{entry.action}</span>
      </Td>
      <Td label="Entity">
        <span className="tabular text-sm text-ink md:whitespace-nowrap">
          {entry.entityType}
          {entry.entityId ? ` #${entry.entityId}` : ''}
        </span>
      </Td>
      <Td label="Change" card="block">
        <ChangeList before={entry.before} after={entry.after} />
      </Td>
      <Td label="Note" card="block">
        {entry.note ? (
          <span className="text-sm whitespace-pre-line text-ink">{entry.note}</span>
        ) : (
          <span className="text-sm text-muted">—</span>
        )}
      </Td>
    </Tr>
  );
}

function ChangeList({ before, after }: { before: unknown; after: unknown }) {
  const lines = describeChange(before, after);
  const [all, setAll] = useState(false);
  if (lines.length === 0) return <span className="text-sm text-muted">—</span>;
  const shown = all ? lines : lines.slice(0, linesShown);
  return (
    <div className="flex flex-col gap-1">
      <ul className="tabular flex flex-col gap-0.5 text-xs">
        {shown.map((line) => (
          <li key={line.key || 'value'} className="break-all">
            {line.key ? <span className="text-muted">{line.key}: </span> : null}
            {line.before === null ? null : (
              <span className="text-slate line-through decoration-edge">{line.before}</span>
            )}
            {line.before !== null && line.after !== null ? (
              <>
                <span aria-hidden="true" className="text-muted">
                  {' → '}
                </span>
                <span className="sr-only"> changed to </span>
              </>
            ) : null}
            {line.after === null ? (
              <span className="text-muted"> (removed)</span>
            ) : (
              <span className="text-ink">{line.after}</span>
            )}
          </li>
        ))}
      </ul>
      {lines.length > linesShown ? (
        <button
          type="button"
          onClick={() => setAll(!all)}
          className="inline-flex min-h-target min-w-target items-center self-start rounded-md text-xs font-medium text-ink underline decoration-line underline-offset-4 hover:decoration-amber"
        >
          {all ? 'Show fewer' : `${lines.length - linesShown} more`}
        </button>
      ) : null}
    </div>
  );
}
