import { describe, expect, it } from 'vitest';
import { ConfigError, parseConfig } from '../../../api/src/config/env';

describe('PHOTO_DIR', () => {
  it('when nothing is set, then photos are kept in .data/photos, outside the web app', () => {
    expect(parseConfig({}).PHOTO_DIR).toBe('.data/photos');
  });

  it('when it lies inside the web app\'s folder, then the configuration is refused naming it', () => {
    for (const dir of ['dist/web', 'dist/web/photos', './dist/web/../web/p']) {
      expect(() => parseConfig({ PHOTO_DIR: dir })).toThrow(ConfigError);
      expect(() => parseConfig({ PHOTO_DIR: dir })).toThrow(/PHOTO_DIR: must be outside/);
    }
  });

  it('when it is beside the web app\'s folder, or the web app is served from elsewhere, then it is taken', () => {
    expect(parseConfig({ PHOTO_DIR: 'dist/web-photos' }).PHOTO_DIR).toBe('dist/web-photos');
    expect(parseConfig({ PHOTO_DIR: '/var/lib/ebbline/photos' }).PHOTO_DIR).toBe('/var/lib/ebbline/photos');
    expect(parseConfig({ PHOTO_DIR: 'dist/web/photos', WEB_DIST_DIR: 'build/site' }).PHOTO_DIR).toBe('dist/web/photos');
  });
});
