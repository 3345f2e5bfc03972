import { Outlet, useParams } from 'react-router-dom';
import { RequireArea } from '@/app/require-area';
import { NotFoundRoute } from '@/app/routes/not-found';
import { ApiReferencePage } from '@/features/lab/components/api-reference-page';
import { CampaignPage } from '@/features/lab/components/campaign-page';
import { CampaignsPage } from '@/features/lab/components/campaigns-page';
import { CandidatePage } from '@/features/lab/components/candidate-page';
import { CandidateReviewPage } from '@/features/lab/components/candidate-review-page';
import { FollowUpPage } from '@/features/lab/components/follow-up-page';
import { LabNav } from '@/features/lab/components/lab-nav';
import { NewCampaignPage } from '@/features/lab/components/new-campaign-page';
import { NewNewsletterPage } from '@/features/lab/components/newsletters/new-newsletter-page';
import { NewsletterPage } from '@/features/lab/components/newsletters/newsletter-page';
import { NewslettersPage } from '@/features/lab/components/newsletters/newsletters-page';
import { ObservatoriesPage } from '@/features/lab/components/observatories-page';
import { SnippetBrowserPage } from '@/features/lab/components/snippet-browser-page';
import { TargetPage } from '@/features/lab/components/target-page';
import { TokensPage } from '@/features/lab/components/tokens-page';

// Loaded lazily (see router.tsx): volunteers on the Deck never download the Lab.

/** Guards every Lab section once and keeps the section links in place while moving between them. */
export function LabRoute() {
  return (
    <RequireArea area="lab">
      {() => (
        <div className="flex flex-col gap-6">
          <LabNav />
          <Outlet />
        </div>
      )}
    </RequireArea>
  );
}

/** A route id from the address, or null when it is not a positive whole number. */
function useIdParam(name: string): number | null {
  const value = useParams()[name];
  const id = Number(value);
  return value && /^\d+$/.test(value) && id > 0 ? id : null;
}

export function LabCampaignsRoute() {
  return <CampaignsPage />;
}

export function LabNewCampaignRoute() {
  return <NewCampaignPage />;
}

export function LabCampaignRoute() {
  const campaignId = useIdParam('campaignId');
  // The key starts each campaign with a fresh page: no upload list or half-typed settings carry over.
  return campaignId === null ? <NotFoundRoute /> : <CampaignPage key={campaignId} campaignId={campaignId} />;
}

export function LabSnippetsRoute() {
  const campaignId = useIdParam('campaignId');
  return campaignId === null ? (
    <NotFoundRoute />
  ) : (
    <SnippetBrowserPage key={campaignId} campaignId={campaignId} />
  );
}

export function LabTargetRoute() {
  const targetId = useIdParam('targetId');
  return targetId === null ? <NotFoundRoute /> : <TargetPage key={targetId} targetId={targetId} />;
}

export function LabCandidateReviewRoute() {
  const campaignId = useIdParam('campaignId');
  return campaignId === null ? (
    <NotFoundRoute />
  ) : (
    <CandidateReviewPage key={campaignId} campaignId={campaignId} />
  );
}

export function LabFollowUpRoute() {
  const campaignId = useIdParam('campaignId');
  return campaignId === null ? <NotFoundRoute /> : <FollowUpPage key={campaignId} campaignId={campaignId} />;
}

export function LabCandidateRoute() {
  const candidateId = useIdParam('candidateId');
  return candidateId === null ? (
    <NotFoundRoute />
  ) : (
    <CandidatePage key={candidateId} candidateId={candidateId} />
  );
}

export function LabObservatoriesRoute() {
  return <ObservatoriesPage />;
}

export function LabTokensRoute() {
  return <TokensPage />;
}

export function LabApiReferenceRoute() {
  return <ApiReferencePage />;
}

export function LabNewslettersRoute() {
  return <NewslettersPage />;
}

export function LabNewNewsletterRoute() {
  return <NewNewsletterPage />;
}

export function LabNewsletterRoute() {
  const newsletterId = useIdParam('newsletterId');
  return newsletterId === null ? (
    <NotFoundRoute />
  ) : (
    <NewsletterPage key={newsletterId} newsletterId={newsletterId} />
  );
}
