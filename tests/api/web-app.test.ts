/**
 * The built web app served by the API: its files, index.html for the app's own paths, and a
 * plain 404 (never the HTML page) for a file that is not there.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';

// a small built app of the test's own; the app reads WEB_DIST_DIR once, at its first import
const dist = fs.mkdtempSync(path.join(os.tmpdir(), 'ebbline-web-'));
fs.mkdirSync(path.join(dist, 'assets'));
fs.writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Ebbline</title>');
fs.writeFileSync(path.join(dist, 'assets', 'index-abc123.js'), 'console.log(1)');
fs.writeFileSync(path.join(dist, 'sw.js'), 'self.addEventListener("install", () => undefined)');
fs.writeFileSync(path.join(dist, 'manifest.webmanifest'), '{"name":"Ebbline"}');
process.env.WEB_DIST_DIR = dist;
const { createApp } = await import('../../api/src/app');
const app = createApp();

afterAll(() => fs.rmSync(dist, { recursive: true, force: true }));

describe('the built web app', () => {
  it('when a built asset is asked for, then it is served as itself', async () => {
    const res = await request(app).get('/assets/index-abc123.js');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/javascript/);
  });

  it.each(['/assets/missing.js', '/assets/fonts/gone.woff2', '/assets/deep/x', '/favicon.png', '/register/cabinets/old-script.js', '/site.webmanifest'])(
    'when %s is not there, then 404 and not the HTML page',
    async (missing) => {
      const res = await request(app).get(missing);
      expect(res.status).toBe(404);
      expect(res.headers['content-type']).not.toMatch(/html/);
      expect(res.text).not.toContain('<title>Ebbline</title>');
    },
  );

  it.each([
    ['/sw.js', /javascript/],
    ['/manifest.webmanifest', /application\/manifest\+json/],
    ['/index.html', /html/],
    ['/', /html/],
    ['/planner', /html/],
  ])('when %s is asked for, then it comes with its type and no-cache (an update is picked up at once)', async (file, type) => {
    const res = await request(app).get(file);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(type);
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('when a hashed asset is asked for, then it may be kept', async () => {
    const res = await request(app).get('/assets/index-abc123.js');
    expect(res.headers['cache-control']).toMatch(/max-age=\d+/);
  });

  it.each(['/', '/planner', '/register/cabinets/2f1c3a44-9a3e-4bb1-8d35-0c1f7a0e9b21', '/register/cabinets/new'])(
    'when the app’s own path %s is opened, then index.html answers',
    async (page) => {
      const res = await request(app).get(page);
      expect(res.status).toBe(200);
      expect(res.text).toContain('<title>Ebbline</title>');
    },
  );
});
