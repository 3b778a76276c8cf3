/**
 * Limits and sizes of the photos of a visit. The API refuses an upload over a limit (413 naming
 * it) and the web checks the same figures before sending, so a person hears it at once.
 */

/** Largest photo file accepted, in bytes (12 MiB: a modern phone's full-resolution JPEG or HEIF). */
export const PHOTO_MAX_BYTES = 12 * 1024 * 1024;

/** Most pixels a photo may hold, in millions (40 MP: beyond phone cameras; keeps decoding memory bounded). */
export const PHOTO_MAX_MEGAPIXELS = 40;

/** The longer edge of a thumbnail, in pixels. */
export const PHOTO_THUMBNAIL_EDGE_PX = 320;

/** The longer edge of the stored full-size photo, in pixels (larger photos are scaled down). */
export const PHOTO_FULL_EDGE_PX = 2560;

/** The image types accepted, as read from the file's content (never from its name). */
export const PHOTO_FORMATS = ['jpeg', 'png', 'webp', 'heif'] as const;

/** Longest caption, in characters. */
export const PHOTO_CAPTION_MAX_CHARS = 500;

/** The size limit in whole MiB, for messages ("12 MB"). */
export const PHOTO_MAX_MEBIBYTES = PHOTO_MAX_BYTES / 1024 / 1024;
