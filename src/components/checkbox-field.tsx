import { type InputHTMLAttributes, type ReactNode, useId } from 'react';
import { FieldError } from '@/components/text-field';

interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id' | 'type'> {
  label: string;
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
      <div className="relative flex min-h-target items-start gap-3 rounded-md border border-edge bg-surface p-3 hover:border-ink has-checked:border-ink has-checked:bg-amber-wash">
        <input
          id={id}
          type="checkbox"
          {...rest}
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy}
          className="mt-0.5 size-5 shrink-0 cursor-pointer accent-ink"
        />
        <div className="flex flex-col gap-1">
          {/* The label's overlay makes the whole box the touch target, while the name stays short. */}
          <label
            htmlFor={id}
            className="cursor-pointer text-base font-medium text-ink after:absolute after:inset-0"
          >
            {label}
          </label>
          {hint ? (
            <p id={hintId} className="text-sm text-muted">
              {hint}
            </p>
          ) : null}
        </div>
      </div>
      {error ? <FieldError id={errorId}>{error}</FieldError> : null}
    </div>
  );
}
