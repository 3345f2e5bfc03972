import { useEffect, useId, useRef, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Select } from '@/components/select';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { inputClasses } from '@/components/text-field';
import { paths } from '@/config/paths';
import type { SnippetListParams } from '@/lib/query-keys';
import { useCampaign } from '../api/get-campaign';
import { useSnippets } from '../api/get-snippets';
import { formatCount } from '../lib/format';
import {
  formatDays,
  formatScore,
  type SnippetRow,
  type SnippetSort,
  snippetKindLabels,
  snippetKinds,
  snippetKindTones,
  snippetSortLabels,
  snippetSorts,
  snippetStateLabels,
  snippetStates,
  snippetStateTones,
} from '../lib/snippets';
import { SnippetPreview } from './snippet-preview';

const pageSize = 25;
const searchDelayMs = 300;
/** Moving the pointer down the list should not load every snippet it crosses. */
const hoverDelayMs = 120;

function readParams(search: URLSearchParams, campaignId: number): SnippetListParams {
  const sort = search.get('sort');
  const page = Number(search.get('page'));
  const state = search.get('state') ?? '';
  const kind = search.get('kind') ?? '';
  return {
    campaignId,
    state: (snippetStates as readonly string[]).includes(state) ? state : '',
    kind: (snippetKinds as readonly string[]).includes(kind) ? kind : '',
    target: search.get('target') ?? '',
    sort: (snippetSorts as readonly string[]).includes(sort ?? '') ? (sort as SnippetSort) : 'id',
    order: search.get('order') === 'desc' ? 'desc' : 'asc',
    page: Number.isInteger(page) && page > 0 ? page : 1,
    pageSize,
  };
}

export function SnippetBrowserPage({ campaignId }: { campaignId: number }) {
  const campaign = useCampaign(campaignId);
  const [search, setSearch] = useSearchParams();
  const params = readParams(search, campaignId);
  const [selected, setSelected] = useState<number | null>(null);
  const [hovered, setHovered] = useState<number | null>(null);
  const previewRef = useRef<HTMLDivElement>(null);
  const previewHeadingId = useId();

  // Filters live in the address, so a filtered list can be shared and survives a reload.
  function change(next: Partial<Omit<SnippetListParams, 'campaignId' | 'pageSize'>>) {
    setSearch(
      (current) => {
        const merged = { ...readParams(current, campaignId), page: 1, ...next };
        const out = new URLSearchParams();
        if (merged.state) out.set('state', merged.state);
        if (merged.kind) out.set('kind', merged.kind);
        if (merged.target) out.set('target', merged.target);
        if (merged.sort !== 'id') out.set('sort', merged.sort);
        if (merged.order !== 'asc') out.set('order', merged.order);
        if (merged.page > 1) out.set('page', String(merged.page));
        return out;
      },
      { replace: true },
    );
  }

  function choose(id: number) {
    setSelected(id);
    // On a phone the preview sits above the list; bring it into view.
    if (!window.matchMedia('(min-width: 80rem)').matches) {
      previewRef.current?.scrollIntoView({ behavior: 'smooth', block: 'start' });
    }
  }

  const title = campaign.data ? `Snippets of ${campaign.data.name}` : 'Snippets';

  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-col gap-4">
        <Link
          to={paths.labCampaign.getHref(campaignId)}
          className="inline-flex min-h-target items-center gap-1.5 self-start rounded-md pr-3 text-sm font-medium text-muted hover:text-ink"
        >
          <span aria-hidden="true">←</span> {campaign.data?.name ?? 'The campaign'}
        </Link>
        <PageHeader
          eyebrow={`Campaign · #${campaignId} · snippet browser`}
          title={title}
          description="Every window cut from the campaign’s light curves, with the controls mixed in. Sort and filter, then point at a row to see its light curve."
        />
      </div>

      <Filters params={params} onChange={change} />

      <div className="grid grid-cols-1 gap-6 xl:grid-cols-[minmax(0,1fr)_22rem] xl:items-start">
        <div ref={previewRef} className="scroll-mt-20 xl:sticky xl:top-20 xl:order-last">
          <SnippetPreview snippetId={hovered ?? selected} headingId={previewHeadingId} />
        </div>
        <ErrorBoundary
          fallback={(_error, reset) => (
            <Alert tone="danger" title="The snippet list could not be shown">
              <Button variant="secondary" className="mt-2" onClick={reset}>
                Try again
              </Button>
            </Alert>
          )}
        >
          <SnippetTable
            params={params}
            selected={selected}
            onChoose={choose}
            onHover={setHovered}
            onChange={change}
          />
        </ErrorBoundary>
      </div>
    </div>
  );
}

interface FiltersProps {
  params: SnippetListParams;
  onChange: (next: Partial<SnippetListParams>) => void;
}

