import type { RequestHandler } from 'express';
import multer from 'multer';
import { IMPORT_MAX_BYTES } from '../../../../shared/constants/register';
import { AppError } from '../../errors';

// what browsers and spreadsheets call a CSV file
const CSV_TYPES = new Set(['text/csv', 'application/csv', 'text/plain', 'application/vnd.ms-excel', 'text/x-csv', 'application/octet-stream']);

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: IMPORT_MAX_BYTES, files: 1, fields: 5 },
  fileFilter: (_req, file, accept) => {
    const isCsvName = /\.csv$/i.test(file.originalname);
    if (isCsvName && CSV_TYPES.has(file.mimetype)) accept(null, true);
    else accept(new AppError('unsupported-file', `${file.originalname} is not a CSV file. Save the sheet as CSV (.csv) and upload that.`));
  },
}).single('file');

/**
 * Takes one CSV upload (form field `file`) into memory, within the size limit; turns multer's
 * errors into the API's own.
 */
export const csvUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) {
      if (!req.file) next(AppError.badRequest('file: Choose a CSV file to upload.', [{ path: 'file', message: 'Choose a CSV file to upload.' }]));
      else next();
      return;
    }
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        next(new AppError('file-too-large', `The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB. Split it and import the parts.`));
      } else next(AppError.badRequest(`file: ${err.message}.`, [{ path: 'file', message: err.message }]));
      return;
    }
    if (err instanceof AppError) {
      next(err);
      return;
    }
    // busboy's own errors ("Malformed part header", "Unexpected end of form"): the client sent a broken form
    const message = `The upload could not be read as a form with a file (${err instanceof Error ? err.message : 'malformed'}).`;
    next(AppError.badRequest(`file: ${message}`, [{ path: 'file', message }]));
  });
};
