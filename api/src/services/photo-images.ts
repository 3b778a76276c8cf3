/**
 * Turns an uploaded file into the two JPEGs Ebbline keeps of a photo, with sharp (libvips):
 * the type is read from the content (never from the name or the browser's word), the size in
 * pixels is checked before anything is decoded, the photo is turned upright from its EXIF
 * orientation, scaled down to PHOTO_FULL_EDGE_PX at most, and written again as a JPEG with no
 * metadata at all (no EXIF, GPS position, camera serial, XMP or comments), with a thumbnail.
 */
import sharp from 'sharp';
import {
  PHOTO_FORMATS,
  PHOTO_FULL_EDGE_PX,
  PHOTO_MAX_MEGAPIXELS,
  PHOTO_THUMBNAIL_EDGE_PX,
} from '../../../shared/constants/photos';
import { AppError } from '../errors';

/** The JPEGs made from one upload, and the full-size one's size in pixels. */
export interface PreparedPhoto {
  full: Buffer;
  thumbnail: Buffer;
  widthPx: number;
  heightPx: number;
}

const MAX_PIXELS = PHOTO_MAX_MEGAPIXELS * 1_000_000;
const ACCEPTED = new Set<string>(PHOTO_FORMATS);

function notAnImage(): AppError {
  return new AppError('not-an-image', 'This file is not a photo Ebbline can read: send a JPEG, PNG, WebP or HEIF image.');
}

/**
 * Reads, checks and re-encodes one uploaded photo.
 *
 * @throws AppError `not-an-image` (the content is no JPEG, PNG, WebP or HEIF image, or cannot
 *   be decoded), `image-too-large` (over PHOTO_MAX_MEGAPIXELS)
 */
export async function preparePhoto(bytes: Buffer): Promise<PreparedPhoto> {
  let format: string | undefined;
  let compression: string | undefined;
  let width = 0;
  let height = 0;
  try {
    // the header only: nothing is decoded yet, so a "pixel bomb" costs nothing here
    const meta = await sharp(bytes, { limitInputPixels: false }).metadata();
    format = meta.format;
    compression = meta.compression;
    width = meta.width ?? 0;
    height = meta.height ?? 0;
  } catch {
    throw notAnImage();
  }
  if (!format || !ACCEPTED.has(format) || width <= 0 || height <= 0) throw notAnImage();
  if (format === 'heif' && compression === 'hevc') {
    // the HEIC of some phones' cameras: a coding this server's image library does not decode
    throw new AppError(
      'not-an-image',
      'This HEIC photo cannot be read here. Send it as JPEG: most phones do when sharing, or set the camera to "Most Compatible".',
    );
  }
  if (width * height > MAX_PIXELS) {
    const megapixels = Math.round((width * height) / 100_000) / 10;
    throw new AppError(
      'image-too-large',
      `This photo has ${megapixels} megapixels (${width} × ${height}); Ebbline takes photos of up to ${PHOTO_MAX_MEGAPIXELS} megapixels. Take it again at a lower resolution.`,
    );
  }
  try {
    // sharp writes no metadata unless asked (withMetadata/keepExif): the output carries none
    const { data: full, info } = await sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' })
      .rotate()
      .resize({ width: PHOTO_FULL_EDGE_PX, height: PHOTO_FULL_EDGE_PX, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 85, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(full)
      .resize({ width: PHOTO_THUMBNAIL_EDGE_PX, height: PHOTO_THUMBNAIL_EDGE_PX, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 75, mozjpeg: true })
      .toBuffer();
    return { full, thumbnail, widthPx: info.width, heightPx: info.height };
  } catch {
    // a truncated file, or a HEIF coding libvips cannot decode here
    throw notAnImage();
  }
}