function Filters({ params, onChange }: FiltersProps) {
  const stateId = useId();
  const kindId = useId();
  const targetId = useId();
  const sortId = useId();
  const [target, setTarget] = useState(params.target);

  // Typing should not fire one request per key; only a settled designation goes into the address.
  // biome-ignore lint/correctness/useExhaustiveDependencies: onChange is a new function every render.
  useEffect(() => {
    if (target === params.target) return;
    const timer = window.setTimeout(() => onChange({ target: target.trim() }), searchDelayMs);
    return () => window.clearTimeout(timer);
  }, [target, params.target]);

  return (
    <div className="grid gap-4 rounded-lg border border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-4">
      <div className="flex flex-col gap-1.5">
        <label htmlFor={stateId} className="text-sm font-medium">
          State
        </label>
        <Select
          id={stateId}
          value={params.state}
          onChange={(event) => onChange({ state: event.target.value })}
        >
          <option value="">Every state</option>
          {snippetStates.map((state) => (
            <option key={state} value={state}>
              {snippetStateLabels[state]}
            </option>
          ))}
        </Select>
      </div>
      <div className="flex flex-col gap-1.5">
        <label htmlFor={kindId} className="text-sm font-medium">
          Kind
        </label>
        <Select id={kindId} value={params.kind} onChange={(event) => onChange({ kind: event.target.value })}>
          <option value="">Real and controls</option>
          {snippetKinds.map((kind) => (
            <option key={kind} value={kind}>
              {snippetKindLabels[kind]}
            </option>
          ))}
        </Select>
      </div>
      <div className="flex flex-col gap-1.5">
        <label htmlFor={targetId} className="text-sm font-medium">
          Target
        </label>
        <input
          id={targetId}
          type="search"
          value={target}
          onChange={(event) => setTarget(event.target.value)}
          placeholder="Designation"
          spellCheck={false}
          className={`${inputClasses} tabular`}
        />
      </div>
      <div className="flex flex-col gap-1.5">
        <label htmlFor={sortId} className="text-sm font-medium">
          Sort by
        </label>
        <Select
          id={sortId}
          value={`${params.sort}:${params.order}`}
          onChange={(event) => {
            const [sort, order] = event.target.value.split(':') as [SnippetSort, 'asc' | 'desc'];
            onChange({ sort, order });
          }}
        >
          {snippetSorts.flatMap((sort) =>
            (['asc', 'desc'] as const).map((order) => (
              <option key={`${sort}:${order}`} value={`${sort}:${order}`}>
                {snippetSortLabels[sort]}, {sortDirectionWords(sort, order)}
              </option>
            )),
          )}
        </Select>
      </div>
    </div>
  );
}

function sortDirectionWords(sort: SnippetSort, order: 'asc' | 'desc'): string {
  if (sort === 'timeStart') return order === 'asc' ? 'earliest first' : 'latest first';
  if (sort === 'id') return order === 'asc' ? 'oldest first' : 'newest first';
  return order === 'asc' ? 'lowest first' : 'highest first';
}

interface SnippetTableProps {
  params: SnippetListParams;
  selected: number | null;
  onChoose: (id: number) => void;
  onHover: (id: number | null) => void;
  onChange: (next: Partial<SnippetListParams>) => void;
}

function SnippetTable({ params, selected, onChoose, onHover, onChange }: SnippetTableProps) {
  const snippets = useSnippets(params);
  const hoverTimer = useRef<number | undefined>(undefined);

  useEffect(() => () => window.clearTimeout(hoverTimer.current), []);

  function hover(id: number | null) {
    window.clearTimeout(hoverTimer.current);
    hoverTimer.current = window.setTimeout(() => onHover(id), id === null ? 0 : hoverDelayMs);
  }

  if (snippets.isPending) return <Loading label="Loading snippets…" />;
  if (snippets.isError) {
    return (
      <LoadFailure
        title="Could not load the snippets"
        error={snippets.error}
        onRetry={() => snippets.refetch()}
      />
    );
  }

  const { total, page } = snippets.data;
  const filtered = Boolean(params.state || params.kind || params.target);
  if (snippets.data.snippets.length === 0) {
    return (
      <EmptyState title={filtered ? 'No snippet matches' : 'No snippets yet'}>
        <p>
          {filtered
            ? 'Nothing matches these filters. Loosen one, or check the designation.'
            : 'Snippets appear once a light curve of this campaign has been read. Upload one on the campaign page.'}
        </p>
      </EmptyState>
    );
  }

  function sortHeader(sort: SnippetSort, align: 'left' | 'right' = 'left') {
    const active = params.sort === sort;
    const nextOrder = active && params.order === 'asc' ? 'desc' : 'asc';
    return (
      <Th
        aria-sort={active ? (params.order === 'asc' ? 'ascending' : 'descending') : undefined}
        className={`py-0 ${align === 'right' ? 'text-right' : ''}`}
      >
        <button
          type="button"
          onClick={() => onChange({ sort, order: nextOrder })}
          className={`-mx-2 inline-flex min-h-target items-center gap-1 rounded-md px-2 uppercase hover:bg-amber-wash hover:text-ink ${
            active ? 'text-ink' : ''
          }`}
        >
          {snippetSortLabels[sort]}
          <span
            aria-hidden="true"
            className={`tabular text-[0.7rem] ${active ? 'text-amber-ink' : 'text-line'}`}
          >
            {active ? (params.order === 'asc' ? '▲' : '▼') : '▲'}
          </span>
          <span className="sr-only">
            {active ? `, sorted ${sortDirectionWords(sort, params.order)}` : ', sort'}
          </span>
        </button>
      </Th>
    );
  }

  return (
    <div className="flex min-w-0 flex-col gap-4" aria-busy={snippets.isFetching || undefined}>
      <Table caption="Snippets of this campaign">
        <TableHead>
          {sortHeader('id')}
          <Th>Target</Th>
          <Th>Kind · state</Th>
          {sortHeader('timeStart')}
          {sortHeader('verdictCount', 'right')}
          {sortHeader('consensusScore', 'right')}
        </TableHead>
        <TableBody>
          {snippets.data.snippets.map((snippet) => (
            <SnippetTableRow
              key={snippet.id}
              snippet={snippet}
              selected={snippet.id === selected}
              onChoose={onChoose}
              onHover={hover}
            />
          ))}
        </TableBody>
      </Table>
      <Pager
        noun="snippets"
        page={page}
        pageSize={params.pageSize}
        total={total}
        onPage={(next) => onChange({ page: next })}
      />
    </div>
  );
}

