/**
 * Photos of a visit: the fields sent beside the file (`POST /api/visits/:visitId/photos`,
 * multipart: `photo` file, `clientId`, `bankId?`, `caption?`) and the API's answer.
 */
import { z } from 'zod';
import { PHOTO_CAPTION_MAX_CHARS } from '../constants/photos';
import { optionalText } from './common';

/** The form fields of a photo upload (the file itself is the `photo` part). */
export const photoUploadFieldsSchema = z.object({
  /** Made by the browser once per photo: the same id again answers the photo already stored. */
  clientId: z.uuid({ error: 'Send clientId as a UUID made once for this photo.' }),
  bankId: z.preprocess((v) => (v === '' ? undefined : v), z.uuid({ error: 'Send bankId as the id of one of the visit\'s banks.' }).optional()),
  caption: optionalText(PHOTO_CAPTION_MAX_CHARS, 'caption'),
});
export type PhotoUploadFields = z.output<typeof photoUploadFieldsSchema>;

/** A stored photo as the API answers it. */
export interface Photo {
  id: string;
  clientId: string;
  visitId: string;
  bankId: string | null;
  caption: string;
  widthPx: number;
  heightPx: number;
  /** Size of the stored full-size JPEG, in bytes. */
  bytes: number;
  /** The full-size JPEG (`GET /api/photos/:photoId`). */
  url: string;
  /** The thumbnail JPEG (`GET /api/photos/:photoId/thumbnail`). */
  thumbnailUrl: string;
  takenBy: { id: string; name: string };
  createdAt: string;
}

/** `GET /api/visits/:visitId/photos`: newest first. */
export interface PhotoList {
  items: Photo[];
}
