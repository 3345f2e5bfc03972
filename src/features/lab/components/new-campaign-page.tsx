import { type FormEvent, useId, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { PageHeader } from '@/components/page-header';
import { FieldError, TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import { useCreateCampaign } from '../api/create-campaign';

export function NewCampaignPage() {
  const navigate = useNavigate();
  const create = useCreateCampaign();
  const descriptionId = useId();
  const [name, setName] = useState('');
  const [description, setDescription] = useState('');
  const [problems, setProblems] = useState<Record<string, string>>({});

  const serverFields = isApiError(create.error) ? create.error.fields : {};
  const fieldError = (field: string) => problems[field] ?? serverFields[field];

  function submit(event: FormEvent) {
    event.preventDefault();
    const trimmed = name.trim();
    if (!trimmed) {
      setProblems({ name: 'Name the campaign' });
      return;
    }
    setProblems({});
    create.mutate(
      { name: trimmed, description: description.trim() },
      { onSuccess: (campaign) => navigate(paths.labCampaign.getHref(campaign.id)) },
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
        eyebrow="Lab · campaigns"
        title="New campaign"
        description="A campaign starts as a draft. Nothing reaches the Deck until you set it live."
      />
      <form noValidate onSubmit={submit} className="grid gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <div className="flex flex-col gap-5 rounded-lg border border-line bg-surface p-5 md:p-6">
          <TextField
            label="Name"
            value={name}
            onChange={(event) => setName(event.target.value)}
            error={fieldError('name')}
            maxLength={120}
            autoComplete="off"
            required
          />
          <div className="flex flex-col gap-1.5">
            <label htmlFor={descriptionId} className="text-sm font-medium text-ink">
              Description <span className="font-normal text-muted">(optional)</span>
            </label>
            <textarea
              id={descriptionId}
              value={description}
              onChange={(event) => setDescription(event.target.value)}
              rows={4}
              maxLength={4000}
              aria-invalid={fieldError('description') ? true : undefined}
              className="block w-full rounded-md border border-edge bg-surface px-3 py-2 text-base text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
            />
            {fieldError('description') ? (
              <FieldError id={`${descriptionId}-error`}>{fieldError('description')}</FieldError>
            ) : null}
          </div>
          <div aria-live="polite" className="empty:hidden">
            {generalError ? (
              <Alert tone="danger" title="Could not create the campaign">
                {generalError}
              </Alert>
            ) : null}
          </div>
          <div className="flex flex-wrap gap-3">
            <Button type="submit" busy={create.isPending}>
              Create campaign
            </Button>
            <Link
              to={paths.lab.getHref()}
              className="inline-flex min-h-target items-center rounded-md px-4 font-medium text-ink hover:bg-amber-wash"
            >
              Cancel
            </Link>
          </div>
        </div>
        <aside className="flex flex-col gap-3 text-base text-muted">
          <h2 className="text-lg font-semibold text-ink">What happens next</h2>
          <ol className="flex flex-col gap-2">
            {[
              'Upload the target catalogue: one row per star.',
              'Upload light curves; each is cleaned, detrended and cut into snippets, with planted and quiet controls mixed in.',
              'Check the settings and the snippets, then set the campaign live.',
            ].map((step, index) => (
              <li key={step} className="flex gap-3">
                <span className="tabular flex size-6 shrink-0 items-center justify-center rounded-full bg-amber-wash text-xs font-medium text-amber-ink">
                  {index + 1}
                </span>
                <span>{step}</span>
              </li>
            ))}
          </ol>
          <p className="text-sm">
            The settings start at Dipdeck’s defaults (two-day snippets, a tenth of them planted controls);
            change them on the campaign page.
          </p>
        </aside>
      </form>
    </div>
  );
}
