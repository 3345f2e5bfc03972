import { type FormEvent, useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button, ButtonLink } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { FieldError, TextField } from '@/components/text-field';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';
import type { TargetDip } from '../../api/get-target';
import { type PromotedCandidate, usePromoteTarget } from '../../api/promote-target';
import { formatCount, plural } from '../../lib/format';
import { formatScore } from '../../lib/snippets';
import { formatMeasurement } from '../../lib/vetting';

const NOTES_MAX = 5_000;

interface PromotionSectionProps {
  campaignId: number;
  targetId: number;
  designation: string;
  dips: readonly TargetDip[];
  candidateId: number | null;
}

export function PromotionSection({
  campaignId,
  targetId,
  designation,
  dips,
  candidateId,
}: PromotionSectionProps) {
  const promote = usePromoteTarget(targetId);
  const promoted = promote.data ?? null;
  const conflict = isApiError(promote.error) && promote.error.status === 409 ? promote.error : null;
  const shownId = promoted?.id ?? candidateId;

  return (
    <section id="promotion" aria-labelledby="promotion-heading" className="flex scroll-mt-6 flex-col gap-4">
      <div className="flex flex-col gap-1">
        <h2 id="promotion-heading" className="text-xl font-semibold text-ink">
          {shownId === null ? 'Promote to the follow-up list' : 'On the follow-up list'}
        </h2>
        <p className="max-w-2xl text-base text-muted">
          A candidate is not a confirmed planet: it is a target worth following up, with predicted transit
          windows for observers. The volunteers who found its dips are credited.
        </p>
      </div>
      {promoted ? <PromotedNote candidate={promoted} /> : null}
      {conflict && !promoted ? (
        <Alert tone="note" title="Already on the follow-up list">
          <p>{conflict.message}. Someone promoted it meanwhile; it is shown as it is now.</p>
        </Alert>
      ) : null}
      {shownId === null ? (
        <PromotionForm
          campaignId={campaignId}
          targetId={targetId}
          designation={designation}
          dips={dips}
          promote={promote}
        />
      ) : (
        <div className="flex flex-wrap gap-3">
          <ButtonLink to={paths.labCandidate.getHref(shownId)}>Candidate #{shownId}</ButtonLink>
          <ButtonLink variant="secondary" to={paths.labFollowUp.getHref(campaignId)}>
            The follow-up list
          </ButtonLink>
        </div>
      )}
    </section>
  );
}

function PromotedNote({ candidate }: { candidate: PromotedCandidate }) {
  const { named, others } = candidate.credits;
  return (
    <Alert tone="success" title={`${candidate.designation} is candidate #${candidate.id}`}>
      <p>
        {plural(candidate.dipIds.length, 'dip')} on the follow-up list
        {candidate.priority === null ? '' : `, priority ${candidate.priority.toFixed(2)}`}.{' '}
        {named.length + others > 0
          ? `Credited: ${[...named, ...(others > 0 ? [`${formatCount(others)} more`] : [])].join(', ')}.`
          : ''}
      </p>
      <p className="mt-1">{candidate.caution}</p>
    </Alert>
  );
}

interface PromotionFormProps {
  campaignId: number;
  targetId: number;
  designation: string;
  dips: readonly TargetDip[];
  promote: ReturnType<typeof usePromoteTarget>;
}

