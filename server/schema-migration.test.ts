/**
 * A data folder made by the first server version, built here with that version's own tables,
 * opened by this one: its lab and tokens keep working over real HTTP, and a token can then be
 * revoked.
 */
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import type { LabInfo, PushResponse, SyncErrorBody } from '../schema/sync-protocol.ts';
import { call, startTestServer, tempDir } from '../tests/sync/harness.ts';
import { benchSession } from '../tests/sync/marrowfield.ts';
import { DATABASE_FILE, openDataFolder } from './data-folder.ts';
import { newToken, tokenHash, tokenId } from './tokens.ts';

/** Schema version 1, as the first server wrote it. Frozen: it is what files in the field hold. */
const VERSION_1 = `
CREATE TABLE labs (
  id INTEGER PRIMARY KEY,
  name TEXT NOT NULL UNIQUE,
  photos_enabled INTEGER NOT NULL,
  photo_max_bytes INTEGER NOT NULL,
  created_at TEXT NOT NULL
);
CREATE TABLE tokens (
  hash TEXT PRIMARY KEY,
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  created_at TEXT NOT NULL
);
CREATE TABLE revisions (
  seq INTEGER PRIMARY KEY AUTOINCREMENT,
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  kind TEXT NOT NULL,
  record_id TEXT NOT NULL,
  hash TEXT NOT NULL,
  revision INTEGER NOT NULL,
  updated_at TEXT NOT NULL,
  deleted INTEGER NOT NULL,
  body TEXT,
  device TEXT NOT NULL,
  received_at TEXT NOT NULL,
  UNIQUE (lab_id, kind, record_id, hash)
);
CREATE TABLE records (
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  kind TEXT NOT NULL,
  record_id TEXT NOT NULL,
  last_seq INTEGER NOT NULL,
  heads TEXT NOT NULL,
  PRIMARY KEY (lab_id, kind, record_id)
);
CREATE INDEX records_by_seq ON records (lab_id, last_seq);
CREATE TABLE uploads (
  lab_id INTEGER NOT NULL REFERENCES labs(id),
  photo_id TEXT NOT NULL,
  plate_id TEXT NOT NULL,
  bytes INTEGER NOT NULL,
  type TEXT NOT NULL,
  sha256 TEXT NOT NULL,
  received INTEGER NOT NULL,
  complete INTEGER NOT NULL,
  PRIMARY KEY (lab_id, photo_id)
);
CREATE TABLE chunks (
  lab_id INTEGER NOT NULL,
  photo_id TEXT NOT NULL,
  start INTEGER NOT NULL,
  data BLOB NOT NULL,
  PRIMARY KEY (lab_id, photo_id, start)
);
`;

const dir = tempDir();
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The data folder as the first version left it: one lab with two tokens. */
function versionOneFolder(tokens: string[]): void {
  const db = new Database(join(dir, DATABASE_FILE));
  db.pragma('journal_mode = WAL');
  db.exec(VERSION_1);
  db.prepare(
    "INSERT INTO labs VALUES (1, 'Marrowfield pond', 0, 0, '2024-03-01T09:00:00.000Z')",
  ).run();
  for (const token of tokens)
    db.prepare("INSERT INTO tokens VALUES (?, 1, '2024-03-01T09:05:00.000Z')").run(
      tokenHash(token),
    );
  db.pragma('user_version = 1');
  db.close();
}

describe('a database of schema version 1', () => {
  it('opens with its tokens still valid, lists them without labels, and can revoke one', async () => {
    const [kept, revoked] = [newToken(), newToken()];
    versionOneFolder([kept, revoked]);
    const old = new Database(join(dir, DATABASE_FILE));
    old
      .prepare(
        `INSERT INTO revisions (lab_id, kind, record_id, hash, revision, updated_at, deleted, body, device, received_at)
         VALUES (1, 'plates', 'mf-old', ?, 1, '2024-03-01T09:10:00.000Z', 0, '{"note":"池塘"}', 'phone-ü', '2024-03-01T09:10:00.000Z')`,
      )
      .run('c'.repeat(64));
    old.close();

    const server = await startTestServer({ dir });
    try {
      const lab = (token: string) => call<LabInfo & SyncErrorBody>(`${server.sync}/lab`, token);
      for (const token of [kept, revoked]) {
        const answer = await lab(token);
        expect(answer.status).toBe(200);
        expect(answer.json).toMatchObject({ lab: 'Marrowfield pond', photos: { enabled: false } });
      }
      // The other tables of the old file take pushes as before.
      const pushed = await call<PushResponse>(`${server.sync}/push`, kept, {
        body: { device: 'phone-a', changes: benchSession(1) },
      });
      expect(pushed.status).toBe(200);
      expect(pushed.json.accepted).toHaveLength(benchSession(1).length);
      expect(await server.rows('PRAGMA user_version')).toEqual([{ user_version: 3 }]);
      // The lab's count of stored bytes, begun by the migration over the old revision and kept
      // by the server over the push, matches the bytes stored (UTF-8, as the server counts).
      expect(await server.rows('SELECT used_bytes AS n FROM labs')).toEqual(
        await server.rows(
          `SELECT sum(length(CAST(coalesce(body, '') AS BLOB)) + length(CAST(device AS BLOB))
                      + length(CAST(record_id AS BLOB)) + 100) AS n FROM revisions`,
        ),
      );

      // A second connection, as the command line opens one while the server runs.
      const { store } = openDataFolder(dir);
      try {
        const listed = await store.listTokens(1);
        expect(listed.map((t) => [t.id, t.label, t.createdAt, t.revokedAt])).toEqual(
          [kept, revoked].map((t) => [
            tokenId(tokenHash(t)),
            null,
            '2024-03-01T09:05:00.000Z',
            null,
          ]),
        );
        const before = await store.revokeToken(1, tokenId(tokenHash(revoked)));
        expect(before).toHaveLength(1);
      } finally {
        await store.close();
      }

      const refused = await lab(revoked);
      expect(refused.status).toBe(401);
      expect(refused.json.error).toBe('bad-token');
      expect(refused.json.message).toMatch(/^this token was revoked on \d{4}-\d\d-\d\d: ask the/);
      expect((await lab(kept)).status).toBe(200);
    } finally {
      await server.close();
    }
  });

  it('a file from a newer server is refused on open, its tables untouched', () => {
    const newer = tempDir();
    try {
      const db = new Database(join(newer, DATABASE_FILE));
      db.pragma('user_version = 99');
      db.close();
      expect(() => openDataFolder(newer)).toThrow(
        'the database was written by a newer server (schema 99, this one knows 3)',
      );
      const after = new Database(join(newer, DATABASE_FILE), { readonly: true });
      expect(after.pragma('user_version', { simple: true })).toBe(99);
      expect(after.prepare('SELECT name FROM sqlite_master').all()).toEqual([]);
      after.close();
    } finally {
      rmSync(newer, { recursive: true, force: true });
    }
  });
});
