import { type FormEvent, type ReactNode, useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { FieldError, inputClasses } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCampaigns } from '../../api/get-campaigns';
import { useNewsletter } from '../../api/get-newsletter';
import { useNewsletterPreview } from '../../api/preview-newsletter';
import { type SendNewsletterResult, useSendNewsletter } from '../../api/send-newsletter';
import { useSendTestNewsletter } from '../../api/send-test-newsletter';
import { formatDateTime, plural } from '../../lib/format';
import {
  audienceText,
  browserTimeZone,
  localDateTimeToIso,
  type Newsletter,
  toLocalDateTimeValue,
} from '../../lib/newsletters';
import { UnsubscribeReminder } from './newsletter-notes';
import { NewsletterPreviewPanel, UnknownPlaceholdersWarning } from './newsletter-preview';
import { NewsletterProgress } from './newsletter-progress';
import { NewsletterStatusBadge } from './newsletter-status-badge';

const backLink = (
  <Link
    to={paths.labNewsletters.getHref()}
    className="inline-flex min-h-target w-fit items-center gap-1 text-base font-medium text-ink underline underline-offset-4"
  >
    <span aria-hidden="true">←</span> All newsletters
  </Link>
);

export function NewsletterPage({ newsletterId }: { newsletterId: number }) {
  const newsletter = useNewsletter(newsletterId);

  if (newsletter.isPending) return <Loading label="Opening the newsletter…" />;
  if (newsletter.isError) {
    const missing = isApiError(newsletter.error) && newsletter.error.status === 404;
    return (
      <div className="flex flex-col gap-4">
        {backLink}
        {missing ? (
          <Alert tone="danger" title="No such newsletter">
            <p>There is no newsletter with this number.</p>
            <ButtonLink variant="secondary" className="mt-2" to={paths.labNewsletters.getHref()}>
              Open the newsletters
            </ButtonLink>
          </Alert>
        ) : (
          <LoadFailure
            title="Could not open the newsletter"
            error={newsletter.error}
            onRetry={() => newsletter.refetch()}
          />
        )}
      </div>
    );
  }
  return <NewsletterView newsletter={newsletter.data} />;
}

function NewsletterView({ newsletter }: { newsletter: Newsletter }) {
  const campaigns = useCampaigns();
  const campaignName = (id: number) => campaigns.data?.find((c) => c.id === id)?.name;
  const [sent, setSent] = useState<SendNewsletterResult | null>(null);

  return (
    <div className="flex flex-col gap-8">
      {backLink}
      <PageHeader
        eyebrow="Lab · newsletters"
        title={newsletter.headline}
        description={
          <span className="flex flex-wrap items-center gap-2">
            <NewsletterStatusBadge status={newsletter.status} />
            <span>{audienceText(newsletter.audience, campaignName)}</span>
          </span>
        }
      />

      <dl className="grid gap-x-6 gap-y-3 rounded-lg border border-line bg-surface p-5 sm:grid-cols-2 lg:grid-cols-4">
        <Meta term="Written">
          <Instant iso={newsletter.createdAt} />
        </Meta>
        {newsletter.scheduledFor ? (
          <Meta term="Scheduled for">
            <Instant iso={newsletter.scheduledFor} />
          </Meta>
        ) : null}
        {newsletter.sentAt ? (
          <Meta term="Sent">
            <Instant iso={newsletter.sentAt} />
          </Meta>
        ) : null}
        <Meta term="Remote images">{newsletter.allowRemoteImages ? 'Allowed (https only)' : 'Left out'}</Meta>
      </dl>

      {newsletter.lastError ? (
        <Alert tone="danger" title="The sender met a problem">
          <p className="break-words">{newsletter.lastError}</p>
        </Alert>
      ) : null}
      <UnknownPlaceholdersWarning placeholders={newsletter.unknownPlaceholders} />

      {newsletter.status !== 'draft' ? (
        <section aria-labelledby="progress-heading" className="flex flex-col gap-3">
          <h2 id="progress-heading" className="text-lg font-semibold text-ink">
            Progress
          </h2>
          <div className="rounded-lg border border-line bg-surface p-5">
            <NewsletterProgress progress={newsletter.progress} status={newsletter.status} />
          </div>
        </section>
      ) : null}

      <section aria-labelledby="send-heading" className="flex flex-col gap-4">
        <h2 id="send-heading" className="text-lg font-semibold text-ink">
          Send
        </h2>
        {sent ? <SentNotice result={sent} /> : null}
        {newsletter.status === 'scheduled' ? (
          <p className="text-base text-muted">
            It goes out by itself at the time above; the audience is counted then. A scheduled newsletter
            cannot be called back or moved from here.
          </p>
        ) : null}
        <div className="grid gap-4 lg:grid-cols-3">
          <TestCopy newsletterId={newsletter.id} />
          {newsletter.status === 'draft' ? (
            <>
              <SendNow newsletter={newsletter} campaignName={campaignName} onSent={setSent} />
              <Schedule newsletter={newsletter} onSent={setSent} />
            </>
          ) : null}
        </div>
        <UnsubscribeReminder />
      </section>

      <section aria-labelledby="content-heading" className="grid gap-6 lg:grid-cols-2">
        <div className="flex min-w-0 flex-col gap-3">
          <h2 id="content-heading" className="text-lg font-semibold text-ink">
            What it says
          </h2>
          <p className="text-sm text-muted">
            {newsletter.status === 'draft'
              ? 'As saved. To change it, write a new newsletter.'
              : 'As sent. It can no longer change.'}
          </p>
          <pre className="max-h-[32rem] overflow-auto rounded-lg border border-line bg-surface p-4 font-mono text-sm whitespace-pre-wrap break-words text-ink">
            {newsletter.bodyMarkdown}
          </pre>
        </div>
        <div className="flex min-w-0 flex-col gap-3">
          <h2 className="text-lg font-semibold text-ink">Preview</h2>
          <StoredPreview newsletter={newsletter} />
        </div>
      </section>
    </div>
  );
}

