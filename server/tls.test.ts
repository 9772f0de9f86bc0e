/**
 * HTTPS served directly (TLS 1.2/1.3 through node:https), with a self-signed certificate made by
 * OpenSSL for 127.0.0.1 and trusted by the test client alone.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';
import { request } from 'node:https';
import { join } from 'node:path';
import type { TLSSocket } from 'node:tls';
import { afterAll, describe, expect, it } from 'vitest';
import { tempDir } from '../tests/sync/harness.ts';
import { buildSyncServer } from './app.ts';
import { openDataFolder } from './data-folder.ts';
import { newToken, tokenHash } from './tokens.ts';

const dir = tempDir();
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function get(
  url: string,
  ca: Buffer,
  token: string,
): Promise<{ status: number; body: string; protocol: string }> {
  return new Promise((done, fail) => {
    const req = request(url, { ca, headers: { authorization: `Bearer ${token}` } }, (res) => {
      // Read while the socket is still the response's; it is handed back to the agent at the end.
      const protocol = (res.socket as TLSSocket).getProtocol() ?? '';
      let body = '';
      res.on('data', (d) => {
        body += d;
      });
      res.on('end', () => done({ status: res.statusCode ?? 0, body, protocol }));
    });
    req.on('error', fail);
    req.end();
  });
}

describe('HTTPS', () => {
  it('serves the sync routes over TLS with the given certificate and key', async () => {
    const cert = join(dir, 'cert.pem');
    const key = join(dir, 'key.pem');
    execFileSync(
      'openssl',
      [
        'req',
        '-x509',
        '-newkey',
        'rsa:2048',
        '-nodes',
        '-days',
        '1',
        '-subj',
        '/CN=127.0.0.1',
        '-addext',
        'subjectAltName=IP:127.0.0.1',
        '-keyout',
        key,
        '-out',
        cert,
      ],
      { stdio: 'ignore' },
    );
    const { store } = openDataFolder(join(dir, 'data'));
    const lab = await store.addLab('Marrowfield pond', { photosEnabled: false, photoMaxBytes: 0 });
    const token = newToken();
    await store.addToken(lab.id, tokenHash(token));
    const app = await buildSyncServer({
      store,
      appDir: null,
      log: false,
      tls: { cert: readFileSync(cert), key: readFileSync(key) },
    });
    const origin = await app.listen({ port: 0, host: '127.0.0.1' });
    try {
      expect(origin).toMatch(/^https:\/\/127\.0\.0\.1:/);
      const res = await get(`${origin}/sync/v1/lab`, readFileSync(cert), token);
      expect(res.status).toBe(200);
      expect(JSON.parse(res.body).lab).toBe('Marrowfield pond');
      expect(res.protocol).toMatch(/^TLSv1\.[23]$/);
    } finally {
      await app.close();
      await store.close();
    }
  });
});
