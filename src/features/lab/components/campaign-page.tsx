import { type ReactNode, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCampaign } from '../api/get-campaign';
import { type Campaign, snippetTotal } from '../lib/campaigns';
import { formatCount, formatDateTime } from '../lib/format';
import { CampaignCompleteness } from './campaign-completeness';
import { CampaignNotFound } from './campaign-not-found';
import { CampaignSettingsForm } from './campaign-settings-form';
import { CampaignStatusActions, type Outcome } from './campaign-status-actions';
import { CampaignStatusBadge } from './campaign-status-badge';
import { CampaignTargets } from './campaign-targets';
import { CatalogueUpload } from './catalogue-upload';
import { LightCurveUpload } from './light-curve-upload';
import { RecentUploads } from './recent-uploads';

export function CampaignPage({ campaignId }: { campaignId: number }) {
  const campaign = useCampaign(campaignId);

  if (campaign.isPending) return <Loading label="Loading the campaign…" />;
  if (campaign.isError) {
    const missing = isApiError(campaign.error) && campaign.error.status === 404;
    return missing ? (
      <CampaignNotFound campaignId={campaignId} />
    ) : (
      <LoadFailure
        title="Could not load the campaign"
        error={campaign.error}
        onRetry={() => campaign.refetch()}
      />
    );
  }
  return <CampaignView campaign={campaign.data} />;
}

function CampaignView({ campaign }: { campaign: Campaign }) {
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const closed = campaign.status === 'closed';

  return (
    <div className="flex flex-col gap-10">
      <div className="flex flex-col gap-4">
        <BackLink />
        <PageHeader
          eyebrow={`Campaign · #${campaign.id}`}
          title={campaign.name}
          description={
            <div className="flex flex-col gap-2">
              <p className="flex flex-wrap items-center gap-2">
                <CampaignStatusBadge status={campaign.status} />
                <span className="text-sm">
                  {campaign.statusChangedAt
                    ? `since ${formatDateTime(campaign.statusChangedAt)}`
                    : `created ${formatDateTime(campaign.createdAt)}`}
                </span>
              </p>
              {campaign.description ? <p>{campaign.description}</p> : null}
            </div>
          }
          actions={<CampaignStatusActions campaign={campaign} onOutcome={setOutcome} />}
        />
        <div aria-live="polite" className="empty:hidden">
          {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
        </div>
      </div>

      <CampaignCounts campaign={campaign} />

      <Section
        id="completeness"
        title="Completeness"
        description="How many planted dips volunteers recover, by SNR, depth and duration, and how often they call a quiet control a dip. A control counts once its snippet is settled or ruled."
      >
        <LocalBoundary what="The completeness figures">
          <CampaignCompleteness campaignId={campaign.id} />
        </LocalBoundary>
      </Section>

      <div className="grid grid-cols-1 gap-10 lg:grid-cols-2 lg:gap-8">
        <Section
          id="catalogue"
          title="Target catalogue"
          description="The stars this campaign searches. Light curves are matched to them by designation."
        >
          <LocalBoundary what="The catalogue upload">
            <CatalogueUpload campaignId={campaign.id} disabled={closed} />
          </LocalBoundary>
        </Section>
        <Section
          id="light-curves"
          title="Light curves"
          description="Each file is read, cleaned, detrended and cut into snippets, with planted and quiet controls mixed in."
        >
          <LocalBoundary what="The light-curve upload">
            <LightCurveUpload campaignId={campaign.id} disabled={closed} />
          </LocalBoundary>
        </Section>
      </div>

      <Section
        id="recent-uploads"
        title="Recent uploads"
        description="What the worker made of each file, newest first."
      >
        <LocalBoundary what="The recent uploads">
          <RecentUploads campaignId={campaign.id} />
        </LocalBoundary>
      </Section>

      <Section
        id="targets"
        title="Targets"
        description="Open a target to see its whole light curve with the snippets cut from it."
      >
        <LocalBoundary what="The target list">
          <CampaignTargets campaignId={campaign.id} />
        </LocalBoundary>
      </Section>

      <Section
        id="settings"
        title="Settings"
        description="How light curves become snippets, how many controls are mixed in, and when a snippet is settled."
      >
        <LocalBoundary what="The settings form">
          <CampaignSettingsForm campaign={campaign} />
        </LocalBoundary>
      </Section>
    </div>
  );
}

function BackLink() {
  return (
    <Link
      to={paths.lab.getHref()}
      className="inline-flex min-h-target items-center gap-1.5 self-start rounded-md pr-3 text-sm font-medium text-muted hover:text-ink"
    >
      <span aria-hidden="true">←</span> All campaigns
    </Link>
  );
}

function CampaignCounts({ campaign }: { campaign: Campaign }) {
  const counts = campaign.counts;
  if (!counts) return null;
  const total = snippetTotal(counts);
  const items = [
    { label: 'Targets', value: counts.targets, note: 'in the catalogue' },
    { label: 'Light curves', value: counts.lightCurves, note: 'read and cut' },
    { label: 'Open snippets', value: counts.snippets.open, note: 'collecting verdicts' },
    {
      label: 'Settled',
      value: counts.snippets.settled,
      note: `${formatCount(counts.snippets.ruled)} ruled on the Desk`,
    },
    { label: 'Split', value: counts.snippets.split, note: 'waiting for a moderator' },
    {
      label: 'Controls',
      value: counts.controls.planted + counts.controls.quiet,
      note: `${formatCount(counts.controls.planted)} planted · ${formatCount(counts.controls.quiet)} quiet`,
    },
  ];
  return (
    <section aria-labelledby="campaign-counts-heading" className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="campaign-counts-heading" className="text-xl font-semibold text-ink">
          In numbers
        </h2>
        <div className="flex flex-wrap gap-3">
          <ButtonLink variant="secondary" to={paths.labSnippets.getHref(campaign.id)}>
            Browse {formatCount(total)} snippets
          </ButtonLink>
          <ButtonLink variant="secondary" to={paths.labCandidateReview.getHref(campaign.id)}>
            Candidate review
          </ButtonLink>
          <ButtonLink variant="secondary" to={paths.labFollowUp.getHref(campaign.id)}>
            Follow-up list
          </ButtonLink>
        </div>
      </div>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        {items.map((item) => (
          <div key={item.label} className="flex flex-col gap-1 rounded-lg border border-line bg-surface p-4">
            <dt className="text-sm font-medium text-ink">{item.label}</dt>
            <dd className={`tabular order-first text-2xl ${item.value === 0 ? 'text-muted' : 'text-ink'}`}>
              {formatCount(item.value)}
            </dd>
            <dd className="text-xs text-muted">{item.note}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

function Section({
  id,
  title,
  description,
  children,
}: {
  id: string;
  title: string;
  description: string;
  children: ReactNode;
}) {
  return (
    <section aria-labelledby={`${id}-heading`} className="flex min-w-0 flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id={`${id}-heading`} className="text-xl font-semibold text-ink">
          {title}
        </h2>
        <p className="max-w-2xl text-base text-muted">{description}</p>
      </div>
      {children}
    </section>
  );
}

function LocalBoundary({ what, children }: { what: string; children: ReactNode }) {
  return (
    <ErrorBoundary
      fallback={(_error, reset) => (
        <Alert tone="danger" title={`${what} could not be shown`}>
          <Button variant="secondary" className="mt-2" onClick={reset}>
            Try again
          </Button>
        </Alert>
      )}
    >
      {children}
    </ErrorBoundary>
  );
}
