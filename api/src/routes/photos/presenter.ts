import type { Photo as PhotoJson } from '../../../../shared/schemas/photo';
import type { Photo } from '../../models/photo';

/** A photo as the API answers it; the files are behind `url` and `thumbnailUrl`. */
export function presentPhoto(photo: Photo): PhotoJson {
  return {
    id: photo.id,
    clientId: photo.clientId,
    visitId: photo.visitId,
    bankId: photo.bankId ?? null,
    caption: photo.caption,
    widthPx: photo.widthPx,
    heightPx: photo.heightPx,
    bytes: photo.bytes,
    url: `/api/photos/${photo.id}`,
    thumbnailUrl: `/api/photos/${photo.id}/thumbnail`,
    takenBy: { id: photo.takenById, name: photo.takenBy?.name ?? '' },
    createdAt: photo.createdAt.toISOString(),
  };
}

/** The name a downloaded photo gets: made by Ebbline, never the uploaded one. */
export function photoFileName(photo: Photo, kind: 'full' | 'thumbnail'): string {
  const day = photo.createdAt.toISOString().slice(0, 10).replaceAll('-', '');
  return `ebbline-photo-${day}-${photo.id.slice(0, 8)}${kind === 'thumbnail' ? '-thumbnail' : ''}.jpg`;
}
