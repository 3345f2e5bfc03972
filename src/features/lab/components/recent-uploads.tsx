import { Badge } from '@/components/badge';
import { LoadFailure } from '@/components/load-failure';
import { Loading } from '@/components/loading';
import { Table, TableBody, TableHead, Td, Th, Tr } from '@/components/table';
import { useCampaignUploads } from '../api/get-campaign-uploads';
import { formatCount, formatDateTime } from '../lib/format';
import {
  formatBytes,
  progressPercent,
  stageLabel,
  type Upload,
  uploadStatusLabels,
  uploadStatusTones,
} from '../lib/uploads';

/** The newest uploads are enough to see what happened lately; older ones live on in the counts. */
const shownUploads = 10;

export function RecentUploads({ campaignId }: { campaignId: number }) {
  const uploads = useCampaignUploads(campaignId);

  if (uploads.isPending) return <Loading label="Loading recent uploads…" />;
  if (uploads.isError) {
    return (
      <LoadFailure
        title="Could not load the recent uploads"
        error={uploads.error}
        onRetry={() => uploads.refetch()}
      />
    );
  }
  if (uploads.data.length === 0) {
    return (
      <p className="rounded-lg border border-dashed border-edge bg-surface px-4 py-5 text-base text-muted">
        No light curves uploaded yet. Files you send appear here with what the worker made of them.
      </p>
    );
  }
  const shown = uploads.data.slice(0, shownUploads);
  return (
    <div className="flex flex-col gap-2">
      <Table caption="Recent light-curve uploads, newest first">
        <TableHead>
          <Th>File</Th>
          <Th>Target</Th>
          <Th>Status</Th>
          <Th className="text-right">Snippets</Th>
          <Th className="text-right">Size</Th>
          <Th>Uploaded</Th>
        </TableHead>
        <TableBody>
          {shown.map((upload) => (
            <UploadRow key={upload.id} upload={upload} />
          ))}
        </TableBody>
      </Table>
      {uploads.data.length > shown.length ? (
        <p className="text-sm text-muted">
          Showing the newest {shown.length} of {formatCount(uploads.data.length)} uploads.
        </p>
      ) : null}
    </div>
  );
}

function UploadRow({ upload }: { upload: Upload }) {
  const stage = stageLabel(upload.stage);
  return (
    <Tr align="top">
      <Td label="File" card="block">
        <span className="flex min-w-0 flex-col">
          <span className="font-medium break-all text-ink md:break-normal">{upload.fileName}</span>
          <span className="text-xs text-muted uppercase">
            {upload.format}
            {upload.isQuietReference ? ' · quiet reference' : ''}
          </span>
          {upload.status === 'failed' && upload.error ? (
            <span className="mt-1 text-sm text-danger">{upload.error}</span>
          ) : null}
        </span>
      </Td>
      <Td label="Target">
        <span className="tabular text-ink">{upload.targetDesignation ?? '—'}</span>
      </Td>
      <Td label="Status">
        <span className="flex flex-col items-end gap-0.5 md:items-start">
          <Badge tone={uploadStatusTones[upload.status]}>{uploadStatusLabels[upload.status]}</Badge>
          {upload.status === 'processing' || upload.status === 'queued' ? (
            <span className="tabular text-xs text-muted">
              {stage ? `${stage}, ` : ''}
              {progressPercent(upload)} %
            </span>
          ) : null}
        </span>
      </Td>
      <Td label="Snippets" className="md:text-right">
        <span className="tabular text-ink">
          {upload.status === 'done' ? formatCount(upload.snippetCount) : '—'}
        </span>
      </Td>
      <Td label="Size" className="md:text-right">
        <span className="tabular text-slate md:whitespace-nowrap">{formatBytes(upload.sizeBytes)}</span>
      </Td>
      <Td label="Uploaded">
        <span className="tabular text-sm text-slate md:whitespace-nowrap">
          {formatDateTime(upload.createdAt)}
        </span>
      </Td>
    </Tr>
  );
}
