import { type FormEvent, useEffect, useId, useMemo, useRef, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { PageHeader } from '@/components/page-header';
import { Select } from '@/components/select';
import { FieldError, inputClasses, TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCreateNewsletter } from '../../api/create-newsletter';
import { useCampaigns } from '../../api/get-campaigns';
import { useNewsletterPreview } from '../../api/preview-newsletter';
import {
  type Audience,
  type AudienceKind,
  insertAtSelection,
  type NewsletterContent,
  type PersonalFieldName,
  PREVIEW_DEBOUNCE_MS,
  placeholderOf,
} from '../../lib/newsletters';
import { RemoteImagesHint, UnsubscribeReminder } from './newsletter-notes';
import { NewsletterPreviewPanel, UnknownPlaceholdersWarning } from './newsletter-preview';
import { PersonalFieldsHelp } from './personal-fields-help';

/** `value`, but only once it has stopped changing for `delayMs`. */
function useDebouncedValue<T>(value: T, delayMs: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), delayMs);
    return () => clearTimeout(timer);
  }, [value, delayMs]);
  return settled;
}

const audienceKinds: { kind: AudienceKind; label: string }[] = [
  { kind: 'opted-in', label: 'Everyone who opted in' },
  { kind: 'active', label: 'Opted in and active recently' },
  { kind: 'campaign', label: 'Opted in and contributed to a campaign' },
];

