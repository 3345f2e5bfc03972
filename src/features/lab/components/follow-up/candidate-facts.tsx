import type { Candidate } from '../../api/get-candidates';
import { formatEpochTime, formatFixed, formatPeriod, formatPpm } from '../../lib/candidates';

/** A candidate's ephemeris and signal: period and T0 with their one-σ errors, depth, duration, SNR. */
export function CandidateFacts({ candidate }: { candidate: Candidate }) {
  const facts = [
    { label: 'Period', value: formatPeriod(candidate.periodDays, candidate.periodSigmaDays) },
    { label: 'Mid-transit T0', value: formatEpochTime(candidate.t0Bjd, candidate.t0SigmaDays) },
    { label: 'Depth', value: formatPpm(candidate.depthPpm) },
    { label: 'Duration', value: formatFixed(candidate.durationHours, 2, 'h') },
    { label: 'SNR', value: formatFixed(candidate.snr, 1) },
    { label: 'Priority', value: formatFixed(candidate.priority, 2) },
  ];
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
      {facts.map((fact) => (
        <div key={fact.label} className="flex min-w-0 flex-col">
          <dt className="text-xs font-semibold uppercase tracking-[0.08em] text-muted">{fact.label}</dt>
          <dd className="tabular break-words text-ink">{fact.value}</dd>
        </div>
      ))}
    </dl>
  );
}
