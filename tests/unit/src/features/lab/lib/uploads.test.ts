import { describe, expect, it } from 'vitest';
import {
  formatBytes,
  isUploadFinished,
  lightCurveFileProblems,
  progressPercent,
  stageLabel,
} from '@/features/lab/lib/uploads';

describe('progressPercent', () => {
  it('turns the 0–1 progress into a whole percent, clamped, and a done upload into 100', () => {
    expect(progressPercent({ status: 'processing', progress: 0.554 })).toBe(55);
    expect(progressPercent({ status: 'processing', progress: 1.7 })).toBe(100);
    expect(progressPercent({ status: 'queued', progress: -0.2 })).toBe(0);
    expect(progressPercent({ status: 'done', progress: 0.85 })).toBe(100);
  });
});

describe('isUploadFinished', () => {
  it('stops polling at done and failed only', () => {
    expect(
      ['queued', 'processing', 'done', 'failed'].map((status) => isUploadFinished(status as never)),
    ).toEqual([false, false, true, true]);
  });
});

describe('stageLabel', () => {
  it('keeps the worker’s phrases and makes machine words readable', () => {
    expect(stageLabel('cutting snippets')).toBe('cutting snippets');
    expect(stageLabel('detrend')).toBe('detrending');
    expect(stageLabel('fit_model')).toBe('fit model');
    expect(stageLabel(null)).toBeNull();
  });
});

describe('lightCurveFileProblems', () => {
  it('refuses no files, too many, empty, too large and unknown types before anything is sent', () => {
    expect(lightCurveFileProblems([])).toEqual(['Choose at least one light-curve file.']);
    expect(
      lightCurveFileProblems(Array.from({ length: 21 }, (_, i) => ({ name: `${i}.csv`, size: 10 }))),
    ).toEqual(['Send at most 20 files at a time; you chose 21.']);
    expect(
      lightCurveFileProblems([
        { name: 'empty.fits', size: 0 },
        { name: 'huge.csv', size: 150_000_000 },
        { name: 'notes.docx', size: 10 },
        { name: 'fine.FITS', size: 10 },
      ]),
    ).toEqual([
      'empty.fits is empty.',
      'huge.csv is 150 MB; at most 100 MB a file.',
      'notes.docx is not a CSV or FITS file.',
    ]);
  });
});

describe('formatBytes', () => {
  it('writes sizes in decimal units', () => {
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(109_440)).toBe('109 kB');
    expect(formatBytes(2_500_000)).toBe('2.5 MB');
  });
});
