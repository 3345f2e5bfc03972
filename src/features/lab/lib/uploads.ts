import { z } from 'zod';

export const uploadStatuses = ['queued', 'processing', 'done', 'failed'] as const;
export type UploadStatus = (typeof uploadStatuses)[number];

export const uploadSchema = z.object({
  id: z.number().int(),
  campaignId: z.number().int(),
  fileName: z.string(),
  sizeBytes: z.number(),
  format: z.string(),
  status: z.enum(uploadStatuses),
  stage: z.string().nullable(),
  progress: z.number(),
  error: z.string().nullable(),
  snippetCount: z.number().int(),
  targetDesignation: z.string().nullable(),
  isQuietReference: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});

export type Upload = z.infer<typeof uploadSchema>;

/** What the upload answer says about each file it accepted; the rest comes from polling the upload. */
export const acceptedUploadSchema = z.object({
  id: z.number().int(),
  fileName: z.string(),
  status: z.enum(uploadStatuses),
  duplicate: z.boolean(),
});

export type AcceptedUpload = z.infer<typeof acceptedUploadSchema>;

/** How often a file still being read is asked about: often enough that the bar moves smoothly. */
export const uploadPollMs = 1_000;

export function isUploadFinished(status: UploadStatus): boolean {
  return status === 'done' || status === 'failed';
}

export const uploadStatusLabels: Record<UploadStatus, string> = {
  queued: 'Waiting',
  processing: 'Reading',
  done: 'Done',
  failed: 'Failed',
};

export const uploadStatusTones = {
  queued: 'slate',
  processing: 'amber',
  done: 'success',
  failed: 'danger',
} as const satisfies Record<UploadStatus, 'slate' | 'amber' | 'success' | 'danger'>;

/** The worker reports stages as short machine words ("detrend"); people read a phrase. */
export function stageLabel(stage: string | null): string | null {
  if (!stage) return null;
  const known: Record<string, string> = {
    queued: 'waiting for a worker',
    read: 'reading the file',
    reading: 'reading the file',
    parse: 'reading the file',
    clean: 'cleaning',
    cleaning: 'cleaning',
    detrend: 'detrending',
    detrending: 'detrending',
    snippets: 'cutting snippets',
    cut: 'cutting snippets',
    plant: 'planting controls',
    planting: 'planting controls',
    controls: 'making controls',
    save: 'saving',
    saving: 'saving',
    store: 'saving',
    done: 'finished',
  };
  return known[stage.toLowerCase()] ?? stage.replace(/[_-]+/g, ' ');
}

/** 0–1 from the server, clamped: a bar past its end or below zero reads as a bug. */
export function progressPercent(upload: Pick<Upload, 'status' | 'progress'>): number {
  if (upload.status === 'done') return 100;
  const percent = Math.round(upload.progress * 100);
  return Math.min(100, Math.max(0, Number.isFinite(percent) ? percent : 0));
}

const byteUnits = ['B', 'kB', 'MB', 'GB'] as const;

export function formatBytes(sizeBytes: number): string {
  let value = sizeBytes;
  let unit = 0;
  while (value >= 1000 && unit < byteUnits.length - 1) {
    value /= 1000;
    unit += 1;
  }
  const digits = unit === 0 || value >= 100 ? 0 : 1;
  return `${value.toFixed(digits)} ${byteUnits[unit]}`;
}

/** The limits the server sets on one light-curve request (it checks them too). */
export const lightCurveUploadLimits = {
  maxFiles: 20,
  maxBytesPerFile: 100 * 1000 * 1000,
  extensions: ['.csv', '.tsv', '.txt', '.fits', '.fit', '.fts'],
} as const;

/** Problems found before sending, so nobody waits for a 100 MB upload to be refused. */
export function lightCurveFileProblems(files: readonly Pick<File, 'name' | 'size'>[]): string[] {
  const problems: string[] = [];
  if (files.length === 0) problems.push('Choose at least one light-curve file.');
  if (files.length > lightCurveUploadLimits.maxFiles) {
    problems.push(
      `Send at most ${lightCurveUploadLimits.maxFiles} files at a time; you chose ${files.length}.`,
    );
  }
  for (const file of files) {
    const name = file.name.toLowerCase();
    if (!lightCurveUploadLimits.extensions.some((extension) => name.endsWith(extension))) {
      problems.push(`${file.name} is not a CSV or FITS file.`);
    } else if (file.size === 0) {
      problems.push(`${file.name} is empty.`);
    } else if (file.size > lightCurveUploadLimits.maxBytesPerFile) {
      problems.push(`${file.name} is ${formatBytes(file.size)}; at most 100 MB a file.`);
    }
  }
  return problems;
}
