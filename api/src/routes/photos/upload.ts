import type { RequestHandler } from 'express';
import multer from 'multer';
import { PHOTO_MAX_BYTES, PHOTO_MAX_MEBIBYTES } from '../../../../shared/constants/photos';
import { AppError } from '../../errors';

// memory storage: the bytes go to sharp, never to a file named by the upload
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 5, fieldSize: 4096, parts: 6 },
}).single('photo');

/**
 * Takes one photo upload (form field `photo`, beside `clientId`, `bankId`, `caption`) into
 * memory within PHOTO_MAX_BYTES; turns multer's errors into the API's own, as the CSV imports do
 * (routes/cabinets/upload.ts). The type is not judged here: the content decides, later.
 */
export const photoUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) {
      if (!req.file) next(AppError.badRequest('photo: Choose a photo to upload.', [{ path: 'photo', message: 'Choose a photo to upload.' }]));
      else next();
      return;
    }
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        next(new AppError('file-too-large', `The photo is larger than ${PHOTO_MAX_MEBIBYTES} MB. Take it again at a lower resolution or quality.`));
      } else {
        const path = err.field ?? 'photo';
        next(AppError.badRequest(`${path}: ${err.message}.`, [{ path, message: err.message }]));
      }
      return;
    }
    if (err instanceof AppError) {
      next(err);
      return;
    }
    // busboy's own errors ("Malformed part header", "Unexpected end of form"): the client sent a broken form
    const message = `The upload could not be read as a form with a photo (${err instanceof Error ? err.message : 'malformed'}).`;
    next(AppError.badRequest(`photo: ${message}`, [{ path: 'photo', message }]));
  });
};
