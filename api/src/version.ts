import { createRequire } from 'node:module';

const pkg = createRequire(import.meta.url)('../../package.json') as { version: string };

/** Ebbline's version, from package.json. */
export const VERSION = pkg.version;
