import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { enqueue, type Queues } from '../../../worker/queues';
import { findCampaignById } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import type { PersonRow } from '../../db/people';
import { findTargetByDesignation } from '../../db/targets';
import { insertUpload, updateUpload } from '../../db/uploads';
import { AppError, notFound } from '../../errors';
import { toUploadView, type UploadView } from './upload-view';

export interface IncomingFile {
  /** Where multer wrote it (DATA_DIR/uploads/incoming). */
  path: string;
  originalName: string;
  sizeBytes: number;
}

const FITS_EXTENSIONS = ['.fits', '.fit', '.fts'];
const TEXT_EXTENSIONS = ['.csv', '.tsv', '.txt', '.dat', '.tbl'];

/** FITS by its first card, text by extension and the absence of NUL bytes; anything else is refused. */
function detectFormat(file: IncomingFile): 'csv' | 'fits' | null {
  const head = Buffer.alloc(4096);
  const fd = fs.openSync(file.path, 'r');
  let read = 0;
  try {
    read = fs.readSync(fd, head, 0, head.length, 0);
  } finally {
    fs.closeSync(fd);
  }
  const start = head.subarray(0, read);
  const extension = path.extname(file.originalName).toLowerCase();
  if (start.subarray(0, 9).toString('latin1') === 'SIMPLE  =') return 'fits';
  if (FITS_EXTENSIONS.includes(extension)) return null; // says FITS, is not
  const gzip = start[0] === 0x1f && start[1] === 0x8b;
  if (!gzip && !start.includes(0) && (TEXT_EXTENSIONS.includes(extension) || extension === '')) return 'csv';
  return null;
}

async function sha256(file: string): Promise<string> {
  const hash = createHash('sha256');
  for await (const chunk of fs.createReadStream(file)) hash.update(chunk as Buffer);
  return hash.digest('hex');
}

/**
 * Takes uploaded light-curve files into a campaign: every file is checked first (so one bad file stores
 * nothing), then kept under DATA_DIR/uploads by content hash, recorded as an upload and queued for
 * ingestion. The same file uploaded again is recognised and answered as a duplicate, never ingested twice.
 */
export async function createUploads(
  db: Db,
  queues: Queues | undefined,
  dataDir: string,
  actor: PersonRow,
  campaignId: number,
  files: IncomingFile[],
  options: { target?: string | undefined; quietReference: boolean },
): Promise<(UploadView & { duplicate: boolean })[]> {
  try {
    if (!queues)
      throw new AppError('queues_unavailable', 'The background queues are not running', 'unavailable');
    const campaign = await findCampaignById(db, campaignId);
    if (!campaign) throw notFound('Campaign');
    if (campaign.status === 'closed') {
      throw new AppError(
        'campaign_closed',
        'This campaign is closed and takes no more light curves',
        'conflict',
      );
    }
    if (files.length === 0) {
      throw new AppError('no_files', 'Attach at least one light-curve file', 'invalid', {
        files: 'Attach a file',
      });
    }
    if (options.target && !(await findTargetByDesignation(db, campaignId, options.target))) {
      throw new AppError(
        'unknown_target',
        `No target "${options.target}" in this campaign's catalogue`,
        'invalid',
        {
          target:
            'Not in the catalogue: upload the catalogue first, or leave empty to take the name from the file',
        },
      );
    }
    const formats = files.map((file) => {
      // The name comes from the multipart part's header, past the route's validation; PostgreSQL's text
      // cannot hold U+0000, so it is refused here as everywhere else.
      if (file.originalName.includes('\u0000')) {
        throw new AppError('validation_failed', 'A file name holds the NUL character (U+0000)', 'invalid', {
          files: 'The file name must not contain the NUL character (U+0000)',
        });
      }
      if (file.sizeBytes === 0) {
        throw new AppError('empty_file', `${file.originalName} is empty`, 'invalid', {
          files: `${file.originalName} is empty`,
        });
      }
      const format = detectFormat(file);
      if (!format) {
        throw new AppError(
          'unsupported_file_type',
          `${file.originalName} is neither a FITS file nor a CSV/TSV text table`,
          'unsupported_type',
          { files: `${file.originalName}: send FITS (.fits) or CSV/TSV text` },
        );
      }
      return format;
    });

    const storeDir = path.join(dataDir, 'uploads');
    const results: (UploadView & { duplicate: boolean })[] = [];
    for (const [index, file] of files.entries()) {
      const contentHash = await sha256(file.path);
      const storagePath = path.join(storeDir, contentHash);
      if (!fs.existsSync(storagePath)) fs.renameSync(file.path, storagePath);
      const { upload, duplicate } = await insertUpload(db, {
        campaignId,
        uploadedBy: actor.id,
        contentHash,
        originalName: file.originalName.slice(0, 255),
        format: formats[index]!,
        sizeBytes: file.sizeBytes,
        storagePath,
        targetHint: options.target ?? null,
        isQuietReference: options.quietReference,
      });
      if (!duplicate) {
        // The upload row is the record of the work; the sweeper re-queues it if this job is ever lost.
        const jobRef = await enqueue(
          queues,
          'ingest',
          'upload',
          { uploadId: upload.id, requestedBy: actor.id },
          {
            jobId: `upload-${upload.id}`,
          },
        );
        await updateUpload(db, upload.id, { jobId: jobRef });
      }
      results.push({ ...toUploadView(upload, options.target ?? null), duplicate });
    }
    return results;
  } finally {
    for (const file of files) fs.rm(file.path, { force: true }, () => {});
  }
}
