import { type FormEvent, useId, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { Select } from '@/components/select';
import { FieldError } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import type { Candidate } from '../../api/get-candidates';
import { type CandidateChanges, useUpdateCandidate } from '../../api/update-candidate';
import {
  CANDIDATE_STATES,
  type CandidateState,
  candidateStateHints,
  candidateStateLabels,
  DISPOSITIONS,
  type Disposition,
  dispositionLabel,
} from '../../lib/candidates';

/** State, disposition and notes of one candidate; only what was changed is sent. */
export function CandidateEditor({ candidate }: { candidate: Candidate }) {
  const update = useUpdateCandidate();
  const [state, setState] = useState<CandidateState>(candidate.state);
  const [disposition, setDisposition] = useState<Disposition>(candidate.disposition);
  const [notes, setNotes] = useState(candidate.notes ?? '');
  const [saved, setSaved] = useState(false);
  const id = useId();

  const changes: CandidateChanges = {};
  if (state !== candidate.state) changes.state = state;
  if (disposition !== candidate.disposition) changes.disposition = disposition;
  if (notes.trim() !== (candidate.notes ?? '')) changes.notes = notes.trim() || null;
  const dirty = Object.keys(changes).length > 0;

  function submit(event: FormEvent) {
    event.preventDefault();
    if (!dirty) return;
    setSaved(false);
    update.mutate(
      { id: candidate.id, changes },
      {
        onSuccess: (answer) => {
          setState(answer.state);
          setDisposition(answer.disposition);
          setNotes(answer.notes ?? '');
          setSaved(true);
        },
      },
    );
  }

  const fields = isApiError(update.error) ? update.error.fields : {};
  const fieldIds = { state: `${id}-state`, disposition: `${id}-disposition`, notes: `${id}-notes` };
  const errorId = (name: string) => `${id}-${name}-error`;
  const knownField = Boolean(fields.state || fields.disposition || fields.notes);

  return (
    <form
      noValidate
      onSubmit={submit}
      aria-label={`Change ${candidate.designation}`}
      className="flex flex-col gap-4"
    >
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <div className="flex flex-col gap-1.5">
          <label htmlFor={fieldIds.state} className="text-sm font-medium text-ink">
            State
          </label>
          <Select
            id={fieldIds.state}
            value={state}
            aria-invalid={fields.state ? true : undefined}
            aria-describedby={fields.state ? errorId('state') : `${fieldIds.state}-hint`}
            onChange={(event) => {
              setState(event.target.value as CandidateState);
              setSaved(false);
            }}
          >
            {CANDIDATE_STATES.map((value) => (
              <option key={value} value={value}>
                {candidateStateLabels[value]}
              </option>
            ))}
          </Select>
          <p id={`${fieldIds.state}-hint`} className="text-sm text-muted">
            {candidateStateHints[state]}
          </p>
          {fields.state ? <FieldError id={errorId('state')}>{fields.state}</FieldError> : null}
        </div>
        <div className="flex flex-col gap-1.5">
          <label htmlFor={fieldIds.disposition} className="text-sm font-medium text-ink">
            Disposition
          </label>
          <Select
            id={fieldIds.disposition}
            value={disposition}
            aria-invalid={fields.disposition ? true : undefined}
            aria-describedby={fields.disposition ? errorId('disposition') : undefined}
            onChange={(event) => {
              setDisposition(event.target.value as Disposition);
              setSaved(false);
            }}
          >
            {DISPOSITIONS.map((value) => (
              <option key={value} value={value}>
                {dispositionLabel(value)}
              </option>
            ))}
          </Select>
          {fields.disposition ? (
            <FieldError id={errorId('disposition')}>{fields.disposition}</FieldError>
          ) : null}
        </div>
      </div>
      <div className="flex flex-col gap-1.5">
        <label htmlFor={fieldIds.notes} className="text-sm font-medium text-ink">
          Notes
        </label>
        <textarea
          id={fieldIds.notes}
          value={notes}
          rows={2}
          maxLength={5000}
          aria-invalid={fields.notes ? true : undefined}
          aria-describedby={fields.notes ? errorId('notes') : undefined}
          onChange={(event) => {
            setNotes(event.target.value);
            setSaved(false);
          }}
          className="block min-h-target w-full rounded-md border border-edge bg-surface px-3 py-2 text-base text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
        />
        {fields.notes ? <FieldError id={errorId('notes')}>{fields.notes}</FieldError> : null}
      </div>
      {update.isError && !knownField ? (
        <Alert tone="danger" title="Could not save the changes">
          {isApiError(update.error) ? update.error.message : 'Something went wrong.'}
        </Alert>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button
          type="submit"
          variant="secondary"
          busy={update.isPending}
          disabled={!dirty}
          aria-label={`Save changes to ${candidate.designation}`}
        >
          Save changes
        </Button>
        <p aria-live="polite" className="text-sm text-success">
          {saved && !dirty ? 'Saved.' : ''}
        </p>
      </div>
    </form>
  );
}
