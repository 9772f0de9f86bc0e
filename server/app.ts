/**
 * The sync server as a Fastify instance: the protocol's routes under /sync/v1 behind the lab
 * token, the built app everywhere else. Listening is left to the caller, so tests and the
 * command line start it the same way.
 */
import Fastify, { type FastifyInstance } from 'fastify';
import { SYNC_BASE_PATH, SYNC_PROTOCOL } from '../schema/sync-protocol.ts';
import { requireLabToken } from './auth.ts';
import { frameworkErrors, installErrorReply } from './error-reply.ts';
import { installHeaders } from './headers.ts';
import { quotedPath, SyncRefusal } from './refusal.ts';
import { photoRoutes } from './routes/photo-routes.ts';
import { recordRoutes } from './routes/record-routes.ts';
import { serveApp } from './static-app.ts';
import type { SyncStore } from './storage/sync-store.ts';
import { checkCompiler } from './validation.ts';

export interface SyncServerOptions {
  store: SyncStore;
  /** The built app's folder, or null to serve only the sync routes. */
  appDir: string | null;
  /** Log one JSON line per request to stdout. */
  log: boolean;
  /** PEM certificate and key: serve HTTPS directly instead of behind a TLS proxy. */
  tls?: { cert: Buffer; key: Buffer };
}

export async function buildSyncServer(options: SyncServerOptions): Promise<FastifyInstance> {
  const app = Fastify({
    logger: options.log,
    // A phone on a poor network may take a while over an 8 MiB push, but not forever: a request
    // that stalls longer than this is dropped, and the phone retries.
    requestTimeout: 120_000,
    frameworkErrors,
    ...(options.tls ? { https: options.tls } : {}),
  }) as unknown as FastifyInstance;
  app.setValidatorCompiler(checkCompiler);
  // The protocol speaks JSON (and octet-stream for photo chunks): text is refused as the wrong
  // type instead of being parsed into a string that then fails every check.
  app.removeContentTypeParser('text/plain');
  installErrorReply(app);
  installHeaders(app);

  await app.register(
    async (scope) => {
      requireLabToken(scope, options.store);
      recordRoutes(scope, options.store);
      photoRoutes(scope, options.store);
    },
    { prefix: SYNC_BASE_PATH },
  );

  // An app from before this protocol version asks under an older path: tell it to update
  // instead of answering "not found".
  app.all<{ Params: { version: string } }>('/sync/:version/*', async (request) => {
    const asked = /^v(\d+)$/.exec(request.params.version);
    if (asked && Number(asked[1]) < SYNC_PROTOCOL)
      throw new SyncRefusal(
        'version-too-old',
        `this app speaks sync protocol ${asked[1]}; the server needs ${SYNC_PROTOCOL}: update the app`,
      );
    throw new SyncRefusal(
      'not-found',
      `no sync route ${request.method} ${quotedPath(request.url)}`,
    );
  });

  await serveApp(app, options.appDir);
  return app;
}
