import { Badge } from '@/components/badge';
import { isApiError } from '@/lib/api-client';
import { useUploadProgress } from '../api/get-upload';
import { plural } from '../lib/format';
import {
  type AcceptedUpload,
  formatBytes,
  progressPercent,
  stageLabel,
  uploadStatusLabels,
  uploadStatusTones,
} from '../lib/uploads';

interface UploadProgressProps {
  accepted: AcceptedUpload;
  campaignId: number;
}

/** One file's way through the worker: a bar with its stage, and the reader's message if it failed. */
export function UploadProgress({ accepted, campaignId }: UploadProgressProps) {
  const upload = useUploadProgress(accepted.id, campaignId);
  const data = upload.data;
  const status = data?.status ?? accepted.status;
  const percent = data ? progressPercent(data) : 0;
  const stage = stageLabel(data?.stage ?? null);
  const failed = status === 'failed';
  const done = status === 'done';
  const valueText = `${uploadStatusLabels[status]}${stage && !done && !failed ? `, ${stage}` : ''}, ${percent} %`;

  return (
    <li
      className="flex flex-col gap-2 rounded-md border border-line bg-surface p-3"
      data-upload-id={accepted.id}
      data-status={status}
    >
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <span className="min-w-0 truncate font-medium text-ink">{accepted.fileName}</span>
        <span className="flex items-center gap-2">
          <span className="tabular text-sm text-slate">{percent} %</span>
          <Badge tone={uploadStatusTones[status]}>{uploadStatusLabels[status]}</Badge>
        </span>
      </div>
      <div
        role="progressbar"
        aria-label={`Progress of ${accepted.fileName}`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        aria-valuetext={valueText}
        className="h-2.5 overflow-hidden rounded-full bg-slate-wash"
      >
        <div
          className={`h-full rounded-full transition-[width] duration-500 ${
            failed ? 'bg-danger' : done ? 'bg-success' : 'bg-amber'
          }`}
          style={{ width: `${failed ? Math.max(percent, 4) : percent}%` }}
        />
      </div>
      <p className="flex flex-wrap gap-x-3 gap-y-1 text-sm text-muted">
        {done && data ? (
          <span>
            {plural(data.snippetCount, 'snippet')} cut
            {data.targetDesignation ? (
              <>
                {' '}
                for <span className="tabular text-ink">{data.targetDesignation}</span>
              </>
            ) : null}
          </span>
        ) : failed ? null : (
          <span>{stage ? `${stage[0]?.toUpperCase()}${stage.slice(1)}…` : 'Waiting for a worker…'}</span>
        )}
        {data ? <span className="tabular">{formatBytes(data.sizeBytes)}</span> : null}
        {data?.isQuietReference ? <span>quiet reference</span> : null}
        {accepted.duplicate ? (
          <span>the same file was uploaded before; its earlier result is shown</span>
        ) : null}
      </p>
      {failed ? (
        <p className="rounded-md bg-danger-wash px-3 py-2 text-sm font-medium text-danger">
          {data?.error ?? 'The file could not be read.'}
        </p>
      ) : null}
      {upload.isError ? (
        <p className="text-sm text-danger">
          Could not ask about this upload:{' '}
          {isApiError(upload.error) ? upload.error.message : 'something went wrong.'}
        </p>
      ) : null}
      <p className="sr-only" aria-live="polite">
        {done
          ? `${accepted.fileName} is done.`
          : failed
            ? `${accepted.fileName} failed: ${data?.error ?? ''}`
            : ''}
      </p>
    </li>
  );
}
