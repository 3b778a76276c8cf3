import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Photo, PhotoList } from '../../../../../shared/schemas/photo';
import { apiFetch, currentCsrfToken } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';

/** Query keys of the photos of visits, from general to specific. */
export const photoKeys = {
  all: ['photos'] as const,
  visit: (visitId: string) => [...photoKeys.all, 'visit', visitId] as const,
};

/** The photos of a visit, newest first. */
export function getVisitPhotos(visitId: string): Promise<PhotoList> {
  return apiFetch<PhotoList>(`/api/visits/${encodeURIComponent(visitId)}/photos`);
}

export const visitPhotosQueryOptions = (visitId: string) =>
  queryOptions({ queryKey: photoKeys.visit(visitId), queryFn: () => getVisitPhotos(visitId) });

export const useVisitPhotos = (visitId: string) => useQuery(visitPhotosQueryOptions(visitId));

/** What one photo upload sends. */
export interface PhotoUpload {
  file: File;
  /** Made once per chosen photo: sending it again answers the photo already stored. */
  clientId: string;
  bankId?: string;
  caption?: string;
  /** Fraction of the file sent so far, 0 to 1. */
  onProgress?: (fraction: number) => void;
}

/** Uploads one photo of a visit (multipart: `photo`, `clientId`, `bankId?`, `caption?`). */
export function uploadVisitPhoto(visitId: string, { file, clientId, bankId, caption, onProgress }: PhotoUpload): Promise<Photo> {
  const form = new FormData();
  form.append('clientId', clientId);
  if (bankId) form.append('bankId', bankId);
  if (caption) form.append('caption', caption);
  // the file last: the fields are read before the file's bytes arrive
  form.append('photo', file);
  return uploadForm<Photo>(`/api/visits/${encodeURIComponent(visitId)}/photos`, form, {
    csrfToken: currentCsrfToken(),
    onProgress,
  });
}

/** Adds a photo to a visit; the visit's photo list is fetched again afterwards. */
export function useUploadVisitPhoto(visitId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (upload: PhotoUpload) => uploadVisitPhoto(visitId, upload),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.visit(visitId) }),
  });
}