function Meta({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex min-w-0 flex-col gap-0.5">
      <dt className="text-sm font-medium text-muted">{term}</dt>
      <dd className="text-base text-ink">{children}</dd>
    </div>
  );
}

function Instant({ iso }: { iso: string }) {
  return (
    <time dateTime={iso} className="tabular">
      {formatDateTime(iso)}
    </time>
  );
}

function Panel({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-3 rounded-lg border border-line bg-surface p-5">
      <h3 className="text-base font-semibold text-ink">{title}</h3>
      {children}
    </div>
  );
}

function errorText(error: unknown): string {
  return isApiError(error) ? error.message : 'Something went wrong.';
}

function SentNotice({ result }: { result: SendNewsletterResult }) {
  const people = plural(result.audienceSize, 'person', 'people');
  if (result.newsletter.status === 'scheduled') {
    return (
      <Alert tone="success" title={`Scheduled for ${formatDateTime(result.newsletter.scheduledFor)}`}>
        The audience holds {people} now; it is counted again when sending starts.
      </Alert>
    );
  }
  return (
    <Alert tone="success" title="Sending">
      On its way to {people} in the audience. The progress below follows it.
    </Alert>
  );
}

function TestCopy({ newsletterId }: { newsletterId: number }) {
  const test = useSendTestNewsletter(newsletterId);
  return (
    <Panel title="Test copy">
      <p className="text-sm text-muted">A copy to your own address, with your own personal fields.</p>
      <Button variant="secondary" busy={test.isPending} onClick={() => test.mutate()} className="w-fit">
        Send a test copy to me
      </Button>
      <div aria-live="polite" className="empty:hidden">
        {test.isSuccess ? <Alert tone="success">{test.data}</Alert> : null}
        {test.isError ? (
          <Alert tone="danger" title="Could not send a test copy">
            {errorText(test.error)}
          </Alert>
        ) : null}
      </div>
    </Panel>
  );
}

