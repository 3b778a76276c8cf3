/**
 * Photos of a visit: who may add them (a technician assigned to the visit, or an admin, while
 * the visit is open), recording one (idempotent by the browser's `clientId`), and reading them
 * (whoever may read the visit). The files themselves are written to the photo store by the edge
 * before the row (routes/photos/add-photo.ts), and removed again when the row is not written.
 */
import type { Transaction } from 'sequelize';
import { hasAnyRole } from '../../../shared/constants/roles';
import { VISIT_STATE_LABELS, type VisitState } from '../../../shared/domain/visit-states';
import type { PhotoUploadFields } from '../../../shared/schemas/photo';
import { sequelize } from '../db/sequelize';
import { AppError } from '../errors';
import { Photo } from '../models/photo';
import { User } from '../models/user';
import type { AuthUser } from '../types/express';
import { recordAudit } from './audit';
import type { UnitOfWork } from './unit-of-work';
import { getVisit, type VisitViewer } from './visits';

/** Visit states in which photos may still be added. */
const OPEN_FOR_PHOTOS: readonly VisitState[] = ['planned', 'under-way', 'logged'];

const TAKEN_BY = { model: User, as: 'takenBy', attributes: ['id', 'name'] };

/**
 * Checks that `actor` may add a photo to the visit, of `bankId` when given.
 *
 * @throws AppError `not-found` (no visit the person may read), `forbidden` (not assigned, not an
 *   admin), `visit-state` (missed, cancelled or reviewed), `validation-failed` naming bankId
 */
export async function checkPhotoMayBeAdded(
  actor: AuthUser,
  visitId: string,
  bankId: string | undefined,
  transaction?: Transaction,
): Promise<void> {
  const visit = await getVisit(visitId, actor, transaction);
  const assigned = (visit.technicians ?? []).some((t) => t.id === actor.id);
  if (!assigned && !hasAnyRole(actor.roles, ['admin'])) {
    throw AppError.forbidden('Only a technician assigned to this visit (or an admin) may add photos to it.');
  }
  const state: VisitState = visit.state;
  if (!OPEN_FOR_PHOTOS.includes(state)) {
    throw new AppError('visit-state', `This visit is ${VISIT_STATE_LABELS[state]}: photos can no longer be added to it.`);
  }
  if (bankId && !(visit.banks ?? []).some((b) => b.id === bankId)) {
    const message = 'This bank is not one of the visit\'s banks.';
    throw AppError.badRequest(`bankId: ${message}`, [{ path: 'bankId', message }]);
  }
}

/** The photo made earlier with this `clientId`, if any (with who took it). */
export async function findPhotoByClientId(clientId: string, transaction?: Transaction): Promise<Photo | null> {
  return Photo.findOne({ where: { clientId }, include: [TAKEN_BY], transaction });
}

/** What the edge has stored of a photo before recording it. */
export interface StoredPhotoFiles {
  storageKey: string;
  thumbnailKey: string;
  widthPx: number;
  heightPx: number;
  bytes: number;
}

/**
 * Records a photo whose files are in the store, with its audit entry. The same `clientId`
 * again (a retry, or two sends at once: serialised by an advisory lock on it) records nothing
 * and answers the photo made first, with `created: false`; its files are then the caller's to remove.
 */
export async function recordPhoto(
  uow: UnitOfWork,
  visitId: string,
  fields: PhotoUploadFields,
  files: StoredPhotoFiles,
): Promise<{ photo: Photo; created: boolean }> {
  const { transaction, actor } = uow;
  await sequelize.query("SELECT pg_advisory_xact_lock(hashtextextended('photo:' || :clientId, 0))", {
    replacements: { clientId: fields.clientId },
    transaction,
  });
  const earlier = await findPhotoByClientId(fields.clientId, transaction);
  if (earlier) {
    if (earlier.visitId !== visitId) {
      const message = 'This clientId belongs to a photo of another visit: make a new one for this photo.';
      throw AppError.badRequest(`clientId: ${message}`, [{ path: 'clientId', message }]);
    }
    return { photo: earlier, created: false };
  }
  await checkPhotoMayBeAdded(actor, visitId, fields.bankId, transaction);
  const photo = await Photo.create(
    {
      clientId: fields.clientId,
      visitId,
      bankId: fields.bankId ?? null,
      caption: fields.caption,
      ...files,
      takenById: actor.id,
      createdAt: uow.now,
    },
    { transaction },
  );
  await recordAudit(uow, {
    entityType: 'photo',
    entityId: photo.id,
    action: 'create',
    summary: `Added a photo to the visit${fields.caption ? `: ${fields.caption}` : ''}`,
    before: null,
    after: {
      visitId,
      bankId: photo.bankId,
      caption: photo.caption,
      widthPx: files.widthPx,
      heightPx: files.heightPx,
      bytes: files.bytes,
    },
  });
  photo.takenBy = (await User.findByPk(actor.id, { attributes: ['id', 'name'], transaction })) ?? undefined;
  return { photo, created: true };
}

/**
 * The photos of a visit the viewer may read, newest first.
 * @throws AppError `not-found` (no visit the viewer may read)
 */
export async function listVisitPhotos(visitId: string, viewer: VisitViewer): Promise<Photo[]> {
  await getVisit(visitId, viewer);
  return Photo.findAll({
    where: { visitId },
    include: [TAKEN_BY],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
}

/**
 * One photo, when the viewer may read its visit (else "not found", as for the visit).
 * @throws AppError `not-found`
 */
export async function getPhoto(id: string, viewer: VisitViewer): Promise<Photo> {
  const photo = await Photo.findByPk(id, { include: [TAKEN_BY] });
  if (!photo) throw AppError.notFound('Photo');
  try {
    await getVisit(photo.visitId, viewer);
  } catch (err) {
    if (err instanceof AppError && err.code === 'not-found') throw AppError.notFound('Photo');
    throw err;
  }
  return photo;
}
