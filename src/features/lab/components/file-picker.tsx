import { type InputHTMLAttributes, useId } from 'react';
import { FieldError } from '@/components/text-field';
import { formatBytes } from '../lib/uploads';

interface FilePickerProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type' | 'id' | 'onChange'> {
  label: string;
  hint: string;
  files: readonly File[];
  onFiles: (files: File[]) => void;
  error?: string | undefined;
}

/**
 * A native file input, kept native so keyboards, screen readers and phones' own pickers all work, in a
 * large dashed box that is the touch target; the chosen files are listed with their sizes.
 */
export function FilePicker({ label, hint, files, onFiles, error, ...rest }: FilePickerProps) {
  const id = useId();
  const describedBy = [`${id}-hint`, error ? `${id}-error` : null].filter(Boolean).join(' ');
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-ink">
        {label}
      </label>
      <div
        className={`relative flex flex-col gap-2 rounded-md border-2 border-dashed bg-paper/60 p-3 hover:border-ink has-focus-visible:border-amber ${
          error ? 'border-danger' : 'border-edge'
        }`}
      >
        <input
          id={id}
          type="file"
          {...rest}
          aria-describedby={describedBy}
          aria-invalid={error ? true : undefined}
          onChange={(event) => onFiles(Array.from(event.target.files ?? []))}
          className="block min-h-target w-full cursor-pointer text-sm text-muted file:mr-3 file:min-h-target file:cursor-pointer file:rounded-md file:border file:border-edge file:bg-surface file:px-4 file:text-base file:font-medium file:text-ink hover:file:border-ink"
        />
        {files.length > 0 ? (
          <ul className="flex flex-col gap-1 border-t border-line pt-2">
            {files.map((file) => (
              <li key={`${file.name}-${file.size}`} className="flex justify-between gap-3 text-sm">
                <span className="min-w-0 truncate text-ink">{file.name}</span>
                <span className="tabular shrink-0 text-slate">{formatBytes(file.size)}</span>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
      <p id={`${id}-hint`} className="text-sm text-muted">
        {hint}
      </p>
      {error ? <FieldError id={`${id}-error`}>{error}</FieldError> : null}
    </div>
  );
}
