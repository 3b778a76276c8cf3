/** What the photo control says before and after sending, and the ids it makes for photos. */
import { describe, expect, it } from 'vitest';
import { PHOTO_MAX_BYTES } from '../../../../../shared/constants/photos';
import {
  newClientId,
  photoProblemBeforeSending,
  problemOf,
} from '../../../../../web/src/features/decay-runs/components/photos/visit-photos';
import { ApiError } from '../../../../../web/src/lib/api-client';

const photo = { name: 'IMG_0042.jpg', type: 'image/jpeg', size: 3_000_000 };

describe('photoProblemBeforeSending', () => {
  it('when a photo within the limit is chosen online, then it is sent', () => {
    expect(photoProblemBeforeSending(photo, true)).toBeNull();
    expect(photoProblemBeforeSending({ ...photo, size: PHOTO_MAX_BYTES }, true)).toBeNull();
    // some phones give no type: the server reads the content
    expect(photoProblemBeforeSending({ ...photo, type: '' }, true)).toBeNull();
  });

  it('when offline, then it says the photo can be added when the connection is back', () => {
    expect(photoProblemBeforeSending(photo, false)).toMatch(/offline.*when the connection is back/);
  });

  it('when one byte over the limit, or not an image, then it says so with what to do', () => {
    expect(photoProblemBeforeSending({ ...photo, size: PHOTO_MAX_BYTES + 1 }, true)).toBe(
      'This photo is larger than 12 MB. Take it again at a lower resolution or quality.',
    );
    expect(photoProblemBeforeSending({ name: 'notes.pdf', type: 'application/pdf', size: 10 }, true)).toBe(
      'notes.pdf is not a photo. Choose a JPEG, PNG, WebP or HEIF photo.',
    );
  });
});

describe('problemOf', () => {
  it('when the server refuses, then each refusal reads in plain words', () => {
    expect(problemOf(new ApiError(413, 'file-too-large', 'x'))).toMatch(/larger than 12 MB/);
    expect(problemOf(new ApiError(413, 'image-too-large', 'x'))).toMatch(/more than 40 megapixels/);
    expect(problemOf(new ApiError(415, 'not-an-image', 'x'))).toMatch(/not a photo Ebbline can read/);
    expect(problemOf(new ApiError(0, 'network', 'x'))).toMatch(/connection dropped.*Try again/);
    expect(problemOf(new ApiError(403, 'forbidden', 'Only a technician assigned to this visit may add photos.'))).toBe(
      'Only a technician assigned to this visit may add photos.',
    );
  });
});

describe('newClientId', () => {
  it('when called, then a fresh version-4 UUID each time', () => {
    const ids = Array.from({ length: 50 }, newClientId);
    for (const id of ids) expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(new Set(ids).size).toBe(50);
  });

  it('when the page has no crypto.randomUUID (plain http off this machine), then one is made from random bytes', () => {
    const original = crypto.randomUUID;
    Object.defineProperty(crypto, 'randomUUID', { value: undefined, configurable: true });
    try {
      const ids = Array.from({ length: 50 }, newClientId);
      for (const id of ids) expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
      expect(new Set(ids).size).toBe(50);
    } finally {
      Object.defineProperty(crypto, 'randomUUID', { value: original, configurable: true });
    }
  });
});
