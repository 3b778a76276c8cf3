import { Router } from 'express';
import { LOGGER_FILE_MAX_BYTES, LOGGER_FILE_MAX_MEBIBYTES } from '../../../../shared/constants/logger-files';
import { loggerFilePreviewFieldsSchema } from '../../../../shared/schemas/logger-file';
import { requireRole } from '../../middleware/require-role';
import { singleFileUpload } from '../../middleware/single-file-upload';
import { previewLoggerFile } from '../../services/logger-file-preview';
import { loggerFilePolicy } from './policy';

const loggerFileUpload = singleFileUpload({
  field: 'file',
  maxBytes: LOGGER_FILE_MAX_BYTES,
  tooLargeMessage: `The file is larger than ${LOGGER_FILE_MAX_MEBIBYTES} MB. Export the readings at a coarser sampling interval, or only the discharge, and upload that.`,
  missingMessage: "Choose the logger's file to upload.",
});

/** `/api/logger-files`: a logger's or oscilloscope's file read as a decay run's readings; nothing is stored. */
export const loggerFilesRouter = Router();

loggerFilesRouter.post('/preview', requireRole(...loggerFilePolicy.preview), loggerFileUpload, async (req, res) => {
  const columns = loggerFilePreviewFieldsSchema.parse(req.body ?? {});
  const file = req.file!;
  res.json(await previewLoggerFile({ name: file.originalname, bytes: new Uint8Array(file.buffer.buffer, file.buffer.byteOffset, file.buffer.byteLength) }, columns));
});
