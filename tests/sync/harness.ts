/**
 * A real sync server for tests: a fresh database of the engine under test (test-database.ts: a
 * SQLite file in a temporary folder, or a new PostgreSQL database), Fastify listening on
 * 127.0.0.1 on a free port, labs and tokens made through the same store the command line uses.
 */
import { SYNC_BASE_PATH } from '../../schema/sync-protocol.ts';
import { buildSyncServer } from '../../server/app.ts';
import type { LabSettings } from '../../server/storage/sync-store.ts';
import { newToken, tokenHash } from '../../server/tokens.ts';
import { dropDatabase, freshDatabase, openReader, openTestStore } from './test-database.ts';

export { freePort } from '../support/free-port.ts';

export { ENGINE, freshDatabase, tempDir } from './test-database.ts';

export interface TestServer {
  /** Base URL of the sync routes, e.g. http://127.0.0.1:41234/sync/v1 */
  sync: string;
  origin: string;
  /** Adds a lab and returns a fresh token for it. */
  lab(name: string, settings?: Partial<LabSettings>): Promise<string>;
  /**
   * Rows in a table, read through a separate connection, as another process would see them
   * (`?` placeholders, on either engine).
   */
  rows(sql: string, ...params: unknown[]): Promise<unknown[]>;
  close(): Promise<void>;
}

export async function startTestServer(
  /**
   * `dir`: the database (from freshDatabase) to serve, kept on close; `port`: a fixed one lets a
   * restarted server keep its address (see `freePort`); `maxBytes`: SQLite's file cap.
   */
  options: { dir?: string; maxBytes?: number; appDir?: string; port?: number } = {},
): Promise<TestServer> {
  const dir = options.dir ?? (await freshDatabase());
  const store = await openTestStore(dir, options.maxBytes);
  const app = await buildSyncServer({ store, appDir: options.appDir ?? null, log: false });
  const origin = await app.listen({ port: options.port ?? 0, host: '127.0.0.1' });
  const reader = await openReader(dir);
  return {
    sync: origin + SYNC_BASE_PATH,
    origin,
    async lab(name, settings = {}) {
      const lab =
        (await store.findLab(name)) ??
        (await store.addLab(name, {
          photosEnabled: true,
          photoMaxBytes: 4 * 1024 * 1024,
          ...settings,
        }));
      const token = newToken();
      await store.addToken(lab.id, tokenHash(token));
      return token;
    },
    rows: (sql, ...params) => reader.rows(sql, ...params),
    async close() {
      await reader.close();
      await app.close();
      await store.close();
      if (!options.dir) await dropDatabase(dir);
    },
  };
}

/** A JSON request with the lab's token; resolves to the status and the parsed answer. */
export async function call<T = unknown>(
  url: string,
  token: string | null,
  init: { method?: string; body?: unknown; raw?: string | Buffer; type?: string } = {},
): Promise<{ status: number; json: T }> {
  const headers: Record<string, string> = {};
  if (token) headers.authorization = `Bearer ${token}`;
  let body: string | Uint8Array<ArrayBuffer> | undefined;
  if (init.body !== undefined) {
    body = JSON.stringify(init.body);
    headers['content-type'] = 'application/json';
  } else if (init.raw !== undefined) {
    body = typeof init.raw === 'string' ? init.raw : new Uint8Array(init.raw);
    headers['content-type'] = init.type ?? 'application/json';
  }
  const res = await fetch(url, { method: init.method ?? (body ? 'POST' : 'GET'), headers, body });
  const text = await res.text();
  return { status: res.status, json: (text ? JSON.parse(text) : null) as T };
}
