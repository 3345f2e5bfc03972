import { useId, useMemo, useState } from 'react';
import { Alert } from '@/components/alert';
import { Badge } from '@/components/badge';
import { Button, ButtonLink } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { EmptyState } from '@/components/empty-state';
import { ErrorBoundary } from '@/components/error-boundary';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { type DipTarget, useDipTargets } from '../api/get-dip-targets';
import {
  type DipTargetOrder,
  dipTargetOrderLabels,
  formatFixed,
  formatPpm,
  formatSigmaMinutes,
  orderDipTargets,
} from '../lib/candidates';
import { formatCount, plural } from '../lib/format';
import { formatScore } from '../lib/snippets';
import { CampaignNotFound } from './campaign-not-found';
import { BackLink } from './follow-up/back-link';

/** A campaign's settled dips grouped by target, strongest first: where scientists choose candidates. */
export function CandidateReviewPage({ campaignId }: { campaignId: number }) {
  const targets = useDipTargets(campaignId);

  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-col gap-4">
        <BackLink to={paths.labCampaign.getHref(campaignId)}>The campaign</BackLink>
        <PageHeader
          eyebrow={`Campaign · #${campaignId}`}
          title="Candidate review"
          description={
            <p>
              Every target with settled dips, ranked by its best SNR, then its number of dips, then the mean
              consensus score. Open a target to run the period search, vet it and promote it to the follow-up
              list. A promoted target is a candidate, not a confirmed planet.
            </p>
          }
          actions={
            <ButtonLink variant="secondary" to={paths.labFollowUp.getHref(campaignId)}>
              The follow-up list
            </ButtonLink>
          }
        />
      </div>
      <ErrorBoundary
        fallback={(_error, reset) => (
          <Alert tone="danger" title="The review list could not be shown">
            <Button variant="secondary" className="mt-2" onClick={reset}>
              Try again
            </Button>
          </Alert>
        )}
      >
        {targets.isPending ? (
          <Loading label="Loading the settled dips…" />
        ) : targets.isError ? (
          isApiError(targets.error) && targets.error.status === 404 ? (
            <CampaignNotFound campaignId={campaignId} />
          ) : (
            <LoadFailure
              title="Could not load the settled dips"
              error={targets.error}
              onRetry={() => targets.refetch()}
            />
          )
        ) : targets.data.length === 0 ? (
          <EmptyState
            title="No settled dips yet"
            sketch="dip"
            upcoming={[
              'Each target with settled dips, strongest first',
              'Its dips with time, depth, duration, SNR and consensus score',
              'A link to the target’s review, where it is promoted to the follow-up list',
            ]}
            action={
              <ButtonLink variant="secondary" to={paths.labSnippets.getHref(campaignId)}>
                Browse the snippets
              </ButtonLink>
            }
          >
            <p>
              A dip appears here once volunteers’ verdicts settle a snippet as holding one, or a moderator
              rules that it does.
            </p>
          </EmptyState>
        ) : (
          <ReviewList targets={targets.data} />
        )}
      </ErrorBoundary>
    </div>
  );
}

function ReviewList({ targets }: { targets: DipTarget[] }) {
  const [order, setOrder] = useState<DipTargetOrder>('snr');
  const [notPromotedOnly, setNotPromotedOnly] = useState(false);
  const orderId = useId();
  const shown = useMemo(
    () => orderDipTargets(targets, order).filter((target) => !notPromotedOnly || !target.onCandidate),
    [targets, order, notPromotedOnly],
  );
  const promoted = targets.filter((target) => target.onCandidate).length;

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-col gap-3 md:flex-row md:items-end md:justify-between">
        <p className="text-base text-muted">
          {plural(targets.length, 'target')} with settled dips; {formatCount(promoted)} already on the
          follow-up list.
        </p>
        <div className="flex flex-col gap-3 sm:flex-row sm:items-end">
          <div className="flex flex-col gap-1.5">
            <label htmlFor={orderId} className="text-sm font-medium text-ink">
              Order by
            </label>
            <Select
              id={orderId}
              value={order}
              onChange={(event) => setOrder(event.target.value as DipTargetOrder)}
            >
              {(Object.keys(dipTargetOrderLabels) as DipTargetOrder[]).map((key) => (
                <option key={key} value={key}>
                  {dipTargetOrderLabels[key]}
                </option>
              ))}
            </Select>
          </div>
          <CheckboxField
            label="Not yet promoted only"
            checked={notPromotedOnly}
            onChange={(event) => setNotPromotedOnly(event.target.checked)}
          />
        </div>
      </div>
      {shown.length === 0 ? (
        <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
          Every target with settled dips is already on the follow-up list.
        </p>
      ) : (
        <ol aria-label="Targets with settled dips" className="flex flex-col gap-4">
          {shown.map((target, index) => (
            <TargetCard key={target.targetId} target={target} rank={index + 1} />
          ))}
        </ol>
      )}
    </div>
  );
}

