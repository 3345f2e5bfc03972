import { type InputHTMLAttributes, type ReactNode, useId } from 'react';
import { FieldError } from '@/components/text-field';

interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id' | 'type'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | undefined;
}

export function CheckboxField({ label, hint, error, ...rest }: CheckboxFieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(' ') || undefined;

  return (
    <div className="flex flex-col gap-1.5">
      {/* The whole row is the label, so the touch target is far bigger than the box itself. */}
      <label
        htmlFor={id}
        className="flex min-h-target cursor-pointer items-start gap-3 rounded-md border border-line bg-surface p-3 hover:border-edge"
      >
        <input
          id={id}
          type="checkbox"
          {...rest}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className="mt-0.5 size-5 shrink-0 cursor-pointer accent-ink"
        />
        <span className="flex flex-col gap-1">
          <span className="text-base font-medium text-ink">{label}</span>
          {hint ? (
            <span id={hintId} className="text-sm text-muted">
              {hint}
            </span>
          ) : null}
        </span>
      </label>
      {error ? <FieldError id={errorId}>{error}</FieldError> : null}
    </div>
  );
}
