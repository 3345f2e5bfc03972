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
import { useCampaigns } from '../../api/get-campaigns';
import { useNewsletters } from '../../api/get-newsletters';
import { formatDateTime } from '../../lib/format';
import { audienceText, type Newsletter } from '../../lib/newsletters';
import { NewsletterProgress } from './newsletter-progress';
import { NewsletterStatusBadge } from './newsletter-status-badge';

export function NewslettersPage() {
  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab"
        title="Newsletters"
        description="E-mails to volunteers who opted in: news of a campaign, thanks for their verdicts, what their dips led to."
        actions={<ButtonLink to={paths.labNewNewsletter.getHref()}>Write a newsletter</ButtonLink>}
      />
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The newsletters could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        <NewsletterList />
      </ErrorBoundary>
    </div>
  );
}

/** When it went or will go: the moment that matters for its status. */
export function whenText(newsletter: Newsletter): string {
  switch (newsletter.status) {
    case 'sent':
      return `Sent ${formatDateTime(newsletter.sentAt)}`;
    case 'scheduled':
      return `Scheduled for ${formatDateTime(newsletter.scheduledFor)}`;
    case 'sending':
      return 'Sending now';
    case 'cancelled':
      return `Cancelled ${formatDateTime(newsletter.updatedAt)}`;
    case 'draft':
      return `Written ${formatDateTime(newsletter.createdAt)}`;
  }
}

function NewsletterList() {
  const newsletters = useNewsletters();
  const campaigns = useCampaigns();
  const campaignName = (id: number) => campaigns.data?.find((c) => c.id === id)?.name;

  if (newsletters.isPending) return <Loading label="Loading newsletters…" />;
  if (newsletters.isError) {
    return (
      <LoadFailure
        title="Could not load the newsletters"
        error={newsletters.error}
        onRetry={() => newsletters.refetch()}
      />
    );
  }
  if (newsletters.data.length === 0) {
    return (
      <EmptyState
        title="No newsletters yet"
        upcoming={[
          'Each newsletter with its status: draft, scheduled, sending or sent',
          'Who it goes to, and when it went',
          'How many readers it reached, failed to reach or skipped',
        ]}
        action={<ButtonLink to={paths.labNewNewsletter.getHref()}>Write a newsletter</ButtonLink>}
      >
        <p>
          Write one, send yourself a test copy, then send it now or at a time you choose. Only volunteers who
          opted in get it.
        </p>
      </EmptyState>
    );
  }

  return (
    <Table caption="Newsletters, newest first">
      <TableHead>
        <Th>Headline</Th>
        <Th>Status</Th>
        <Th>Audience</Th>
        <Th>When</Th>
        <Th>Progress</Th>
      </TableHead>
      <TableBody>
        {newsletters.data.map((newsletter) => (
          <Tr key={newsletter.id} align="top">
            <Td label="Headline" className="before:hidden">
              <Link
                to={paths.labNewsletter.getHref(newsletter.id)}
                className="flex min-h-target items-center rounded-sm font-semibold text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber md:min-h-0"
              >
                {newsletter.headline}
              </Link>
            </Td>
            <Td label="Status">
              <NewsletterStatusBadge status={newsletter.status} />
            </Td>
            <Td label="Audience">
              <span className="text-sm text-slate">{audienceText(newsletter.audience, campaignName)}</span>
            </Td>
            <Td label="When">
              <span className="tabular text-sm text-slate">{whenText(newsletter)}</span>
            </Td>
            <Td label="Progress" card="block" className="md:min-w-72">
              <NewsletterProgress progress={newsletter.progress} status={newsletter.status} compact />
            </Td>
          </Tr>
        ))}
      </TableBody>
    </Table>
  );
}
