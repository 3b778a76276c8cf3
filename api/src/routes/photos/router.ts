import { Router, type Response } from 'express';
import { photoUploadFieldsSchema } from '../../../../shared/schemas/photo';
import { AppError } from '../../errors';
import { requireRole } from '../../middleware/require-role';
import type { Photo } from '../../models/photo';
import { getPhoto, listVisitPhotos } from '../../services/photos';
import { photoStorage } from '../../storage';
import { actingUser, idParam } from '../params';
import { addPhotoToVisit } from './add-photo';
import { photoPolicy } from './policy';
import { photoFileName, presentPhoto } from './presenter';
import { photoUpload } from './upload';

/** `/api/visits/:visitId/photos`: add a photo to a visit (multipart), list a visit's photos. */
export const visitPhotosRouter = Router({ mergeParams: true });

visitPhotosRouter.post('/', requireRole(...photoPolicy.add), photoUpload, async (req, res) => {
  const visitId = idParam(req, 'visitId', 'Visit');
  const fields = photoUploadFieldsSchema.parse(req.body ?? {});
  const file = req.file;
  if (!file) throw AppError.badRequest('photo: Choose a photo to upload.', [{ path: 'photo', message: 'Choose a photo to upload.' }]);
  const { photo, created } = await addPhotoToVisit(actingUser(req), visitId, fields, file.buffer);
  res.status(created ? 201 : 200).json(presentPhoto(photo));
});

visitPhotosRouter.get('/', requireRole(...photoPolicy.read), async (req, res) => {
  const visitId = idParam(req, 'visitId', 'Visit');
  const photos = await listVisitPhotos(visitId, actingUser(req));
  res.json({ items: photos.map(presentPhoto) });
});

/** `/api/photos/:photoId` and `/thumbnail`: the JPEGs of a photo, shown in the page (never run). */
export const photosRouter = Router();

async function sendPhotoFile(res: Response, photo: Photo, kind: 'full' | 'thumbnail'): Promise<void> {
  const bytes = await photoStorage().get(kind === 'full' ? photo.storageKey : photo.thumbnailKey);
  if (!bytes) throw AppError.notFound('The photo\'s file');
  res.setHeader('Content-Type', 'image/jpeg');
  res.setHeader('Content-Disposition', `inline; filename="${photoFileName(photo, kind)}"`);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  // a photo never changes; only this person's browser may keep it
  res.setHeader('Cache-Control', 'private, max-age=86400, immutable');
  res.send(bytes);
}

photosRouter.get('/:photoId', requireRole(...photoPolicy.read), async (req, res) => {
  const photo = await getPhoto(idParam(req, 'photoId', 'Photo'), actingUser(req));
  await sendPhotoFile(res, photo, 'full');
});

photosRouter.get('/:photoId/thumbnail', requireRole(...photoPolicy.read), async (req, res) => {
  const photo = await getPhoto(idParam(req, 'photoId', 'Photo'), actingUser(req));
  await sendPhotoFile(res, photo, 'thumbnail');
});