interface SnippetTableRowProps {
  snippet: SnippetRow;
  selected: boolean;
  onChoose: (id: number) => void;
  onHover: (id: number | null) => void;
}

function SnippetTableRow({ snippet, selected, onChoose, onHover }: SnippetTableRowProps) {
  const lengthDays = snippet.timeEnd - snippet.timeStart;
  return (
    <Tr
      selected={selected}
      onMouseEnter={() => onHover(snippet.id)}
      onMouseLeave={() => onHover(null)}
      // A click anywhere on the row previews it; the snippet button is the keyboard's way to the same.
      onClick={(event) => {
        if (!(event.target as HTMLElement).closest('a, button')) onChoose(snippet.id);
      }}
      style={{ cursor: 'pointer' }}
    >
      <Td label="Snippet">
        <button
          type="button"
          aria-pressed={selected}
          aria-label={`Preview snippet ${snippet.id}`}
          onClick={() => onChoose(snippet.id)}
          className={`tabular -mx-2 inline-flex min-h-target min-w-target items-center rounded-md px-2 font-medium hover:bg-amber-wash ${
            selected ? 'text-amber-ink' : 'text-ink'
          }`}
        >
          #{snippet.id}
        </button>
      </Td>
      <Td label="Target">
        <Link
          to={paths.labTarget.getHref(snippet.targetId)}
          className="tabular inline-flex min-h-target items-center rounded-sm text-sm text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber md:whitespace-nowrap"
        >
          {snippet.designation}
        </Link>
      </Td>
      <Td label="Kind · state">
        <span className="flex flex-wrap justify-end gap-1.5 md:justify-start">
          <Badge tone={snippetKindTones[snippet.kind]}>{snippetKindLabels[snippet.kind]}</Badge>
          <Badge tone={snippetStateTones[snippet.state]}>{snippetStateLabels[snippet.state]}</Badge>
        </span>
      </Td>
      <Td label="Time">
        <span className="flex flex-col text-right md:text-left">
          <span className="tabular text-sm text-ink md:whitespace-nowrap">
            {formatDays(snippet.timeStart)}
          </span>
          <span className="tabular text-xs text-muted md:whitespace-nowrap">
            {lengthDays.toFixed(2)} d · {formatCount(snippet.pointCount)} pts
          </span>
        </span>
      </Td>
      <Td label="Verdicts" className="md:text-right">
        <span className="tabular text-ink">{formatCount(snippet.verdictCount)}</span>
      </Td>
      <Td label="Consensus score" className="md:text-right">
        <ScoreValue score={snippet.consensusScore} />
      </Td>
      {/* On a phone a card needs a button of its own; on a wide screen the snippet number is that button. */}
      <Td label="Preview" className="before:hidden md:hidden!">
        <Button
          variant={selected ? 'primary' : 'secondary'}
          aria-pressed={selected}
          onClick={() => onChoose(snippet.id)}
          className="w-full text-sm"
        >
          Preview #{snippet.id}
        </Button>
      </Td>
    </Tr>
  );
}

function ScoreValue({ score }: { score: number | null }) {
  if (score === null) return <span className="tabular text-muted">—</span>;
  // A score near 1 says "dip" (amber), near 0 says "flat" (slate); the bar shows where between.
  const tone = score >= 0.5 ? 'text-amber-ink' : 'text-slate';
  return (
    <span className="inline-flex items-center gap-2">
      <span
        aria-hidden="true"
        className="relative hidden h-1.5 w-10 overflow-hidden rounded-full bg-slate-wash md:block"
      >
        <span
          className={`absolute inset-y-0 left-0 rounded-full ${score >= 0.5 ? 'bg-amber' : 'bg-slate'}`}
          style={{ width: `${Math.round(score * 100)}%` }}
        />
      </span>
      <span className={`tabular ${tone}`}>{formatScore(score)}</span>
    </span>
  );
}
