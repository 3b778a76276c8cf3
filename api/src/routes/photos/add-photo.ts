/**
 * The edge of adding a photo: the files are written to the photo store first, then the row and
 * its audit entry in one unit of work; when the row is not written (refused, a retry of a photo
 * already made, the database away) the files are removed again, so no trace is left.
 */
import crypto from 'node:crypto';
import type { PhotoUploadFields } from '../../../../shared/schemas/photo';
import { logger } from '../../logger';
import type { Photo } from '../../models/photo';
import { checkPhotoMayBeAdded, findPhotoByClientId, recordPhoto } from '../../services/photos';
import { preparePhoto } from '../../services/photo-images';
import { withUnitOfWork } from '../../services/unit-of-work';
import { newStorageKey, photoStorage } from '../../storage';
import type { AuthUser } from '../../types/express';

/** Adds the uploaded photo to the visit; `created` is false for a `clientId` seen before. */
export async function addPhotoToVisit(
  actor: AuthUser,
  visitId: string,
  fields: PhotoUploadFields,
  bytes: Buffer,
): Promise<{ photo: Photo; created: boolean }> {
  // a retry of a photo already made: answer it without decoding anything
  const earlier = await findPhotoByClientId(fields.clientId);
  if (earlier && earlier.visitId === visitId) return { photo: earlier, created: false };
  // refuse early (role, visit state, bank) before the costly decoding; checked again in the unit of work
  await checkPhotoMayBeAdded(actor, visitId, fields.bankId);
  const prepared = await preparePhoto(bytes);

  const store = photoStorage();
  const id = crypto.randomUUID();
  const storageKey = newStorageKey('full', id);
  const thumbnailKey = newStorageKey('thumbnail', id);
  const removeFiles = async () => {
    const results = await Promise.allSettled([store.delete(storageKey), store.delete(thumbnailKey)]);
    for (const r of results) {
      if (r.status === 'rejected') logger.error({ err: r.reason, storageKey }, 'a photo file could not be removed');
    }
  };
  let result: { photo: Photo; created: boolean };
  try {
    await store.put(storageKey, prepared.full);
    await store.put(thumbnailKey, prepared.thumbnail);
    result = await withUnitOfWork(actor, (uow) =>
      recordPhoto(uow, visitId, fields, {
        storageKey,
        thumbnailKey,
        widthPx: prepared.widthPx,
        heightPx: prepared.heightPx,
        bytes: prepared.full.length,
      }),
    );
  } catch (err) {
    await removeFiles();
    throw err;
  }
  if (!result.created) await removeFiles();
  return result;
}
