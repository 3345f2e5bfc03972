import { type FormEvent, type ReactNode, useEffect, useId, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button, buttonClasses } from '@/components/button';
import { FieldError } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { useClearVolunteerFlag } from '../api/clear-volunteer-flag';
import { useCreateVolunteerWarning } from '../api/create-volunteer-warning';
import { useRestoreVolunteer } from '../api/restore-volunteer';
import { useSuspendVolunteer } from '../api/suspend-volunteer';
import { plural } from '../lib/format';
import { type DeskVolunteer, flagLabel } from '../lib/volunteers';

export type VolunteerAction =
  | { type: 'clear-flag'; code: string }
  | { type: 'warning' }
  | { type: 'suspend' }
  | { type: 'restore' };

type Outcome = { tone: 'success' | 'danger'; text: string };

interface VolunteerActionPanelProps {
  volunteer: DeskVolunteer;
  action: VolunteerAction;
  onClose: () => void;
  onOutcome: (outcome: Outcome) => void;
}

const failure = (error: unknown) => (isApiError(error) ? error.message : 'Something went wrong. Try again.');

/** The form for one moderator action on one volunteer, opened under their row. */
export function VolunteerActionPanel({ volunteer, action, onClose, onOutcome }: VolunteerActionPanelProps) {
  switch (action.type) {
    case 'clear-flag':
      return (
        <ClearFlagForm volunteer={volunteer} code={action.code} onClose={onClose} onOutcome={onOutcome} />
      );
    case 'warning':
      return <WarningForm volunteer={volunteer} onClose={onClose} onOutcome={onOutcome} />;
    case 'suspend':
      return <SuspendForm volunteer={volunteer} onClose={onClose} onOutcome={onOutcome} />;
    case 'restore':
      return <RestoreForm volunteer={volunteer} onClose={onClose} onOutcome={onOutcome} />;
  }
}

interface FormProps {
  volunteer: DeskVolunteer;
  onClose: () => void;
  onOutcome: (outcome: Outcome) => void;
}

interface NoteFieldProps {
  label: string;
  value: string;
  onChange: (value: string) => void;
  limit: number;
  required: boolean;
  hint?: string;
  error?: string | null;
}

