import { formatCount } from '../../lib/format';
import {
  handledCount,
  type NewsletterStatus,
  type NewsletterProgress as Progress,
  progressFraction,
} from '../../lib/newsletters';

export const unknownExplanation =
  'The sender stopped between sending and confirming, so we do not know whether these arrived. They are never sent again automatically.';

interface NewsletterProgressProps {
  progress: Progress;
  status: NewsletterStatus;
  /** The list's short form: the bar and the counts, without the explanations beside each. */
  compact?: boolean;
}

const segments = [
  { key: 'sent', className: 'bg-success' },
  { key: 'failed', className: 'bg-danger' },
  { key: 'skippedUnsubscribed', className: 'bg-slate' },
  { key: 'unknown', className: 'bg-amber' },
  { key: 'sending', className: 'bg-amber-wash' },
] as const;

/** How far sending has got: a bar of readers handled out of the audience, and each count in words. */
export function NewsletterProgress({ progress, status, compact = false }: NewsletterProgressProps) {
  const fraction = progressFraction(progress);
  if (progress.recipients === null || fraction === null) {
    return (
      <p className="text-sm text-muted">
        {status === 'scheduled'
          ? 'The audience is counted when sending starts.'
          : status === 'draft'
            ? 'Not sent yet.'
            : 'No readers recorded.'}
      </p>
    );
  }

  const recipients = progress.recipients;
  const handled = handledCount(progress);
  const summary =
    recipients === 0
      ? 'Nobody in the audience'
      : `${formatCount(handled)} of ${formatCount(recipients)} handled`;
  const counts = [
    { label: 'Queued', value: progress.queued, hint: 'Waiting their turn in the mail queue.' },
    ...(progress.sending > 0
      ? [{ label: 'Being sent', value: progress.sending, hint: 'Handed to the sender just now.' }]
      : []),
    { label: 'Sent', value: progress.sent, hint: 'Accepted by the mail server.' },
    { label: 'Failed', value: progress.failed, hint: 'Refused after every retry.' },
    {
      label: 'Skipped as unsubscribed',
      value: progress.skippedUnsubscribed,
      hint: 'Unsubscribed or opted out after the audience was counted.',
    },
    { label: 'Unknown', value: progress.unknown, hint: unknownExplanation },
  ];

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-1.5">
        <div className="flex items-baseline justify-between gap-3 text-sm">
          <span className="font-medium text-ink">{summary}</span>
          <span className="tabular text-muted">{Math.round(fraction * 100)} %</span>
        </div>
        <div
          role="progressbar"
          aria-label="Readers handled"
          aria-valuemin={0}
          aria-valuemax={recipients}
          aria-valuenow={recipients === 0 ? 0 : handled}
          aria-valuetext={summary}
          className="flex h-3 w-full overflow-hidden rounded-full border border-line bg-paper"
        >
          {recipients > 0
            ? segments.map(({ key, className }) =>
                progress[key] > 0 ? (
                  <span
                    key={key}
                    className={`h-full ${className}`}
                    style={{ width: `${(progress[key] / recipients) * 100}%` }}
                  />
                ) : null,
              )
            : null}
        </div>
      </div>
      <dl
        className={
          compact
            ? 'flex flex-wrap gap-x-4 gap-y-1 text-sm'
            : 'grid gap-x-6 gap-y-3 sm:grid-cols-2 lg:grid-cols-3'
        }
      >
        {counts.map((count) => (
          <div key={count.label} className={compact ? 'flex gap-1.5' : 'flex flex-col gap-0.5'}>
            <dt className={compact ? 'text-muted' : 'text-sm font-medium text-muted'}>{count.label}</dt>
            <dd className={compact ? 'tabular text-ink' : 'flex flex-col gap-0.5'}>
              <span className={compact ? '' : 'tabular text-lg font-semibold text-ink'}>
                {formatCount(count.value)}
              </span>
              {compact ? null : <span className="text-sm text-muted">{count.hint}</span>}
            </dd>
          </div>
        ))}
      </dl>
      {compact && progress.unknown > 0 ? (
        <p className="text-sm text-muted">
          <span className="font-medium text-ink">Unknown:</span> {unknownExplanation}
        </p>
      ) : null}
    </div>
  );
}
