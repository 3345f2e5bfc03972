import { useId } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button, ButtonLink, buttonClasses } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Pager } from '@/components/pager';
import { Select } from '@/components/select';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { paths } from '@/config/paths';
import { useSplitCampaigns, useSplits } from '../api/get-splits';
import { formatCount, formatDateTime, formatScore, formatShare } from '../lib/format';
import {
  type QueueView,
  readQueue,
  type SplitOrder,
  type SplitRow,
  snippetKindLabels,
  splitOrderLabels,
  splitOrders,
  splitReasonLabels,
} from '../lib/splits';

const pageSize = 25;

/** The Desk's home: the queue of split snippets, oldest first or candidates first, each opening its review. */
export function DeskPage() {
  const [search, setSearch] = useSearchParams();
  const queue = readQueue(search);

  // The queue lives in the address, so the review it opens can follow the same order with J and K.
  function change(next: Partial<QueueView>) {
    const merged = { ...queue, page: 1, ...next };
    setSearch(new URLSearchParams(paths.desk.getHref(merged).split('?')[1] ?? ''), { replace: true });
  }

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Desk"
        title="Split snippets"
        description="When volunteers disagree on a snippet, it waits here for a moderator’s ruling. Open one to see every verdict and mark, then rule dip, flat or systematic."
      />
      <QueueFilters queue={queue} onChange={change} />
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The split queue could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <SplitQueue queue={queue} onPage={(page) => change({ page })} />
      </ErrorBoundary>
    </div>
  );
}

function QueueFilters({
  queue,
  onChange,
}: {
  queue: QueueView;
  onChange: (next: Partial<QueueView>) => void;
}) {
  const campaignId = useId();
  const orderName = useId();
  const campaigns = useSplitCampaigns();
  const known = campaigns.data ?? [];
  // One campaign needs no filter; a campaign chosen in the address keeps its filter so it can be undone.
  const showCampaigns = known.length > 1 || queue.campaign !== null;

  return (
    <div className="flex flex-col gap-4 md:flex-row md:items-end md:gap-6">
      {showCampaigns ? (
        <div className="flex flex-col gap-1.5 md:w-72">
          <label htmlFor={campaignId} className="text-sm font-medium text-ink">
            Campaign
          </label>
          <Select
            id={campaignId}
            value={queue.campaign === null ? '' : String(queue.campaign)}
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
            {queue.campaign !== null && !known.some((campaign) => campaign.id === queue.campaign) ? (
              <option value={queue.campaign}>Campaign #{queue.campaign}</option>
            ) : null}
          </Select>
        </div>
      ) : null}
      <fieldset className="flex flex-col gap-1.5">
        <legend className="mb-1.5 text-sm font-medium text-ink">Order</legend>
        <div className="inline-flex self-start rounded-md border border-edge bg-surface p-1">
          {splitOrders.map((order) => {
            const checked = order === queue.order;
            return (
              <label
                key={order}
                className={`inline-flex min-h-target cursor-pointer items-center rounded-sm px-4 text-sm font-medium has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-amber has-[:focus-visible]:outline-offset-2 ${
                  checked ? 'bg-ink text-paper' : 'text-ink hover:bg-amber-wash'
                }`}
              >
                <input
                  type="radio"
                  name={orderName}
                  value={order}
                  checked={checked}
                  onChange={() => onChange({ order: order as SplitOrder })}
                  className="sr-only"
                />
                {splitOrderLabels[order]}
              </label>
            );
          })}
        </div>
      </fieldset>
    </div>
  );
}

