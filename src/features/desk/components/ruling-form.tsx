import { type RefObject, useId } from 'react';
import { Alert } from '@/components/alert';
import { formatCount } from '../lib/format';
import { reviewShortcuts } from '../lib/review-keys';
import {
  type RulingValue,
  rulingLabels,
  rulingValues,
  type SnippetState,
  snippetStateLabels,
} from '../lib/splits';

export const noteLimit = 2000;

const rulingKeys: Record<RulingValue, string> = { dip: 'D', flat: 'F', systematic: 'S' };

const rulingStyles: Record<RulingValue, string> = {
  dip: 'border-amber bg-amber-wash text-amber-ink hover:bg-amber hover:text-ink',
  flat: 'border-slate bg-slate-wash text-slate hover:bg-slate hover:text-paper',
  systematic: 'border-edge bg-surface text-ink hover:border-ink hover:bg-paper',
};

const rulingHints: Record<RulingValue, string> = {
  dip: 'a transit-like dip',
  flat: 'no dip',
  systematic: 'an instrumental feature',
};

interface RulingFormProps {
  state: SnippetState;
  note: string;
  onNote: (note: string) => void;
  noteRef: RefObject<HTMLTextAreaElement | null>;
  onRule: (ruling: RulingValue) => void;
  /** The ruling being sent, if one is. */
  pending: RulingValue | null;
  error: string | null;
}

/** Dip, flat or systematic, with an optional note; every button has its key, shown on it. */
export function RulingForm({ state, note, onNote, noteRef, onRule, pending, error }: RulingFormProps) {
  const headingId = useId();
  const noteId = useId();
  const hintId = useId();

  return (
    <section
      aria-labelledby={headingId}
      className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4 md:p-5"
    >
      <div className="flex flex-col gap-1">
        <h2 id={headingId} className="text-lg font-semibold text-ink">
          Your ruling
        </h2>
        <p className="text-sm text-muted">
          Systematic means an instrumental feature: it counts as no transit. Your ruling settles the snippet
          and feeds every volunteer’s reliability.
        </p>
      </div>
      {state !== 'split' ? (
        <Alert tone="note">
          This snippet is {snippetStateLabels[state].toLowerCase()}, not split.{' '}
          {state === 'ruled' ? 'A new ruling replaces the earlier one.' : 'A ruling overrides its consensus.'}
        </Alert>
      ) : null}
      <fieldset className="grid grid-cols-3 gap-2">
        <legend className="sr-only">Rule this snippet</legend>
        {rulingValues.map((ruling) => (
          <button
            key={ruling}
            type="button"
            disabled={pending !== null}
            aria-busy={pending === ruling || undefined}
            aria-keyshortcuts={rulingKeys[ruling]}
            title={`${rulingLabels[ruling]}: ${rulingHints[ruling]} (${rulingKeys[ruling]})`}
            onClick={() => onRule(ruling)}
            className={`flex min-h-14 flex-col items-center justify-center gap-0.5 rounded-md border-2 px-1 py-1.5 font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${rulingStyles[ruling]}`}
          >
            <span className="flex items-center gap-1.5 text-base">
              {pending === ruling ? (
                <span
                  aria-hidden="true"
                  className="size-3 animate-spin rounded-full border-2 border-current border-r-transparent"
                />
              ) : null}
              {rulingLabels[ruling]}
            </span>
            <span aria-hidden="true" className="tabular text-xs font-normal">
              {rulingKeys[ruling]}
            </span>
          </button>
        ))}
      </fieldset>
      <div className="flex flex-col gap-1.5">
        <label htmlFor={noteId} className="flex items-center justify-between text-sm font-medium text-ink">
          <span>Note (optional)</span>
          <span
            aria-hidden="true"
            className="tabular rounded-sm border border-edge px-1.5 text-xs font-normal text-muted"
          >
            N
          </span>
        </label>
        <textarea
          id={noteId}
          ref={noteRef}
          value={note}
          rows={3}
          maxLength={noteLimit}
          aria-keyshortcuts="N"
          aria-describedby={hintId}
          onChange={(event) => onNote(event.target.value)}
          className="block min-h-24 w-full rounded-md border border-edge bg-paper px-3 py-2 text-base text-ink hover:border-ink"
        />
        <p id={hintId} className="flex justify-between gap-3 text-xs text-muted">
          <span>
            Kept with the ruling in the audit log. Esc leaves the note; letters typed here never rule.
          </span>
          <span className="tabular shrink-0">
            {formatCount(note.length)} / {formatCount(noteLimit)}
          </span>
        </p>
      </div>
      {error ? (
        <Alert tone="danger" title="The ruling was not recorded">
          {error}
        </Alert>
      ) : null}
      <KeyboardHelp />
    </section>
  );
}

function KeyboardHelp() {
  return (
    <div className="flex flex-col gap-1.5 border-t border-line pt-3">
      <p className="text-xs font-semibold tracking-[0.08em] text-muted uppercase">Keyboard</p>
      <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-sm">
        {reviewShortcuts.map((shortcut) => (
          <div key={shortcut.does} className="flex items-center gap-2">
            <dt className="flex gap-1">
              {shortcut.keys.map((key) => (
                <kbd
                  key={key}
                  className="tabular inline-flex min-w-6 justify-center rounded-sm border border-edge bg-paper px-1 text-xs text-ink"
                >
                  {key}
                </kbd>
              ))}
            </dt>
            <dd className="text-muted">{shortcut.does}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
