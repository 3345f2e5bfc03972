import { type FormEvent, useId, useRef, useState } from 'react';
import { Alert } from '@/components/alert';
import { Button } from '@/components/button';
import { CheckboxField } from '@/components/checkbox-field';
import { TextField } from '@/components/text-field';
import { isApiError } from '@/lib/api-client';
import { useTargets } from '../api/get-targets';
import { useUploadLightCurves } from '../api/upload-light-curves';
import { type AcceptedUpload, lightCurveFileProblems, lightCurveUploadLimits } from '../lib/uploads';
import { FilePicker } from './file-picker';
import { UploadProgress } from './upload-progress';

interface LightCurveUploadProps {
  campaignId: number;
  disabled: boolean;
}

export function LightCurveUpload({ campaignId, disabled }: LightCurveUploadProps) {
  const upload = useUploadLightCurves();
  const [files, setFiles] = useState<File[]>([]);
  const [target, setTarget] = useState('');
  const [quietReference, setQuietReference] = useState(false);
  const [fileProblem, setFileProblem] = useState<string | undefined>();
  // Every file sent from this page stays listed, newest first, so several uploads can be watched at once.
  const [sent, setSent] = useState<AcceptedUpload[]>([]);
  const formRef = useRef<HTMLFormElement>(null);
  const listId = useId();
  // The datalist only suggests; a designation typed in full is checked by the server.
  const targets = useTargets({ campaignId, q: '', page: 1, pageSize: 100 });

  function submit(event: FormEvent) {
    event.preventDefault();
    const problems = lightCurveFileProblems(files);
    if (problems.length > 0) {
      setFileProblem(problems.join(' '));
      return;
    }
    setFileProblem(undefined);
    upload.mutate(
      { campaignId, files, target, quietReference },
      {
        onSuccess: (accepted) => {
          setSent((current) => [
            ...accepted,
            ...current.filter((item) => !accepted.some((fresh) => fresh.id === item.id)),
          ]);
          setFiles([]);
          setTarget('');
          setQuietReference(false);
          formRef.current?.reset();
        },
      },
    );
  }

  const fields = isApiError(upload.error) ? upload.error.fields : {};
  const generalError =
    upload.isError && !fields.target && !fields.files
      ? isApiError(upload.error)
        ? upload.error.message
        : 'Something went wrong.'
      : null;

  return (
    <div className="flex flex-col gap-5">
      <form ref={formRef} noValidate onSubmit={submit} className="flex flex-col gap-4">
        <FilePicker
          label="Light-curve files"
          hint={`CSV (time, flux, flux_err) or FITS binary tables; up to ${lightCurveUploadLimits.maxFiles} files of at most 100 MB each.`}
          accept=".csv,.tsv,.txt,.fits,.fit,.fts"
          multiple
          files={files}
          onFiles={(chosen) => {
            setFiles(chosen);
            setFileProblem(undefined);
          }}
          error={fileProblem ?? fields.files}
          disabled={disabled}
        />
        <TextField
          label="Target"
          hint="The designation of the star these files observe. Leave empty to take it from each file (FITS OBJECT keyword)."
          value={target}
          onChange={(event) => setTarget(event.target.value)}
          list={listId}
          autoComplete="off"
          spellCheck={false}
          error={fields.target}
          disabled={disabled}
          className="[&_input]:tabular"
        />
        <datalist id={listId}>
          {targets.data?.targets.map((item) => (
            <option key={item.id} value={item.designation} />
          ))}
        </datalist>
        <CheckboxField
          label="Quiet reference"
          hint="These light curves are known to hold no dip; quiet controls are cut from them."
          checked={quietReference}
          onChange={(event) => setQuietReference(event.target.checked)}
          disabled={disabled}
        />
        <div>
          <Button type="submit" busy={upload.isPending} disabled={disabled}>
            Upload light curves
          </Button>
        </div>
      </form>

      <div aria-live="polite" className="empty:hidden">
        {generalError ? (
          <Alert tone="danger" title="The files were not accepted">
            {generalError}
          </Alert>
        ) : null}
      </div>

      {sent.length > 0 ? (
        <section aria-labelledby={`${listId}-progress`} className="flex flex-col gap-2">
          <h3 id={`${listId}-progress`} className="text-base font-semibold text-ink">
            Sent from this page
          </h3>
          <ul className="flex flex-col gap-2">
            {sent.map((accepted) => (
              <UploadProgress key={accepted.id} accepted={accepted} campaignId={campaignId} />
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
