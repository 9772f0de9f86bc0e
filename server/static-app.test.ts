/** Serving the built app beside the sync routes, over real HTTP on loopback. */
import { mkdirSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestServer, type TestServer, tempDir } from '../tests/sync/harness.ts';

let server: TestServer;
let appDir: string;
beforeAll(async () => {
  appDir = tempDir();
  mkdirSync(join(appDir, 'assets'));
  writeFileSync(join(appDir, 'index.html'), '<!doctype html><title>Rivalplate</title>');
  writeFileSync(join(appDir, 'sw.js'), 'self.addEventListener("install", () => {});');
  writeFileSync(join(appDir, 'assets', 'app-1a2b.js'), 'export {};');
  server = await startTestServer({ appDir });
});
afterAll(async () => {
  await server.close();
  rmSync(appDir, { recursive: true, force: true });
});

describe('the built app on the sync server', () => {
  it('serves its files, and index.html for the paths the app routes itself', async () => {
    const asset = await fetch(`${server.origin}/assets/app-1a2b.js`);
    expect(asset.status).toBe(200);
    expect(asset.headers.get('content-type')).toMatch(/javascript/);
    expect(asset.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    const deep = await fetch(`${server.origin}/experiments/mf-exp/plates`);
    expect(deep.status).toBe(200);
    expect(await deep.text()).toContain('<title>Rivalplate</title>');
  });

  it('has the browser revalidate the service worker and the page, so updates arrive', async () => {
    for (const path of ['/sw.js', '/index.html', '/', '/some/deep/link']) {
      const res = await fetch(server.origin + path);
      expect(res.headers.get('cache-control'), path).toBe('no-cache');
    }
  });

  it('keeps sync paths out of the fallback: an unknown one is a JSON 404', async () => {
    const res = await fetch(`${server.sync}/nothing`);
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: 'not-found' });
    const outside = await fetch(`${server.origin}/../../etc/passwd`);
    expect(await outside.text()).not.toContain('root:');
  });
});
