import type { Db } from '../../db/knex';
import { findUploadById, listUploads, type UploadRow } from '../../db/uploads';
import { notFound } from '../../errors';

/** What scripts and the Lab read about an upload (the field names are part of the API contract). */
export interface UploadView {
  id: number;
  campaignId: number;
  fileName: string;
  sizeBytes: number;
  format: 'csv' | 'fits';
  status: UploadRow['status'];
  stage: string | null;
  /** 0–1. */
  progress: number;
  error: string | null;
  snippetCount: number;
  targetDesignation: string | null;
  isQuietReference: boolean;
  createdAt: string;
  updatedAt: string;
}

export function toUploadView(
  upload: UploadRow,
  targetDesignation: string | null = upload.targetHint,
): UploadView {
  return {
    id: upload.id,
    campaignId: upload.campaignId,
    fileName: upload.originalName,
    sizeBytes: upload.sizeBytes,
    format: upload.format,
    status: upload.status,
    stage: upload.stage,
    progress: upload.progress,
    error: upload.error,
    snippetCount: upload.snippetCount,
    targetDesignation,
    isQuietReference: upload.isQuietReference,
    createdAt: upload.createdAt,
    updatedAt: upload.updatedAt,
  };
}

async function designationOf(db: Db, upload: UploadRow): Promise<string | null> {
  const row = await db('light_curves')
    .join('targets', 'targets.id', 'light_curves.target_id')
    .where('light_curves.upload_id', upload.id)
    .first('targets.designation');
  return (row?.designation as string | undefined) ?? upload.targetHint;
}

export async function getUpload(db: Db, id: number): Promise<UploadView> {
  const upload = await findUploadById(db, id);
  if (!upload) throw notFound('Upload');
  return toUploadView(upload, await designationOf(db, upload));
}

export async function listCampaignUploads(db: Db, campaignId: number): Promise<UploadView[]> {
  const uploads = await listUploads(db, campaignId);
  return Promise.all(uploads.map(async (upload) => toUploadView(upload, await designationOf(db, upload))));
}