function NoteField({ label, value, onChange, limit, required, hint, error }: NoteFieldProps) {
  const id = useId();
  const ref = useRef<HTMLTextAreaElement>(null);
  // The form opens where the moderator pressed the button; the field is where they go next.
  useEffect(() => ref.current?.focus(), []);
  const describedBy = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
        {required ? null : <span className="font-normal text-muted"> (optional)</span>}
      </label>
      <textarea
        id={id}
        ref={ref}
        value={value}
        rows={3}
        maxLength={limit}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        onChange={(event) => onChange(event.target.value)}
        className="block min-h-20 w-full rounded-md border border-edge bg-surface px-3 py-2 text-base text-ink hover:border-ink aria-invalid:border-2 aria-invalid:border-danger"
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

function Panel({ title, children }: { title: string; children: ReactNode }) {
  const id = useId();
  return (
    <section
      aria-labelledby={id}
      className="flex flex-col gap-4 rounded-lg border border-amber bg-surface p-4 text-left md:max-w-2xl"
    >
      <h3 id={id} className="text-base font-semibold text-ink">
        {title}
      </h3>
      {children}
    </section>
  );
}

function Failure({ text }: { text: string | null }) {
  return text ? (
    <Alert tone="danger" title="Nothing was changed">
      {text}
    </Alert>
  ) : null;
}

/** A form's submit button and Cancel, side by side. */
function FormActions({
  busy = false,
  danger = false,
  onCancel,
  children,
}: {
  busy?: boolean;
  danger?: boolean;
  onCancel: () => void;
  children: ReactNode;
}) {
  return (
    <div className="flex flex-wrap gap-2">
      <Button type="submit" busy={busy} variant={danger ? 'danger' : undefined}>
        {children}
      </Button>
      <Button variant="secondary" onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}

function ClearFlagForm({ volunteer, code, onClose, onOutcome }: FormProps & { code: string }) {
  const clear = useClearVolunteerFlag();
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [failed, setFailed] = useState<string | null>(null);
  const flag = volunteer.flags.find((candidate) => candidate.code === code);
  const label = flagLabel(code);

  function submit(event: FormEvent) {
    event.preventDefault();
    if (!note.trim()) {
      setProblem('Say why the flag does not apply; the note goes in the audit log.');
      return;
    }
    setProblem(null);
    setFailed(null);
    clear.mutate(
      { id: volunteer.id, code, note },
      {
        onSuccess: () =>
          onOutcome({ tone: 'success', text: `Cleared the “${label}” flag of ${volunteer.displayName}.` }),
        onError: (error) => setFailed(failure(error)),
      },
    );
  }

  return (
    <Panel title={`Clear the “${label}” flag of ${volunteer.displayName}`}>
      {flag ? <p className="text-sm text-muted">Flagged because: {flag.reason}</p> : null}
      <form className="flex flex-col gap-4" onSubmit={submit} noValidate>
        <NoteField
          label="Why it does not apply"
          value={note}
          onChange={setNote}
          limit={500}
          required
          error={problem}
        />
        <Failure text={failed} />
        <FormActions busy={clear.isPending} onCancel={onClose}>
          Clear flag
        </FormActions>
      </form>
    </Panel>
  );
}

function WarningForm({ volunteer, onClose, onOutcome }: FormProps) {
  const warn = useCreateVolunteerWarning();
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [failed, setFailed] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    if (!note.trim()) {
      setProblem('Write the warning: what the volunteer should do differently.');
      return;
    }
    setProblem(null);
    setFailed(null);
    warn.mutate(
      { id: volunteer.id, note },
      {
        onSuccess: (result) =>
          onOutcome({
            tone: 'success',
            text: result.emailed
              ? `Warning recorded and e-mailed to ${volunteer.displayName}.`
              : `Warning for ${volunteer.displayName} recorded in the audit log. It was not e-mailed: the account has no e-mail address.`,
          }),
        onError: (error) => setFailed(failure(error)),
      },
    );
  }

  return (
    <Panel title={`Record a warning for ${volunteer.displayName}`}>
      <Alert tone="note">
        The warning is recorded in the audit log. Dipdeck does not e-mail it yet (that comes with a later
        release), so tell the volunteer yourself if they need to know now.
      </Alert>
      <form className="flex flex-col gap-4" onSubmit={submit} noValidate>
        <NoteField label="Warning" value={note} onChange={setNote} limit={2000} required error={problem} />
        <Failure text={failed} />
        <FormActions busy={warn.isPending} onCancel={onClose}>
          Record warning
        </FormActions>
      </form>
    </Panel>
  );
}

function SuspendForm({ volunteer, onClose, onOutcome }: FormProps) {
  const suspend = useSuspendVolunteer();
  const [reason, setReason] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [failed, setFailed] = useState<string | null>(null);
  const [confirming, setConfirming] = useState(false);
  const confirmRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (confirming) confirmRef.current?.focus();
  }, [confirming]);

  function ask(event: FormEvent) {
    event.preventDefault();
    if (!reason.trim()) {
      setProblem('Give a reason; it goes in the audit log.');
      return;
    }
    setProblem(null);
    setFailed(null);
    setConfirming(true);
  }

  function confirm() {
    suspend.mutate(
      { id: volunteer.id, reason },
      {
        onSuccess: ({ rescoring }) =>
          onOutcome({
            tone: 'success',
            text: `${volunteer.displayName} is suspended. Their verdicts no longer count; ${plural(rescoring, 'snippet')} marked for rescoring.`,
          }),
        onError: (error) => {
          setConfirming(false);
          setFailed(failure(error));
        },
      },
    );
  }

  return (
    <Panel title={`Suspend ${volunteer.displayName}`}>
      {confirming ? (
        <div className="flex flex-col gap-4">
          <div className="rounded-md border-l-4 border-danger bg-danger-wash px-4 py-3 text-sm text-danger">
            <p className="font-semibold">Suspend {volunteer.displayName}?</p>
            <p className="mt-0.5">
              They can no longer sign in or judge, and none of their {plural(volunteer.verdicts, 'verdict')}{' '}
              count any more: the snippets they judged are rescored. You can restore them later.
            </p>
            <p className="mt-1.5">Reason: {reason.trim()}</p>
          </div>
          <div className="flex flex-wrap gap-3">
            <button
              ref={confirmRef}
              type="button"
              aria-busy={suspend.isPending || undefined}
              disabled={suspend.isPending}
              onClick={confirm}
              className={buttonClasses('danger')}
            >
              Yes, suspend {volunteer.displayName}
            </button>
            <Button variant="secondary" disabled={suspend.isPending} onClick={() => setConfirming(false)}>
              Back
            </Button>
          </div>
        </div>
      ) : (
        <form className="flex flex-col gap-4" onSubmit={ask} noValidate>
          <NoteField
            label="Reason"
            value={reason}
            onChange={setReason}
            limit={500}
            required
            error={problem}
          />
          <Failure text={failed} />
          <FormActions danger onCancel={onClose}>
            Suspend…
          </FormActions>
        </form>
      )}
    </Panel>
  );
}

function RestoreForm({ volunteer, onClose, onOutcome }: FormProps) {
  const restore = useRestoreVolunteer();
  const [note, setNote] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const [failed, setFailed] = useState<string | null>(null);

  function submit(event: FormEvent) {
    event.preventDefault();
    setProblem(null);
    setFailed(null);
    restore.mutate(
      { id: volunteer.id, note },
      {
        onSuccess: ({ rescoring }) =>
          onOutcome({
            tone: 'success',
            text: `${volunteer.displayName} is restored. Their verdicts count again; ${plural(rescoring, 'snippet')} marked for rescoring.`,
          }),
        onError: (error) => setFailed(failure(error)),
      },
    );
  }

  return (
    <Panel title={`Restore ${volunteer.displayName}`}>
      {volunteer.suspendedReason ? (
        <p className="text-sm text-muted">Suspended because: {volunteer.suspendedReason}</p>
      ) : null}
      <form className="flex flex-col gap-4" onSubmit={submit} noValidate>
        <NoteField
          label="Note"
          value={note}
          onChange={setNote}
          limit={500}
          required={false}
          error={problem}
        />
        <Failure text={failed} />
        <FormActions busy={restore.isPending} onCancel={onClose}>
          Restore {volunteer.displayName}
        </FormActions>
      </form>
    </Panel>
  );
}
