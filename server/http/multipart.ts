import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from '../errors';

// The one place that parses multipart uploads. Files go to DATA_DIR/uploads/incoming (never under the
// web root) and are moved or removed by the service that takes them.

export const MAX_LIGHT_CURVE_BYTES = 100 * 1024 * 1024;
export const MAX_FILES_PER_REQUEST = 20;
export const MAX_CATALOGUE_BYTES = 10 * 1024 * 1024;

export const incomingDir = (dataDir: string) => path.join(dataDir, 'uploads', 'incoming');

function translate(error: unknown, field: string): unknown {
  if (!(error instanceof multer.MulterError)) {
    // busboy's own errors ("Unexpected end of form", "Malformed part header", "Multipart: Boundary not
    // found") say the body is not well-formed multipart; errors with a syscall come from writing the
    // file to disk, which is ours to answer for.
    if (error instanceof Error && !('syscall' in error)) {
      return new AppError(
        'bad_multipart',
        `The multipart body could not be read: ${error.message}`,
        'invalid',
      );
    }
    return error;
  }
  switch (error.code) {
    case 'LIMIT_FILE_SIZE':
      return new AppError('file_too_large', 'A file is larger than the limit', 'too_large', {
        [field]: 'Too large',
      });
    case 'LIMIT_FILE_COUNT':
      return new AppError('too_many_files', `At most ${MAX_FILES_PER_REQUEST} files per request`, 'invalid', {
        [field]: `At most ${MAX_FILES_PER_REQUEST} files`,
      });
    case 'LIMIT_UNEXPECTED_FILE':
      return new AppError('unexpected_file', `Send the file(s) in the field "${field}"`, 'invalid', {
        [error.field ?? field]: `Unexpected file field; use "${field}"`,
      });
    default:
      return new AppError('bad_multipart', error.message, 'invalid');
  }
}

function requireMultipart(field: string, handler: RequestHandler): RequestHandler {
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      next(
        new AppError(
          'unsupported_media_type',
          `Send multipart/form-data with the file(s) in "${field}"`,
          'unsupported_type',
        ),
      );
      return;
    }
    handler(req, res, (error?: unknown) => next(error ? translate(error, field) : undefined));
  };
}

/** Light curves: up to 20 files of up to 100 MB each, written to disk. */
export function lightCurveUpload(dataDir: string, field: string): RequestHandler {
  const storage = multer.diskStorage({
    destination: (_req, _file, done) => {
      const dir = incomingDir(dataDir);
      fs.mkdir(dir, { recursive: true }, (error) => done(error, dir));
    },
    filename: (_req, _file, done) => done(null, `${Date.now()}-${crypto.randomBytes(8).toString('hex')}`),
  });
  const parser = multer({
    storage,
    limits: { fileSize: MAX_LIGHT_CURVE_BYTES, files: MAX_FILES_PER_REQUEST, fields: 10, fieldSize: 1024 },
  }).array(field, MAX_FILES_PER_REQUEST);
  return requireMultipart(field, (req, res, next) => {
    // A request refused after its files were written (bad fields, bad params) never reaches the
    // service that moves them away: whatever the answer, none of its files stays in the incoming folder.
    res.on('close', () => {
      const files = Array.isArray(req.files) ? req.files : [];
      for (const file of files)
        if (typeof file?.path === 'string') fs.rm(file.path, { force: true }, () => {});
    });
    parser(req, res, next);
  });
}

/** A catalogue: one CSV of up to 10 MB, kept in memory. */
export function catalogueUpload(field: string): RequestHandler {
  const parser = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MAX_CATALOGUE_BYTES, files: 1, fields: 5, fieldSize: 1024 },
  }).single(field);
  return requireMultipart(field, parser);
}