export function NewNewsletterPage() {
  const navigate = useNavigate();
  const create = useCreateNewsletter();
  const bodyId = useId();
  const daysId = useId();
  const campaignId = useId();
  const bodyRef = useRef<HTMLTextAreaElement>(null);
  const [headline, setHeadline] = useState('');
  const [body, setBody] = useState('');
  const [kind, setKind] = useState<AudienceKind>('opted-in');
  const [days, setDays] = useState('30');
  const [campaign, setCampaign] = useState('');
  const [allowRemoteImages, setAllowRemoteImages] = useState(false);
  const [problems, setProblems] = useState<Record<string, string>>({});

  const serverFields = isApiError(create.error) ? create.error.fields : {};
  const fieldError = (field: string) => problems[field] ?? serverFields[field];

  function insertField(name: PersonalFieldName) {
    const area = bodyRef.current;
    const next = insertAtSelection(
      body,
      area?.selectionStart ?? body.length,
      area?.selectionEnd ?? body.length,
      placeholderOf(name),
    );
    setBody(next.text);
    // After React has written the new text, put the caret after what was inserted.
    requestAnimationFrame(() => {
      area?.focus();
      area?.setSelectionRange(next.caret, next.caret);
    });
  }

  function audienceOf(): Audience | Record<string, string> {
    if (kind === 'opted-in') return { kind };
    if (kind === 'active') {
      const n = Number(days);
      return Number.isInteger(n) && n >= 1 && n <= 3650
        ? { kind, days: n }
        : { 'audience.days': 'A whole number of days from 1 to 3650' };
    }
    const id = Number(campaign);
    return id > 0 ? { kind, campaignId: id } : { 'audience.campaignId': 'Choose a campaign' };
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    const found: Record<string, string> = {};
    if (!headline.trim()) found.headline = 'Write a headline';
    if (!body.trim()) found.bodyMarkdown = 'Write the newsletter';
    const audience = audienceOf();
    if (!('kind' in audience)) Object.assign(found, audience);
    setProblems(found);
    if (Object.keys(found).length > 0 || !('kind' in audience)) return;
    create.mutate(
      { headline: headline.trim(), bodyMarkdown: body, audience: audience as Audience, allowRemoteImages },
      { onSuccess: (newsletter) => navigate(paths.labNewsletter.getHref(newsletter.id)) },
    );
  }

  const generalError =
    create.isError && Object.keys(serverFields).length === 0
      ? isApiError(create.error)
        ? create.error.message
        : 'Something went wrong.'
      : null;

  return (
    <div className="flex flex-col gap-8">
      <PageHeader
        eyebrow="Lab · newsletters"
        title="Write a newsletter"
        description="It is saved as a draft. Send yourself a test copy from its page before sending it to volunteers."
      />
      <form noValidate onSubmit={submit} className="grid gap-8 lg:grid-cols-2">
        <div className="flex flex-col gap-5 rounded-lg border border-line bg-surface p-5 md:p-6">
          <TextField
            label="Headline"
            hint="The e-mail's subject and its title. Personal fields work here too."
            value={headline}
            onChange={(event) => setHeadline(event.target.value)}
            error={fieldError('headline')}
            maxLength={200}
            autoComplete="off"
            required
          />
          <div className="flex flex-col gap-1.5">
            <label htmlFor={bodyId} className="text-sm font-medium text-ink">
              Text <span className="font-normal text-muted">(Markdown)</span>
            </label>
            <textarea
              id={bodyId}
              ref={bodyRef}
              value={body}
              onChange={(event) => setBody(event.target.value)}
              rows={14}
              maxLength={100_000}
              spellCheck
              aria-invalid={fieldError('bodyMarkdown') ? true : undefined}
              aria-describedby={fieldError('bodyMarkdown') ? `${bodyId}-error` : `${bodyId}-hint`}
              className="block w-full rounded-md border border-edge bg-surface px-3 py-2 font-mono text-sm leading-relaxed text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
            />
            <p id={`${bodyId}-hint`} className="text-sm text-muted">
              **bold**, *italic*, [a link](https://…), lists with “- ”, headings with “## ”.
            </p>
            {fieldError('bodyMarkdown') ? (
              <FieldError id={`${bodyId}-error`}>{fieldError('bodyMarkdown')}</FieldError>
            ) : null}
          </div>
          <PersonalFieldsHelp onInsert={insertField} />

          <fieldset className="flex flex-col gap-2">
            <legend className="mb-2 text-sm font-medium text-ink">Who gets it</legend>
            {audienceKinds.map((option) => (
              <label
                key={option.kind}
                className="flex min-h-target cursor-pointer items-center gap-3 rounded-md border border-edge bg-surface px-3 hover:border-ink has-checked:border-ink has-checked:bg-amber-wash"
              >
                <input
                  type="radio"
                  name="audience"
                  value={option.kind}
                  checked={kind === option.kind}
                  onChange={() => setKind(option.kind)}
                  className="size-5 accent-ink"
                />
                <span className="text-base text-ink">{option.label}</span>
              </label>
            ))}
            {kind === 'active' ? (
              <div className="flex flex-col gap-1.5 pl-1">
                <label htmlFor={daysId} className="text-sm font-medium text-ink">
                  Active in the last … days
                </label>
                <input
                  id={daysId}
                  type="number"
                  inputMode="numeric"
                  min={1}
                  max={3650}
                  step={1}
                  value={days}
                  onChange={(event) => setDays(event.target.value)}
                  aria-invalid={fieldError('audience.days') ? true : undefined}
                  aria-describedby={fieldError('audience.days') ? `${daysId}-error` : undefined}
                  className={`${inputClasses} max-w-32 tabular`}
                />
                {fieldError('audience.days') ? (
                  <FieldError id={`${daysId}-error`}>{fieldError('audience.days')}</FieldError>
                ) : null}
              </div>
            ) : null}
            {kind === 'campaign' ? (
              <CampaignChoice
                id={campaignId}
                value={campaign}
                onChange={setCampaign}
                error={fieldError('audience.campaignId')}
              />
            ) : null}
            {fieldError('audience') ? (
              <FieldError id={`${campaignId}-audience-error`}>{fieldError('audience')}</FieldError>
            ) : null}
          </fieldset>

          <CheckboxField
            label="Allow remote images"
            hint={<RemoteImagesHint />}
            checked={allowRemoteImages}
            onChange={(event) => setAllowRemoteImages(event.target.checked)}
          />
          <UnsubscribeReminder />

          <div aria-live="polite" className="empty:hidden">
            {generalError ? (
              <Alert tone="danger" title="Could not save the newsletter">
                {generalError}
              </Alert>
            ) : null}
          </div>
          <div className="flex flex-wrap gap-3">
            <Button type="submit" busy={create.isPending}>
              Save as draft
            </Button>
            <Link
              to={paths.labNewsletters.getHref()}
              className="inline-flex min-h-target items-center rounded-md px-4 font-medium text-ink hover:bg-amber-wash"
            >
              Cancel
            </Link>
          </div>
        </div>
        <aside aria-labelledby="live-preview-heading" className="flex min-w-0 flex-col gap-3">
          <h2 id="live-preview-heading" className="text-lg font-semibold text-ink">
            Preview
          </h2>
          <LivePreview content={{ headline, bodyMarkdown: body, allowRemoteImages }} />
        </aside>
      </form>
    </div>
  );
}

function CampaignChoice({
  id,
  value,
  onChange,
  error,
}: {
  id: string;
  value: string;
  onChange: (value: string) => void;
  error: string | undefined;
}) {
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
  return (
    <div className="flex flex-col gap-1.5 pl-1">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        Campaign
      </label>
      <Select
        id={id}
        value={value}
        onChange={(event) => onChange(event.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-error` : undefined}
        className="w-full"
      >
        <option value="">Choose a campaign…</option>
        {campaigns.data.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </Select>
      <p className="text-sm text-muted">Volunteers who gave at least one verdict in it.</p>
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
    </div>
  );
}

/** The server's rendering of what is being written, asked for once typing pauses. */
function LivePreview({ content }: { content: NewsletterContent }) {
  // Compared as text: the content is a new object on every render, which would restart the timer for ever.
  const typed = JSON.stringify(content);
  const settledText = useDebouncedValue(typed, PREVIEW_DEBOUNCE_MS);
  const settled = useMemo(() => JSON.parse(settledText) as NewsletterContent, [settledText]);
  const preview = useNewsletterPreview(settled);
  const empty = !settled.headline.trim() || !settled.bodyMarkdown.trim();

  if (empty) {
    return (
      <p className="rounded-lg border border-dashed border-line bg-surface p-5 text-base text-muted">
        Write a headline and some text to see the newsletter as a volunteer would get it.
      </p>
    );
  }
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
  return (
    <div className="flex flex-col gap-3">
      <UnknownPlaceholdersWarning placeholders={preview.data.unknownPlaceholders} />
      <NewsletterPreviewPanel
        preview={preview.data}
        updating={typed !== settledText || preview.isPlaceholderData || preview.isFetching}
      />
    </div>
  );
}