function SendNow({
  newsletter,
  campaignName,
  onSent,
}: {
  newsletter: Newsletter;
  campaignName: (id: number) => string | undefined;
  onSent: (result: SendNewsletterResult) => void;
}) {
  const send = useSendNewsletter({ onSent });
  const [confirming, setConfirming] = useState(false);
  return (
    <Panel title="Send now">
      {confirming ? (
        <>
          <p className="text-base text-ink">
            Send “{newsletter.headline}” now? It goes to: {audienceText(newsletter.audience, campaignName)}
            {newsletter.audienceSize !== null
              ? ` — ${plural(newsletter.audienceSize, 'person', 'people')} at the moment`
              : ''}
            . Each reader gets it once, and it cannot be called back.
          </p>
          <div className="flex flex-wrap gap-3">
            <Button busy={send.isPending} onClick={() => send.mutate({ id: newsletter.id })}>
              Yes, send it now
            </Button>
            <Button variant="quiet" onClick={() => setConfirming(false)} disabled={send.isPending}>
              Not yet
            </Button>
          </div>
        </>
      ) : (
        <>
          <p className="text-sm text-muted">
            {newsletter.audienceSize !== null
              ? `The audience holds ${plural(newsletter.audienceSize, 'person', 'people')} now; it is fixed when sending starts.`
              : 'The audience is fixed when sending starts.'}
          </p>
          <Button onClick={() => setConfirming(true)} className="w-fit">
            Send now…
          </Button>
        </>
      )}
      <div aria-live="polite" className="empty:hidden">
        {send.isError ? (
          <Alert tone="danger" title="Not sent">
            {errorText(send.error)}
          </Alert>
        ) : null}
      </div>
    </Panel>
  );
}

function Schedule({
  newsletter,
  onSent,
}: {
  newsletter: Newsletter;
  onSent: (result: SendNewsletterResult) => void;
}) {
  const send = useSendNewsletter({ onSent });
  const inputId = useId();
  const [value, setValue] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const zone = browserTimeZone();
  const serverProblem = isApiError(send.error) ? send.error.fields.at : undefined;
  const fieldProblem = problem ?? serverProblem;

  function submit(event: FormEvent) {
    event.preventDefault();
    const at = localDateTimeToIso(value);
    if (!at) {
      setProblem('Choose a date and a time');
      return;
    }
    if (Date.parse(at) <= Date.now()) {
      setProblem('Choose a time in the future, or send it now');
      return;
    }
    setProblem(null);
    send.mutate({ id: newsletter.id, at });
  }

  return (
    <Panel title="Schedule">
      <form noValidate onSubmit={submit} className="flex flex-col gap-3">
        <div className="flex flex-col gap-1.5">
          <label htmlFor={inputId} className="text-sm font-medium text-ink">
            Send at
          </label>
          <input
            id={inputId}
            type="datetime-local"
            value={value}
            min={toLocalDateTimeValue(new Date())}
            onChange={(event) => setValue(event.target.value)}
            aria-invalid={fieldProblem ? true : undefined}
            aria-describedby={`${inputId}-hint${fieldProblem ? ` ${inputId}-error` : ''}`}
            className={`${inputClasses} tabular`}
          />
          <p id={`${inputId}-hint`} className="text-sm text-muted">
            In your time zone: {zone}.
          </p>
          {fieldProblem ? <FieldError id={`${inputId}-error`}>{fieldProblem}</FieldError> : null}
        </div>
        <Button type="submit" variant="secondary" busy={send.isPending} className="w-fit">
          Schedule
        </Button>
        <div aria-live="polite" className="empty:hidden">
          {send.isError && !serverProblem ? (
            <Alert tone="danger" title="Not scheduled">
              {errorText(send.error)}
            </Alert>
          ) : null}
        </div>
      </form>
    </Panel>
  );
}

/** The stored newsletter rendered for the person looking, as a volunteer would see it. */
function StoredPreview({ newsletter }: { newsletter: Newsletter }) {
  const preview = useNewsletterPreview({
    headline: newsletter.headline,
    bodyMarkdown: newsletter.bodyMarkdown,
    allowRemoteImages: newsletter.allowRemoteImages,
  });
  if (preview.isPending) return <Loading label="Rendering the preview…" />;
  if (preview.isError) {
    return (
      <LoadFailure
        title="Could not render the preview"
        error={preview.error}
        onRetry={() => preview.refetch()}
      />
    );
  }
  return <NewsletterPreviewPanel preview={preview.data} />;
}
