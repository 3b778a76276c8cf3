import { getConfig } from '../config/env';
import { localFolderStorage, type PhotoStorage } from './photo-storage';

export { localFolderStorage, newStorageKey, type PhotoStorage } from './photo-storage';

let store: PhotoStorage | undefined;

/** The process's photo store: the folder `PHOTO_DIR` of the configuration. */
export function photoStorage(): PhotoStorage {
  store ??= localFolderStorage(getConfig().PHOTO_DIR);
  return store;
}
