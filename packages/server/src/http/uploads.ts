import type { RequestHandler } from 'express';
import multer from 'multer';
import { ErrorCode } from '@burrowline/shared';
import { AppError } from '../lib/app-error';

export interface UploadRule {
  /** The form field the file(s) come in. */
  field: string;
  maxFiles: number;
  maxBytes: number;
  /** How the refusals name what is sent ("photo", "spreadsheet"). */
  noun: string;
}

function megabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return mb >= 1 ? `${Number.isInteger(mb) ? mb : mb.toFixed(1)} MB` : `${Math.round(bytes / 1024)} kB`;
}

/**
 * Multipart uploads held in memory (each file at most `maxBytes`, at most `maxFiles` files, a few
 * short text fields), refused with a message that says which limit was met. Run after the route has
 * checked who may upload, so a refused person's file is never read.
 */
export function acceptUpload(rule: UploadRule): RequestHandler {
  const handler = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: rule.maxBytes, files: rule.maxFiles, fields: 5, fieldSize: 2000, parts: rule.maxFiles + 5, headerPairs: 200 },
  }).array(rule.field, rule.maxFiles);
  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      next(new AppError(ErrorCode.validation, 400, `Send the ${rule.noun} as a file upload (multipart/form-data, field "${rule.field}")`));
      return;
    }
    handler(req, res, (error?: unknown) => {
      if (!error) return next();
      if (error instanceof multer.MulterError) {
        switch (error.code) {
          case 'LIMIT_FILE_SIZE':
            return next(new AppError(ErrorCode.payloadTooLarge, 413, `The ${rule.noun} is too big: at most ${megabytes(rule.maxBytes)} each`));
          case 'LIMIT_FILE_COUNT':
          case 'LIMIT_PART_COUNT':
            return next(new AppError(ErrorCode.payloadTooLarge, 413, `Too many files at once: at most ${rule.maxFiles} ${rule.noun}${rule.maxFiles === 1 ? '' : 's'} per upload`));
          case 'LIMIT_UNEXPECTED_FILE':
            return next(new AppError(ErrorCode.validation, 400, `Send the ${rule.noun} in the form field "${rule.field}"`));
          default:
            return next(new AppError(ErrorCode.validation, 400, `The upload could not be read (${error.message.toLowerCase()})`));
        }
      }
      // busboy refuses a malformed body (no boundary, cut short) with a plain error.
      next(new AppError(ErrorCode.validation, 400, 'The upload could not be read; try sending it again'));
    });
  };
}

/** The files of an `acceptUpload` request. */
export function uploadedFiles(req: Parameters<RequestHandler>[0]): Express.Multer.File[] {
  return Array.isArray(req.files) ? req.files : [];
}
