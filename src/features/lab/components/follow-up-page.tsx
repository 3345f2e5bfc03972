import { useMemo } from 'react';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { type CampaignCandidates, useCandidates } from '../api/get-candidates';
import { orderByPriority } from '../lib/candidates';
import { plural } from '../lib/format';
import { CampaignNotFound } from './campaign-not-found';
import { BackLink } from './follow-up/back-link';
import { CandidateCard } from './follow-up/candidate-card';
import { CandidateCaution } from './follow-up/candidate-caution';
import { ExportLinks } from './follow-up/export-links';

/** The campaign's candidates for observers, highest priority first, with the exports. */
export function FollowUpPage({ campaignId }: { campaignId: number }) {
  const candidates = useCandidates(campaignId);

  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-col gap-4">
        <BackLink to={paths.labCampaign.getHref(campaignId)}>The campaign</BackLink>
        <PageHeader
          eyebrow={`Campaign · #${campaignId}`}
          title="Follow-up list"
          description={
            <p>
              The targets promoted for observation, highest priority first, with their ephemerides. Open a
              candidate for its next transit windows and which observatories can watch them.
            </p>
          }
          actions={
            <ButtonLink variant="secondary" to={paths.labCandidateReview.getHref(campaignId)}>
              Candidate review
            </ButtonLink>
          }
        />
      </div>
      {candidates.isPending ? (
        <Loading label="Loading the follow-up list…" />
      ) : candidates.isError ? (
        isApiError(candidates.error) && candidates.error.status === 404 ? (
          <CampaignNotFound campaignId={campaignId} />
        ) : (
          <LoadFailure
            title="Could not load the follow-up list"
            error={candidates.error}
            onRetry={() => candidates.refetch()}
          />
        )
      ) : (
        <FollowUpView campaignId={campaignId} answer={candidates.data} />
      )}
    </div>
  );
}

function FollowUpView({ campaignId, answer }: { campaignId: number; answer: CampaignCandidates }) {
  const ordered = useMemo(() => orderByPriority(answer.candidates), [answer.candidates]);
  return (
    <>
      <CandidateCaution cautions={[answer.caution]} />
      <section aria-labelledby="candidates-heading" className="flex flex-col gap-4">
        <div className="flex flex-col gap-1">
          <h2 id="candidates-heading" className="text-xl font-semibold text-ink">
            Candidates
          </h2>
          <p className="text-base text-muted">
            {ordered.length === 0
              ? 'None yet.'
              : `${plural(ordered.length, 'candidate')}, highest priority first. Times are BJD_TDB; errors are one σ.`}
          </p>
        </div>
        <ErrorBoundary
          fallback={(_error, reset) => (
            <Alert tone="danger" title="The candidates could not be shown">
              <Button variant="secondary" className="mt-2" onClick={reset}>
                Try again
              </Button>
            </Alert>
          )}
        >
          {ordered.length === 0 ? (
            <EmptyState
              title="No candidates yet"
              sketch="dip"
              upcoming={[
                'Each promoted target with its period and mid-transit time, and their errors',
                'Its state (promoted, scheduled, observed, resolved) and disposition',
                'The volunteers who found its dips',
              ]}
              action={
                <ButtonLink to={paths.labCandidateReview.getHref(campaignId)}>Review settled dips</ButtonLink>
              }
            >
              <p>
                A target joins the follow-up list when a scientist promotes it from its review page, after
                looking at its dips and period search.
              </p>
            </EmptyState>
          ) : (
            <ol aria-label="Candidates by priority" className="flex flex-col gap-4">
              {ordered.map((candidate, index) => (
                <CandidateCard key={candidate.id} candidate={candidate} rank={index + 1} />
              ))}
            </ol>
          )}
        </ErrorBoundary>
      </section>
      <ExportLinks campaignId={campaignId} />
    </>
  );
}