function TargetCard({ target, rank }: { target: DipTarget; rank: number }) {
  const headingId = useId();
  const stats = [
    { label: 'Dips', value: formatCount(target.dipCount) },
    { label: 'Best SNR', value: formatFixed(target.bestSnr, 1) },
    { label: 'Mean consensus score', value: formatScore(target.meanScore) },
  ];
  return (
    <li
      aria-labelledby={headingId}
      className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-5"
    >
      <div className="flex flex-col gap-3 md:flex-row md:items-start md:justify-between">
        <div className="flex items-start gap-3">
          <span
            aria-hidden="true"
            className="tabular flex size-10 shrink-0 items-center justify-center rounded-md bg-paper text-base font-semibold text-ink"
          >
            {rank}
          </span>
          <div className="flex flex-col gap-1">
            <h2 id={headingId} className="flex flex-wrap items-center gap-2 text-lg font-semibold text-ink">
              <span className="sr-only">Rank {rank}: </span>
              {target.designation}
              {target.onCandidate ? <Badge tone="amber">On the follow-up list</Badge> : null}
            </h2>
            <dl className="flex flex-wrap gap-x-5 gap-y-1 text-sm">
              {stats.map((stat) => (
                <div key={stat.label} className="flex gap-1.5">
                  <dt className="text-muted">{stat.label}</dt>
                  <dd className="tabular font-medium text-ink">{stat.value}</dd>
                </div>
              ))}
            </dl>
          </div>
        </div>
        <ButtonLink
          variant={target.onCandidate ? 'secondary' : 'primary'}
          to={paths.labTarget.getHref(target.targetId)}
          aria-label={`Review ${target.designation}`}
          className="shrink-0"
        >
          Review target
        </ButtonLink>
      </div>
      <DipList target={target} />
    </li>
  );
}

function DipList({ target }: { target: DipTarget }) {
  return (
    <>
      <ul
        aria-label={`Settled dips of ${target.designation}`}
        className="flex flex-col divide-y divide-line rounded-md border border-line md:hidden"
      >
        {target.dips.map((dip) => (
          <li key={dip.id} className="tabular flex flex-col gap-0.5 px-3 py-2 text-sm text-ink">
            <span>
              <span className="text-muted">t </span>
              {dip.timeCenter.toFixed(4)} d
              {dip.timeSigma !== null ? (
                <span className="text-slate"> {formatSigmaMinutes(dip.timeSigma)}</span>
              ) : null}
            </span>
            <span className="text-slate">
              {formatPpm(dip.depthPpm)} · {formatFixed(dip.durationHours, 1, 'h')} · SNR{' '}
              {formatFixed(dip.snr, 1)} · score {formatScore(dip.consensusScore)}
            </span>
          </li>
        ))}
      </ul>
      <DipTable target={target} />
    </>
  );
}

function DipTable({ target }: { target: DipTarget }) {
  return (
    <div className="hidden overflow-x-auto rounded-md border border-line md:block">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Settled dips of {target.designation}</caption>
        <thead className="bg-paper text-xs font-semibold uppercase tracking-[0.08em] text-muted">
          <tr>
            <th scope="col" className="px-3 py-2">
              Time (d)
            </th>
            <th scope="col" className="px-3 py-2">
              Depth
            </th>
            <th scope="col" className="px-3 py-2">
              Duration
            </th>
            <th scope="col" className="px-3 py-2">
              SNR
            </th>
            <th scope="col" className="px-3 py-2">
              Consensus
            </th>
          </tr>
        </thead>
        <tbody className="tabular text-ink">
          {target.dips.map((dip) => (
            <tr key={dip.id} className="border-t border-line">
              <td className="px-3 py-2 whitespace-nowrap">
                {dip.timeCenter.toFixed(4)}
                {dip.timeSigma !== null ? (
                  <span className="text-slate"> {formatSigmaMinutes(dip.timeSigma)}</span>
                ) : null}
              </td>
              <td className="px-3 py-2 whitespace-nowrap">{formatPpm(dip.depthPpm)}</td>
              <td className="px-3 py-2 whitespace-nowrap">{formatFixed(dip.durationHours, 1, 'h')}</td>
              <td className="px-3 py-2 whitespace-nowrap">{formatFixed(dip.snr, 1)}</td>
              <td className="px-3 py-2 whitespace-nowrap">{formatScore(dip.consensusScore)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
