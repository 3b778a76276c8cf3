import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { localFolderStorage, newStorageKey } from '../../../api/src/storage/photo-storage';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ebbline-photo-store-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('localFolderStorage', () => {
  const store = localFolderStorage(dir);

  it('when a file is put, then it is read back, under the key in a subfolder, and gone once deleted', async () => {
    const key = newStorageKey('full');
    const bytes = Buffer.from([0xff, 0xd8, 0xff, 1, 2, 3]);
    expect(await store.get(key)).toBeNull();
    await store.put(key, bytes);
    expect(await store.get(key)).toEqual(bytes);
    expect(fs.existsSync(path.join(dir, key.slice(0, 2), key))).toBe(true);
    // no temporary file is left beside it
    expect(fs.readdirSync(path.join(dir, key.slice(0, 2)))).toEqual([key]);
    await store.delete(key);
    expect(await store.get(key)).toBeNull();
    // deleting again is no error
    await store.delete(key);
  });

  it('when a key was not made by Ebbline, then every call refuses it (no path outside the store)', async () => {
    for (const key of ['../../etc/passwd', '/etc/passwd', 'IMG_0042.jpg', `${newStorageKey('full')}/..`, '']) {
      await expect(store.put(key, Buffer.from('x'))).rejects.toThrow(/Not a photo storage key/);
      await expect(store.get(key)).rejects.toThrow(/Not a photo storage key/);
      await expect(store.delete(key)).rejects.toThrow(/Not a photo storage key/);
    }
  });
});
