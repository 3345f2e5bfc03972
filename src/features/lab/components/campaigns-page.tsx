import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { paths } from '@/config/paths';
import { useCampaigns } from '../api/get-campaigns';
import { type Campaign, snippetTotal } from '../lib/campaigns';
import { formatCount, formatDate } from '../lib/format';
import { CampaignStatusBadge } from './campaign-status-badge';

export function CampaignsPage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="Campaigns"
        description="Each campaign searches a catalogue of targets: upload their light curves, check the snippets cut from them, and set the campaign live to send its snippets to the Deck."
        actions={<ButtonLink to={paths.labNewCampaign.getHref()}>New campaign</ButtonLink>}
      />
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The campaign list could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <CampaignList />
      </ErrorBoundary>
    </div>
  );
}

function CampaignList() {
  const campaigns = useCampaigns();

  if (campaigns.isPending) return <Loading label="Loading campaigns…" />;
  if (campaigns.isError) {
    return (
      <LoadFailure
        title="Could not load the campaigns"
        error={campaigns.error}
        onRetry={() => campaigns.refetch()}
      />
    );
  }
  if (campaigns.data.length === 0) {
    return (
      <EmptyState
        title="No campaigns yet"
        sketch="dip"
        upcoming={[
          'Each campaign with its status: draft, live, paused or closed',
          'How many targets, light curves and snippets it holds',
          'How many snippets are still open and how many are settled',
        ]}
        action={<ButtonLink to={paths.labNewCampaign.getHref()}>New campaign</ButtonLink>}
      >
        <p>Start a campaign, upload its target catalogue and light curves, then set it live.</p>
      </EmptyState>
    );
  }

  return (
    <Table caption="Campaigns, newest first">
      <TableHead>
        <Th>Campaign</Th>
        <Th>Status</Th>
        <Th className="text-right">Targets</Th>
        <Th className="text-right">Light curves</Th>
        <Th className="text-right">Snippets open</Th>
        <Th className="text-right">Settled</Th>
        <Th className="text-right">Controls</Th>
        <Th>Created</Th>
      </TableHead>
      <TableBody>
        {campaigns.data.map((campaign) => (
          <CampaignRow key={campaign.id} campaign={campaign} />
        ))}
      </TableBody>
    </Table>
  );
}

function CampaignRow({ campaign }: { campaign: Campaign }) {
  const counts = campaign.counts;
  const settled = counts ? counts.snippets.settled + counts.snippets.ruled : null;
  return (
    <Tr card="pairs">
      <Td
        label="Campaign"
        className="col-span-2 border-b border-line pb-3 before:hidden md:border-b-0 md:pb-3"
      >
        <span className="flex min-w-0 flex-col gap-0.5">
          <Link
            to={paths.labCampaign.getHref(campaign.id)}
            className="flex min-h-target items-center rounded-sm font-semibold text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber md:min-h-0"
          >
            {campaign.name}
          </Link>
          {campaign.description ? (
            <span className="line-clamp-2 max-w-md text-sm text-muted">{campaign.description}</span>
          ) : null}
        </span>
      </Td>
      <Td label="Status">
        <CampaignStatusBadge status={campaign.status} />
      </Td>
      <Td label="Targets" className="md:text-right">
        <CountCell value={counts?.targets} />
      </Td>
      <Td label="Light curves" className="md:text-right">
        <CountCell value={counts?.lightCurves} />
      </Td>
      <Td label="Snippets open" className="md:text-right">
        <CountCell value={counts?.snippets.open} />
      </Td>
      <Td label="Settled" className="md:text-right">
        <span className="tabular text-slate md:whitespace-nowrap">
          {settled === null || !counts
            ? '—'
            : `${formatCount(settled)} of ${formatCount(snippetTotal(counts))}`}
        </span>
      </Td>
      <Td label="Controls" className="md:text-right">
        <span className="tabular text-slate" title="planted · quiet">
          {counts ? `${formatCount(counts.controls.planted)} · ${formatCount(counts.controls.quiet)}` : '—'}
        </span>
      </Td>
      <Td label="Created">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {formatDate(campaign.createdAt)}
        </span>
      </Td>
    </Tr>
  );
}

function CountCell({ value }: { value: number | undefined }) {
  return <span className="tabular text-ink">{value === undefined ? '—' : formatCount(value)}</span>;
}
