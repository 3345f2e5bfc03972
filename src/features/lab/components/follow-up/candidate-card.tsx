import { useId } from 'react';
import { Link } from 'react-router-dom';
import { Badge } from '@/components/badge';
import { paths } from '@/config/paths';
import type { Candidate } from '../../api/get-candidates';
import {
  candidateStateLabels,
  candidateStateTones,
  creditLine,
  dispositionLabel,
  dispositionTones,
} from '../../lib/candidates';
import { plural } from '../../lib/format';
import { CandidateEditor } from './candidate-editor';
import { CandidateFacts } from './candidate-facts';

/** One candidate on the follow-up list: its ephemeris, who found it, and its state to change. */
export function CandidateCard({ candidate, rank }: { candidate: Candidate; rank: number }) {
  const headingId = useId();
  return (
    <li
      aria-labelledby={headingId}
      className="grid grid-cols-1 gap-5 rounded-lg border border-line bg-surface p-4 md:p-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]"
    >
      <div className="flex min-w-0 flex-col gap-3">
        <div className="flex items-start gap-3">
          <span
            aria-hidden="true"
            className="tabular flex size-10 shrink-0 items-center justify-center rounded-md bg-paper text-base font-semibold text-ink"
          >
            {rank}
          </span>
          <div className="flex min-w-0 flex-col gap-1.5">
            <h2 id={headingId} className="text-lg font-semibold text-ink">
              <Link
                to={paths.labCandidate.getHref(candidate.id)}
                className="inline-flex min-h-target items-center underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
              >
                <span className="sr-only">Priority rank {rank}: </span>
                {candidate.designation}
              </Link>
            </h2>
            <p className="flex flex-wrap items-center gap-2">
              <Badge tone={candidateStateTones[candidate.state]}>
                {candidateStateLabels[candidate.state]}
              </Badge>
              <Badge tone={dispositionTones[candidate.disposition]}>
                {dispositionLabel(candidate.disposition)}
              </Badge>
              <span className="text-sm text-muted">{plural(candidate.dipIds.length, 'dip')}</span>
            </p>
          </div>
        </div>
        <CandidateFacts candidate={candidate} />
        {candidate.periodDays === null ? (
          <p className="text-sm text-muted">
            A single transit so far: no period, so no transit windows can be predicted yet.
          </p>
        ) : null}
        <p className="text-sm text-ink">{creditLine(candidate.credits)}</p>
        <Link
          to={paths.labCandidate.getHref(candidate.id)}
          className="inline-flex min-h-target items-center gap-1.5 self-start text-sm font-medium text-ink underline decoration-line decoration-2 underline-offset-4 hover:decoration-amber"
        >
          Transit windows of {candidate.designation} <span aria-hidden="true">→</span>
        </Link>
      </div>
      <div className="border-t border-line pt-4 lg:border-t-0 lg:border-l lg:pt-0 lg:pl-5">
        <CandidateEditor candidate={candidate} />
      </div>
    </li>
  );
}
