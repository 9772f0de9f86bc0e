/**
 * Serves the built app (vite's output folder) from the same origin as the sync routes, so a phone
 * needs one address for both. Paths that are not files get index.html: the app routes them.
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import fastifyStatic from '@fastify/static';
import type { FastifyInstance } from 'fastify';
import type { SyncErrorBody } from '../schema/sync-protocol.ts';
import { quotedPath } from './refusal.ts';

/**
 * Vite names the files under assets/ by their content hash, so they never change and may be
 * kept for good. Everything else (the page, the service worker, the manifest, icons) is checked
 * with the server on each visit, or a new app version would never reach the phone.
 */
const HASHED = /[\\/]assets[\\/]/;

export async function serveApp(app: FastifyInstance, appDir: string | null): Promise<void> {
  const built = appDir !== null && existsSync(join(appDir, 'index.html'));
  if (built) {
    await app.register(fastifyStatic, {
      root: appDir,
      cacheControl: false,
      setHeaders: (res, path) => {
        res.setHeader(
          'Cache-Control',
          HASHED.test(path) ? 'public, max-age=31536000, immutable' : 'no-cache',
        );
      },
    });
  }
  app.setNotFoundHandler((request, reply) => {
    if (built && request.method === 'GET' && !request.url.startsWith('/sync/'))
      return reply.header('Cache-Control', 'no-cache').sendFile('index.html');
    const body: SyncErrorBody = {
      error: 'not-found',
      message: request.url.startsWith('/sync/')
        ? `no sync route ${request.method} ${quotedPath(request.url)}`
        : // The folder stays out of the answer: it would tell anyone the server's file layout.
          'the app is not built on this server: whoever runs it should run "npx vite build" and start it again',
    };
    return reply.code(404).send(body);
  });
}
