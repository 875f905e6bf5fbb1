import type { NextFunction, Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import type { Role } from '../../../shared/contracts/auth';
import {
  formatBytes,
  MAX_TEXT_FIELD_BYTES,
  type UploadLimit,
} from '../../../shared/contracts/upload-limits';
import type { SessionUser } from '../auth/session-user';
import { cleanFileName } from '../../../shared/files/file-name';
import { badRequest, forbidden, HttpError, unauthorized } from './errors';
import { hasAnyRole } from './route';

/** The file of a request that passed the upload rule. */
export interface UploadedFile {
  buffer: Buffer;
  /** The client's file name, read as UTF-8, without path or control characters (cleanFileName). */
  originalname: string;
  size: number;
}

/** The uploaded file, if the request carried one. */
export function uploadedFile(req: Request): UploadedFile | undefined {
  return (req as Request & { file?: UploadedFile }).file;
}

export { cleanFileName };

/** Any error of the multipart parser → the answer the client gets (never a 500). */
export function uploadError(err: unknown, limit: UploadLimit): HttpError {
  if (err instanceof HttpError) return err;
  if (err instanceof multer.MulterError) {
    const field = err.field ?? limit.fileField;
    switch (err.code) {
      case 'LIMIT_FILE_SIZE':
        return new HttpError(
          413,
          'file_too_large',
          `${limit.fileField}: the ${limit.label} is larger than ${formatBytes(limit.maxBytes)}; the limit is ${formatBytes(limit.maxBytes)} per file.`,
          [{ path: limit.fileField, message: `At most ${formatBytes(limit.maxBytes)}.` }],
        );
      case 'LIMIT_FILE_COUNT':
        return badRequest(`${limit.fileField}: send one file only.`, [
          { path: limit.fileField, message: 'One file only.' },
        ]);
      case 'LIMIT_UNEXPECTED_FILE':
        return field === limit.fileField
          ? badRequest(`${limit.fileField}: send one file only.`, [
              { path: limit.fileField, message: 'One file only.' },
            ])
          : badRequest(
              `${field}: unexpected file field; send the file in the field "${limit.fileField}".`,
              [{ path: field, message: `Send the file in "${limit.fileField}".` }],
            );
      case 'LIMIT_FIELD_VALUE':
        return badRequest(`${field}: longer than ${formatBytes(MAX_TEXT_FIELD_BYTES)}.`, [
          { path: field, message: 'Too long.' },
        ]);
      // Listed, not `default`: a code multer adds later must be decided here (lint
      // switch-exhaustiveness-check); an unknown code at run time falls through to the 400 below.
      case 'MISSING_FIELD_NAME':
        return badRequest('The upload form has a field without a name.', [
          { path: limit.fileField, message: 'A form field has no name.' },
        ]);
      case 'LIMIT_PART_COUNT':
      case 'LIMIT_FIELD_KEY':
      case 'LIMIT_FIELD_COUNT':
        return badRequest(
          `The upload form has too many or too long fields (${err.message.toLowerCase()}).`,
          [{ path: field, message: err.message }],
        );
    }
  }
  // busboy: truncated body, missing boundary, malformed part headers, …
  const why = err instanceof Error ? err.message : String(err);
  return new HttpError(
    400,
    'multipart_invalid',
    `The upload is not a well-formed multipart form (${why}). Send the file again.`,
    [{ path: limit.fileField, message: 'Not a well-formed upload.' }],
  );
}

/**
 * The one rule every upload route goes through, before its body is read: a signed-in caller (with
 * one of `roles` when given), at most one file, in the route's one file field and within its size
 * limit, only the route's known text fields, the file name read as UTF-8 and cleaned. Anything
 * else answers 400 (413 for size) with a message naming the field. A request that is not multipart
 * goes on unread to the route, whose own validation answers it.
 */
export function uploadRule(limit: UploadLimit, roles?: readonly Role[]): RequestHandler {
  const parse = multer({
    storage: multer.memoryStorage(),
    defParamCharset: 'utf8',
    limits: {
      fileSize: limit.maxBytes,
      files: 1,
      fields: limit.textFields.length + 2,
      parts: limit.textFields.length + 3,
      fieldSize: MAX_TEXT_FIELD_BYTES,
      fieldNameSize: 100,
      headerPairs: 20,
    },
  }).single(limit.fileField);
  return (req: Request, res: Response, next: NextFunction) => {
    const user = req.user as SessionUser | undefined;
    if (!user) return next(unauthorized());
    if (roles && !hasAnyRole(user, roles)) return next(forbidden());
    if (!req.is('multipart/form-data')) return next();
    parse(req, res, (err: unknown) => {
      if (err) return next(uploadError(err, limit));
      const unknown = Object.keys((req.body ?? {}) as object).filter(
        (k) => !limit.textFields.includes(k),
      );
      if (unknown.length) {
        const known = [limit.fileField, ...limit.textFields].map((f) => `"${f}"`).join(', ');
        return next(
          badRequest(
            `${unknown[0]}: unexpected field; this upload takes ${known}.`,
            unknown.map((k) => ({ path: k, message: 'Unexpected field.' })),
          ),
        );
      }
      const file = uploadedFile(req);
      if (file) file.originalname = cleanFileName(file.originalname);
      next();
    });
  };
}
