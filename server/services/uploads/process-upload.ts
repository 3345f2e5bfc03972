import fs from 'node:fs/promises';
import { findCampaignById } from '../../db/campaigns';
import type { Db } from '../../db/knex';
import { findTargetByDesignation } from '../../db/targets';
import { findUploadById, updateUpload } from '../../db/uploads';
import { readLightCurve } from '../../science/readers/read-light-curve';
import { type LightCurve, ScienceInputError } from '../../science/types';
import { ingestLightCurve } from '../ingest/ingest-light-curve';

export type ProgressReporter = (percent: number, stage: string) => Promise<void>;

/** Times must increase from row to row; a file that repeats or reorders them is refused, naming the row. */
export function checkTimesIncrease(lightCurve: LightCurve): void {
  let previous = Number.NEGATIVE_INFINITY;
  let previousRow = 0;
  for (let i = 0; i < lightCurve.timeDays.length; i += 1) {
    const time = lightCurve.timeDays[i]!;
    if (!Number.isFinite(time)) continue;
    if (time === previous) {
      throw new ScienceInputError(`Duplicate time ${time} in data rows ${previousRow + 1} and ${i + 1}`);
    }
    if (time < previous) {
      throw new ScienceInputError(
        `Times are not in increasing order: data row ${i + 1} (${time}) comes before row ${previousRow + 1} (${previous})`,
      );
    }
    previous = time;
    previousRow = i;
  }
}

/**
 * Ingests one recorded upload: read the stored file, find its target, and run the ingestion story. A
 * problem with the file itself (unreadable, no target, bad times) marks the upload failed with the
 * reader's message and is not retried; any other error is thrown so that the queue retries it. Running
 * it again on a finished upload changes nothing.
 */
export async function processUpload(
  db: Db,
  uploadId: number,
  report: ProgressReporter,
): Promise<'done' | 'failed' | 'skipped'> {
  const upload = await findUploadById(db, uploadId);
  if (!upload || upload.status === 'done' || upload.status === 'failed') return 'skipped';
  const progress = async (percent: number, stage: string) => {
    await updateUpload(db, uploadId, { status: 'processing', stage, progress: percent / 100 });
    await report(percent, stage);
  };
  try {
    await progress(2, 'reading');
    const campaign = await findCampaignById(db, upload.campaignId);
    if (!campaign || campaign.status === 'closed') throw new ScienceInputError('The campaign is closed');
    const bytes = await fs.readFile(upload.storagePath);
    const lightCurve = readLightCurve(bytes, { format: upload.format });
    checkTimesIncrease(lightCurve);
    const designation = upload.targetHint ?? lightCurve.objectName;
    if (!designation) {
      throw new ScienceInputError(
        'The file names no target (no OBJECT keyword or object column): choose the target when uploading',
      );
    }
    const target = await findTargetByDesignation(db, upload.campaignId, designation);
    if (!target) {
      throw new ScienceInputError(
        `No target "${designation}" in this campaign's catalogue: upload the catalogue first`,
      );
    }
    const result = await ingestLightCurve(db, {
      campaign,
      target,
      lightCurve,
      contentHash: upload.contentHash,
      uploadId,
      isQuietReference: upload.isQuietReference,
      onProgress: progress,
    });
    await updateUpload(db, uploadId, {
      status: 'done',
      stage: 'done',
      progress: 1,
      snippetCount: result.snippetCount,
      error: null,
    });
    return 'done';
  } catch (error) {
    if (!(error instanceof ScienceInputError)) throw error;
    await updateUpload(db, uploadId, { status: 'failed', error: error.message });
    return 'failed';
  }
}

/** After the queue's last attempt: the upload is failed with the error, so nobody waits for it. */
export async function failUpload(db: Db, uploadId: number, message: string): Promise<void> {
  await updateUpload(db, uploadId, { status: 'failed', error: message });
}
