import { type FormEvent, useEffect, useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { FieldError, inputClasses } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { useUpdateCampaign } from '../api/update-campaign';
import {
  type Campaign,
  draftFromCampaign,
  patchFromDraft,
  type SettingDefinition,
  type SettingsDraft,
  settingGroups,
} from '../lib/campaigns';

type Outcome = { tone: 'success' | 'danger'; text: string };

export function CampaignSettingsForm({ campaign }: { campaign: Campaign }) {
  const update = useUpdateCampaign();
  const [draft, setDraft] = useState<SettingsDraft>(() => draftFromCampaign(campaign));
  const [problems, setProblems] = useState<Record<string, string>>({});
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const closed = campaign.status === 'closed';
  const descriptionId = useId();

  // Another tab or a status change may bring a newer campaign; start again from what is stored.
  const stamp = campaign.updatedAt;
  // biome-ignore lint/correctness/useExhaustiveDependencies: only a newer stored campaign resets the form.
  useEffect(() => {
    setDraft(draftFromCampaign(campaign));
  }, [stamp]);

  const { patch } = patchFromDraft(draft, campaign);
  const changed = Object.keys(patch).length;

  function set(key: keyof SettingsDraft, value: string) {
    setDraft((current) => ({ ...current, [key]: value }));
    setProblems(({ [key]: _gone, ...rest }) => rest);
  }

  function submit(event: FormEvent) {
    event.preventDefault();
    const read = patchFromDraft(draft, campaign);
    setOutcome(null);
    if (Object.keys(read.problems).length > 0) {
      setProblems(read.problems);
      setOutcome({ tone: 'danger', text: 'Some settings need a look: each one says what it needs.' });
      return;
    }
    if (Object.keys(read.patch).length === 0) {
      setOutcome({ tone: 'success', text: 'Nothing to save: the settings are as stored.' });
      return;
    }
    update.mutate(
      { id: campaign.id, changes: read.patch },
      {
        onSuccess: (saved) => {
          setProblems({});
          setDraft(draftFromCampaign(saved));
          setOutcome({
            tone: 'success',
            text:
              saved.status === 'live' || saved.status === 'paused'
                ? 'Settings saved. Snippets cut from now on use them; snippets already made keep theirs.'
                : 'Settings saved.',
          });
        },
        onError: (error) => {
          if (isApiError(error) && Object.keys(error.fields).length > 0) setProblems(error.fields);
          setOutcome({
            tone: 'danger',
            text: `Could not save the settings: ${isApiError(error) ? error.message : 'something went wrong.'}`,
          });
        },
      },
    );
  }

  return (
    <form
      noValidate
      onSubmit={submit}
      className="flex flex-col gap-6"
      aria-describedby={`${descriptionId}-note`}
    >
      {closed ? (
        <Alert tone="note" title="This campaign is closed">
          Its settings are kept as they were and can no longer change.
        </Alert>
      ) : (
        <div id={`${descriptionId}-note`}>
          <Alert
            tone="note"
            title={campaign.status === 'live' ? 'This campaign is live' : 'Settings and live campaigns'}
          >
            Changing the settings of a live campaign affects only snippets made afterwards. Snippets already
            cut, and their verdicts, keep the settings they were made with.
          </Alert>
        </div>
      )}

      <fieldset disabled={closed} className="flex flex-col gap-6">
        <legend className="sr-only">Campaign settings</legend>
        <div className="grid gap-5 rounded-lg border border-line bg-surface p-5 md:grid-cols-2 md:p-6">
          <Field
            label="Name"
            value={draft.name}
            onChange={(value) => set('name', value)}
            error={problems.name}
            type="text"
          />
          <div className="flex flex-col gap-1.5 md:row-span-2">
            <label htmlFor={descriptionId} className="text-sm font-medium text-ink">
              Description
            </label>
            <textarea
              id={descriptionId}
              value={draft.description}
              rows={3}
              onChange={(event) => set('description', event.target.value)}
              aria-invalid={problems.description ? true : undefined}
              aria-describedby={problems.description ? `${descriptionId}-error` : undefined}
              className="block min-h-24 w-full flex-1 rounded-md border border-edge bg-surface px-3 py-2 text-base text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
            />
            {problems.description ? (
              <FieldError id={`${descriptionId}-error`}>{problems.description}</FieldError>
            ) : null}
          </div>
        </div>

        {settingGroups.map((group) => (
          <fieldset key={group.title} className="rounded-lg border border-line bg-surface p-5 md:p-6">
            <legend className="px-1 text-lg font-semibold text-ink">{group.title}</legend>
            <p className="mb-5 max-w-2xl text-sm text-muted">{group.description}</p>
            <div className="grid gap-x-6 gap-y-5 md:grid-cols-2">
              {group.settings.map((setting) => (
                <SettingField
                  key={setting.key}
                  setting={setting}
                  value={draft[setting.key]}
                  error={problems[setting.key]}
                  onChange={(value) => set(setting.key, value)}
                />
              ))}
            </div>
          </fieldset>
        ))}
      </fieldset>

      <div aria-live="polite" className="empty:hidden">
        {outcome ? <Alert tone={outcome.tone}>{outcome.text}</Alert> : null}
      </div>
      {problems._ ? <Alert tone="danger">{problems._}</Alert> : null}

      {closed ? null : (
        <div className="flex flex-wrap items-center gap-4">
          <Button type="submit" busy={update.isPending}>
            Save settings
          </Button>
          <Button
            variant="secondary"
            disabled={changed === 0 || update.isPending}
            onClick={() => {
              setDraft(draftFromCampaign(campaign));
              setProblems({});
              setOutcome(null);
            }}
          >
            Undo changes
          </Button>
          <p className="text-sm text-muted">
            {changed === 0
              ? 'No unsaved changes.'
              : `${changed} unsaved ${changed === 1 ? 'change' : 'changes'}.`}
          </p>
        </div>
      )}
    </form>
  );
}

interface FieldProps {
  label: string;
  value: string;
  onChange: (value: string) => void;
  error: string | undefined;
  type: 'text' | 'number';
  hint?: string;
  unit?: string;
  inputMode?: 'decimal' | 'numeric';
  placeholder?: string;
}

function Field({ label, value, onChange, error, type, hint, unit, inputMode, placeholder }: FieldProps) {
  const id = useId();
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
        {unit ? <span className="font-normal text-muted"> ({unit})</span> : null}
      </label>
      <input
        id={id}
        type={type}
        value={value}
        inputMode={inputMode}
        placeholder={placeholder}
        onChange={(event) => onChange(event.target.value)}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={`${inputClasses} ${inputMode ? 'tabular' : ''}`}
      />
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-muted">
          {hint}
        </p>
      ) : null}
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
    </div>
  );
}

function SettingField({
  setting,
  value,
  error,
  onChange,
}: {
  setting: SettingDefinition;
  value: string;
  error: string | undefined;
  onChange: (value: string) => void;
}) {
  const range = `${setting.min}–${setting.max}`;
  const fallback = setting.defaultValue === null ? 'empty' : String(setting.defaultValue);
  return (
    <Field
      label={setting.label}
      unit={setting.unit}
      type="text"
      inputMode={setting.integer ? 'numeric' : 'decimal'}
      value={value}
      onChange={onChange}
      error={error}
      placeholder={setting.nullable ? 'automatic' : undefined}
      hint={`${setting.hint} Range ${range}; default ${fallback}.`}
    />
  );
}
