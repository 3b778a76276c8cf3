import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from '../errors';

/** What {@link singleFileUpload} takes. */
export interface SingleFileUploadOptions {
  /** The form field of the file. */
  field: string;
  /** Largest file accepted, in bytes; one more byte is a 413 `file-too-large`. */
  maxBytes: number;
  /** The 413's message, naming the limit and what to do. */
  tooLargeMessage: string;
  /** The 400's message when the form holds no file. */
  missingMessage: string;
  /** Most other form fields, each at most `maxFieldBytes`. */
  maxFields?: number;
  maxFieldBytes?: number;
}

/**
 * Takes one uploaded file (multipart form data) into memory, within a size limit, with its other
 * fields in `req.body`; turns multer's and busboy's errors into the API's own (the cabinet
 * import's path, routes/cabinets/upload.ts): over the size → 413 `file-too-large` with the
 * message given; no file, a second file, too many fields or a broken form → 400 naming `file`.
 * The file's type is never taken from its name or the browser's word: the route reads its content.
 */
export function singleFileUpload({ field, maxBytes, tooLargeMessage, missingMessage, maxFields = 5, maxFieldBytes = 1024 }: SingleFileUploadOptions): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    // browsers send a file's name as UTF-8 ("Zwischenkreis-Ü.csv"), not Latin-1
    defParamCharset: 'utf8',
    limits: { fileSize: maxBytes, files: 1, fields: maxFields, fieldSize: maxFieldBytes },
  }).single(field);
  const refuse = (message: string) => AppError.badRequest(`${field}: ${message}`, [{ path: field, message }]);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) {
        next(req.file ? undefined : refuse(missingMessage));
        return;
      }
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') next(new AppError('file-too-large', tooLargeMessage));
        else if (err.code === 'LIMIT_UNEXPECTED_FILE') next(refuse(`Send one file, in the form field "${field}".`));
        else next(refuse(`${err.message}.`));
        return;
      }
      if (err instanceof AppError) {
        next(err);
        return;
      }
      // busboy's own errors ("Malformed part header", "Unexpected end of form"): the client sent a broken form
      next(refuse(`The upload could not be read as a form with a file (${err instanceof Error ? err.message : 'malformed'}).`));
    });
  };
}