function SplitQueue({ queue, onPage }: { queue: QueueView; onPage: (page: number) => void }) {
  const splits = useSplits({
    campaign: queue.campaign,
    order: queue.order,
    limit: pageSize,
    offset: (queue.page - 1) * pageSize,
  });
  const campaigns = useSplitCampaigns();
  const manyCampaigns = (campaigns.data?.length ?? 0) > 1 && queue.campaign === null;

  if (splits.isPending) return <Loading label="Loading the split queue…" />;
  if (splits.isError) {
    return (
      <LoadFailure
        title="Could not load the split queue"
        error={splits.error}
        onRetry={() => splits.refetch()}
      />
    );
  }

  const { total } = splits.data;
  if (splits.data.splits.length === 0) {
    return total > 0 ? (
      <div className="flex flex-col gap-4">
        <p className="text-base text-muted">This page of the queue is empty now.</p>
        <Pager noun="split snippets" page={queue.page} pageSize={pageSize} total={total} onPage={onPage} />
      </div>
    ) : (
      <EmptyState
        title={
          queue.campaign === null ? 'No split snippets to rule on' : 'No split snippets in this campaign'
        }
        sketch="dip"
      >
        <p>
          Every snippet volunteers have judged so far either settled by itself or has been ruled on. Snippets
          come here when volunteers disagree: after the most verdicts a snippet may get, when two reliable
          volunteers contradict each other, or when a settled outcome would change.
        </p>
      </EmptyState>
    );
  }

  const first = splits.data.splits[0]!;
  return (
    <div className="flex flex-col gap-4" aria-busy={splits.isFetching || undefined}>
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="text-base text-ink">
          <span className="tabular font-medium">{formatCount(total)}</span>{' '}
          {total === 1 ? 'split snippet waits' : 'split snippets wait'} for a ruling
        </p>
        {queue.page === 1 ? (
          <ButtonLink to={paths.deskSplit.getHref(first.snippetId, queue)}>Start with the first</ButtonLink>
        ) : null}
      </div>
      <Table caption={`Split snippets, ${splitOrderLabels[queue.order].toLowerCase()}`}>
        <TableHead>
          <Th>Snippet</Th>
          <Th>Target</Th>
          {manyCampaigns ? <Th>Campaign</Th> : null}
          <Th>Why it split</Th>
          <Th>Split</Th>
          <Th className="text-right">Verdicts</Th>
          <Th className="text-right">Said dip</Th>
          <Th className="text-right">Consensus score</Th>
        </TableHead>
        <TableBody>
          {splits.data.splits.map((split) => (
            <SplitQueueRow key={split.snippetId} split={split} queue={queue} showCampaign={manyCampaigns} />
          ))}
        </TableBody>
      </Table>
      <Pager noun="split snippets" page={queue.page} pageSize={pageSize} total={total} onPage={onPage} />
    </div>
  );
}

function SplitQueueRow({
  split,
  queue,
  showCampaign,
}: {
  split: SplitRow;
  queue: QueueView;
  showCampaign: boolean;
}) {
  const href = paths.deskSplit.getHref(split.snippetId, queue);
  return (
    <Tr card="pairs">
      <Td label="Snippet" className="col-span-2 md:col-span-1">
        <Link
          to={href}
          aria-label={`Review snippet ${split.snippetId} of ${split.target.designation}`}
          className="tabular -mx-2 inline-flex min-h-target min-w-target items-center rounded-md px-2 font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
        >
          #{split.snippetId}
        </Link>
      </Td>
      <Td label="Target" className="col-span-2 md:col-span-1">
        <span className="flex flex-col text-right md:text-left">
          <span className="tabular text-sm whitespace-nowrap text-ink">{split.target.designation}</span>
          <span className="text-xs text-muted">{snippetKindLabels[split.kind]}</span>
        </span>
      </Td>
      {showCampaign ? (
        <Td label="Campaign">
          <span className="text-sm text-ink">{split.campaign.name}</span>
        </Td>
      ) : null}
      <Td label="Why it split" className="col-span-2">
        <span className="flex flex-wrap items-center justify-end gap-1.5 md:justify-start">
          <span className="text-sm text-ink">
            {split.splitReason ? splitReasonLabels[split.splitReason] : 'Not recorded'}
          </span>
          {split.onCandidate ? <Badge tone="amber">On a candidate</Badge> : null}
        </span>
      </Td>
      <Td label="Split" className="col-span-2 md:col-span-1">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {formatDateTime(split.splitAt)}
        </span>
      </Td>
      <Td label="Verdicts" className="md:text-right">
        <span className="tabular text-ink">{formatCount(split.verdictCount)}</span>
      </Td>
      <Td label="Said dip" className="md:text-right">
        <span className="tabular text-ink">{formatShare(split.dipShare)}</span>
      </Td>
      <Td label="Consensus score" className="md:text-right">
        <span
          className={`tabular ${split.consensusScore !== null && split.consensusScore >= 0.5 ? 'text-amber-ink' : 'text-slate'}`}
        >
          {formatScore(split.consensusScore)}
        </span>
      </Td>
      {/* On a phone a card needs a target of its own; on a wide screen the snippet number is that link. */}
      <Td label="Review" className="col-span-2 before:hidden md:hidden!">
        <Link to={href} className={buttonClasses('secondary', 'w-full text-sm')}>
          Review #{split.snippetId}
        </Link>
      </Td>
    </Tr>
  );
}