function PromotionForm({ campaignId, targetId, designation, dips, promote }: PromotionFormProps) {
  const [chosen, setChosen] = useState<ReadonlySet<number>>(() => new Set(dips.map((dip) => dip.id)));
  const [notes, setNotes] = useState('');
  const [precision, setPrecision] = useState('');
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const notesId = useId();
  const dipsErrorId = useId();
  const error = promote.error;
  const serverFields = isApiError(error) && error.status === 400 ? error.fields : {};
  const fieldError = (field: string) => localErrors[field] ?? serverFields[field];
  // Field errors show at their fields; a refusal without any, or about a field not on the form, shows here.
  const formFields = ['dipIds', 'notes', 'telescopePrecisionPpm'];
  const otherFieldErrors = Object.entries(serverFields).filter(([field]) => !formFields.includes(field));
  const generalError =
    error &&
    !(isApiError(error) && error.status === 409) &&
    (Object.keys(serverFields).length === 0 || otherFieldErrors.length > 0)
      ? isApiError(error)
        ? [error.message, ...otherFieldErrors.map(([, message]) => message)].join('. ')
        : 'Something went wrong.'
      : null;

  function toggle(id: number, on: boolean) {
    setChosen((current) => {
      const next = new Set(current);
      if (on) next.add(id);
      else next.delete(id);
      return next;
    });
  }

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const errors: Record<string, string> = {};
    if (dips.length > 0 && chosen.size === 0) errors.dipIds = 'Choose at least one dip';
    if (notes.length > NOTES_MAX) errors.notes = `At most ${formatCount(NOTES_MAX)} characters`;
    const precisionText = precision.trim();
    const precisionPpm = precisionText === '' ? undefined : Number(precisionText);
    if (
      precisionPpm !== undefined &&
      !(Number.isFinite(precisionPpm) && precisionPpm > 0 && precisionPpm <= 1_000_000)
    ) {
      errors.telescopePrecisionPpm = 'A number of ppm above 0, up to 1 000 000';
    }
    setLocalErrors(errors);
    if (Object.keys(errors).length > 0) return;
    promote.mutate({
      campaignId,
      targetId,
      ...(dips.length > 0 ? { dipIds: dips.filter((dip) => chosen.has(dip.id)).map((dip) => dip.id) } : {}),
      ...(notes.trim() ? { notes: notes.trim() } : {}),
      ...(precisionPpm === undefined ? {} : { telescopePrecisionPpm: precisionPpm }),
    });
  }

  const dipsError = fieldError('dipIds');
  const notesError = fieldError('notes');

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-label={`Promote ${designation} to the follow-up list`}
      className="flex max-w-3xl flex-col gap-5 rounded-lg border border-line bg-surface p-4 md:p-6"
    >
      <fieldset className="flex flex-col gap-2" aria-describedby={dipsError ? dipsErrorId : undefined}>
        <legend className="mb-2 text-base font-semibold text-ink">Dips to credit</legend>
        {dips.length === 0 ? (
          <p className="text-sm text-muted">
            This target has no settled dip; it can still be promoted on its period search alone.
          </p>
        ) : (
          <div className="grid gap-2 sm:grid-cols-2">
            {dips.map((dip) => (
              <CheckboxField
                key={dip.id}
                label={`Dip #${dip.id} at ${dip.timeCenter.toFixed(4)} d`}
                hint={`${formatMeasurement(dip.depthPpm, null, 'ppm', 0)} · SNR ${dip.snr === null ? '—' : dip.snr.toFixed(1)} · consensus ${formatScore(dip.consensusScore)}`}
                checked={chosen.has(dip.id)}
                onChange={(event) => toggle(dip.id, event.target.checked)}
              />
            ))}
          </div>
        )}
        {dipsError ? <FieldError id={dipsErrorId}>{dipsError}</FieldError> : null}
      </fieldset>

      <div className="flex flex-col gap-1.5">
        <label htmlFor={notesId} className="text-sm font-medium text-ink">
          Notes (optional)
        </label>
        <textarea
          id={notesId}
          value={notes}
          rows={4}
          maxLength={NOTES_MAX}
          onChange={(event) => setNotes(event.target.value)}
          aria-invalid={notesError ? true : undefined}
          aria-describedby={`${notesId}-count${notesError ? ` ${notesId}-error` : ''}`}
          className="block min-h-24 w-full rounded-md border border-edge bg-surface px-3 py-2 text-base text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
        />
        <p id={`${notesId}-count`} className="tabular text-xs text-muted">
          {formatCount(notes.length)} of {formatCount(NOTES_MAX)} characters
        </p>
        {notesError ? <FieldError id={`${notesId}-error`}>{notesError}</FieldError> : null}
      </div>

      <TextField
        label="Telescope precision (ppm, optional)"
        hint="The follow-up telescope’s precision over a transit; it sets the priority score (1000 ppm if left empty)."
        inputMode="decimal"
        value={precision}
        onChange={(event) => setPrecision(event.target.value)}
        error={fieldError('telescopePrecisionPpm')}
        className="max-w-sm"
      />

      {generalError ? (
        <Alert tone="danger" title="Could not promote the target">
          <p>{generalError}</p>
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={promote.isPending}>
          Promote to the follow-up list
        </Button>
      </div>
    </form>
  );
}
