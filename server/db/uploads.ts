import type { Knex } from 'knex';
import type { Db } from './knex';
import { nowIso, toBool, toIso } from './rows';

export type UploadStatus = 'queued' | 'processing' | 'done' | 'failed';

export interface UploadRow {
  id: number;
  campaignId: number;
  uploadedBy: number | null;
  contentHash: string;
  originalName: string;
  format: 'csv' | 'fits';
  sizeBytes: number;
  storagePath: string;
  targetHint: string | null;
  isQuietReference: boolean;
  status: UploadStatus;
  stage: string | null;
  progress: number;
  error: string | null;
  jobId: string | null;
  snippetCount: number;
  createdAt: string;
  updatedAt: string;
}

type Raw = Record<string, unknown>;

function toUpload(row: Raw): UploadRow {
  return {
    id: Number(row.id),
    campaignId: Number(row.campaign_id),
    uploadedBy: row.uploaded_by === null ? null : Number(row.uploaded_by),
    contentHash: String(row.content_hash),
    originalName: String(row.original_name),
    format: row.format as 'csv' | 'fits',
    sizeBytes: Number(row.size_bytes),
    storagePath: String(row.storage_path),
    targetHint: (row.target_hint as string | null) ?? null,
    isQuietReference: toBool(row.is_quiet_reference),
    status: row.status as UploadStatus,
    stage: (row.stage as string | null) ?? null,
    progress: Number(row.progress),
    error: (row.error as string | null) ?? null,
    jobId: (row.job_id as string | null) ?? null,
    snippetCount: Number(row.snippet_count),
    createdAt: toIso(row.created_at),
    updatedAt: toIso(row.updated_at),
  };
}

export interface NewUpload {
  campaignId: number;
  uploadedBy: number | null;
  contentHash: string;
  originalName: string;
  format: 'csv' | 'fits';
  sizeBytes: number;
  storagePath: string;
  targetHint: string | null;
  isQuietReference: boolean;
}

/** Inserts an upload, or answers the campaign's existing upload of the same file (same hash). */
export async function insertUpload(
  db: Db | Knex.Transaction,
  upload: NewUpload,
): Promise<{ upload: UploadRow; duplicate: boolean }> {
  const now = nowIso();
  const rows = await db('uploads')
    .insert({
      campaign_id: upload.campaignId,
      uploaded_by: upload.uploadedBy,
      content_hash: upload.contentHash,
      original_name: upload.originalName,
      format: upload.format,
      size_bytes: upload.sizeBytes,
      storage_path: upload.storagePath,
      target_hint: upload.targetHint,
      is_quiet_reference: upload.isQuietReference,
      status: 'queued',
      progress: 0,
      created_at: now,
      updated_at: now,
    })
    .onConflict(['campaign_id', 'content_hash'])
    .ignore()
    .returning('*');
  if (rows[0]) return { upload: toUpload(rows[0]), duplicate: false };
  const existing = await db('uploads')
    .where({ campaign_id: upload.campaignId, content_hash: upload.contentHash })
    .first();
  return { upload: toUpload(existing), duplicate: true };
}

export async function findUploadById(db: Db | Knex.Transaction, id: number): Promise<UploadRow | undefined> {
  const row = await db('uploads').where({ id }).first();
  return row ? toUpload(row) : undefined;
}

export async function updateUpload(
  db: Db | Knex.Transaction,
  id: number,
  changes: Partial<Pick<UploadRow, 'status' | 'stage' | 'progress' | 'error' | 'jobId' | 'snippetCount'>>,
): Promise<void> {
  const columns: Raw = { updated_at: nowIso() };
  if (changes.status !== undefined) columns.status = changes.status;
  if (changes.stage !== undefined) columns.stage = changes.stage;
  if (changes.progress !== undefined) columns.progress = changes.progress;
  if (changes.error !== undefined) columns.error = changes.error;
  if (changes.jobId !== undefined) columns.job_id = changes.jobId;
  if (changes.snippetCount !== undefined) columns.snippet_count = changes.snippetCount;
  await db('uploads').where({ id }).update(columns);
}

export async function listUploads(db: Db, campaignId: number, limit = 50): Promise<UploadRow[]> {
  const rows = await db('uploads').where({ campaign_id: campaignId }).orderBy('id', 'desc').limit(limit);
  return rows.map(toUpload);
}

/** Uploads still waiting or running whose row has not moved for a while: candidates for the sweeper. */
export async function listStaleUploads(db: Db, olderThanIso: string): Promise<UploadRow[]> {
  const rows = await db('uploads')
    .whereIn('status', ['queued', 'processing'])
    .andWhere('updated_at', '<', olderThanIso);
  return rows.map(toUpload);
}
