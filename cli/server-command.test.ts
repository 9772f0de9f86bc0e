import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import type { LabInfo, SyncErrorBody } from '../schema/sync-protocol.ts';
import { DATABASE_FILE, openDataFolder } from '../server/data-folder.ts';
import { tokenHash } from '../server/tokens.ts';
import { startChildServer } from '../tests/sync/child-server.ts';
import { call, tempDir } from '../tests/sync/harness.ts';
import { capturedIo } from './captured-io.ts';
import { run } from './server-command.ts';

const LAB = 'Marrowfield pond';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

function captured(cwd: string) {
  const io = capturedIo(cwd);
  return { ...io, text: () => io.printed().join('\n'), errors: io.stderr };
}

/** A working folder with one lab in its default data folder. */
async function labFolder() {
  const cwd = tempDir();
  dirs.push(cwd);
  const io = captured(cwd);
  expect(await run(['add-lab', LAB], io)).toBe(0);
  return { cwd, io, data: join(cwd, 'rivalplate-data') };
}

/** Makes a token with `add-token` and reads it and its id from what the command printed. */
async function addToken(io: ReturnType<typeof captured>, ...options: string[]) {
  expect(await run(['add-token', LAB, ...options], io)).toBe(0);
  const [said, token] = io.printed().at(-1)!.split('\n');
  const id = /^Token ([0-9a-f]{8})\b/.exec(said!)![1]!;
  return { id, token: token! };
}

function tables(data: string) {
  const db = new Database(join(data, DATABASE_FILE), { readonly: true });
  try {
    return {
      labs: db.prepare('SELECT * FROM labs').all(),
      tokens: db.prepare('SELECT * FROM tokens ORDER BY rowid').all() as {
        hash: string;
        label: string | null;
        revoked_at: string | null;
      }[],
    };
  } finally {
    db.close();
  }
}

describe('rivalplate server add-lab / add-token', () => {
  it('adds a lab and shows a token once, keeping only its hash', async () => {
    const cwd = tempDir();
    dirs.push(cwd);
    const io = captured(cwd);
    expect(await run(['add-lab', LAB, '--photo-max-mb', '8'], io)).toBe(0);
    expect(await run(['add-token', LAB], io)).toBe(0);
    const token = io.text().split('\n').at(-1)!;
    expect(token).toMatch(/^rpt_[A-Za-z0-9_-]{43}$/);
    expect(io.text()).toContain(`Token ${tokenHash(token).slice(0, 8)} for lab "${LAB}"`);

    const db = new Database(join(cwd, 'rivalplate-data', DATABASE_FILE), { readonly: true });
    const stored = db.prepare('SELECT hash, label, revoked_at FROM tokens').all();
    const lab = db.prepare('SELECT photos_enabled, photo_max_bytes FROM labs').get();
    db.close();
    expect(stored).toEqual([{ hash: tokenHash(token), label: null, revoked_at: null }]);
    expect(JSON.stringify(stored)).not.toContain(token);
    expect(lab).toEqual({ photos_enabled: 1, photo_max_bytes: 8 * 1024 * 1024 });
  });

  it('says what was wrong: a lab that exists, a lab that does not, a bad option', async () => {
    const cwd = tempDir();
    dirs.push(cwd);
    const io = captured(cwd);
    await run(['add-lab', LAB, '--no-photos'], io);
    expect(await run(['add-lab', LAB], io)).toBe(2);
    expect(io.errors()).toContain(`a lab named "${LAB}" exists already`);
    expect(await run(['add-token', 'Pond B'], io)).toBe(1);
    expect(io.errors()).toContain('no lab named "Pond B"');
    expect(await run(['add-lab', 'X', '--photo-max-mb', 'lots'], io)).toBe(2);
    expect(io.errors()).toContain('--photo-max-mb expects a whole number above 0, got "lots"');
    expect(await run(['add-lab', 'X', '--photo-max-mb', '5000'], io)).toBe(2);
    expect(io.errors()).toContain('--photo-max-mb is at most 100, got 5000');
    expect(await run(['add-lab', 'X', '--max-mb', '0'], io)).toBe(2);
    expect(io.errors()).toContain('--max-mb expects a whole number above 0, got "0"');
    expect(await run(['start', '--colour', 'blue'], io)).toBe(2);
    expect(io.errors()).toContain("Unknown option '--colour'");
    expect(await run(['nothing'], io)).toBe(2);
  });

  it('answers --help with its usage and exit status 0, like the other commands', async () => {
    const cwd = tempDir();
    dirs.push(cwd);
    const io = captured(cwd);
    expect(await run(['--help'], io)).toBe(0);
    expect(io.text()).toContain('Usage:\n  rivalplate server start');
    expect(await run(['start', '--help'], io)).toBe(0);
    expect(existsSync(join(cwd, 'rivalplate-data'))).toBe(false);
  });
});

describe('rivalplate server list-tokens / revoke-token', () => {
  it("lists each token's id, label, dates and state, never the token or its hash", async () => {
    const { io, data } = await labFolder();
    const ana = await addToken(io, '--label', "  Ana's phone  ");
    const bench = await addToken(io);
    expect(io.text()).toContain(`Token ${ana.id} ("Ana's phone") for lab "${LAB}"`);
    expect(await run(['revoke-token', LAB, bench.id], io)).toBe(0);

    expect(await run(['list-tokens', LAB], io)).toBe(0);
    const lines = io.printed().at(-1)!.split('\n');
    const minute = String.raw`\d{4}-\d\d-\d\d \d\d:\d\d`;
    expect(lines[0]).toBe(`Tokens of lab "${LAB}" (times in UTC):`);
    expect(lines[1]).toMatch(/^id {8}made {14}last used {2}revoked {11}label$/);
    expect(lines[2]).toMatch(new RegExp(`^${ana.id}  ${minute}  never {6}no {16}Ana's phone$`));
    expect(lines[3]).toMatch(new RegExp(`^${bench.id}  ${minute}  never {6}${minute}$`));
    expect(lines).toHaveLength(4);
    // The revocation time listed is the one stored.
    const revokedAt = tables(data).tokens[1]!.revoked_at!;
    expect(lines[3]!.endsWith(revokedAt.slice(0, 16).replace('T', ' '))).toBe(true);
    for (const { token } of [ana, bench]) {
      expect(lines.join('\n')).not.toContain(token);
      expect(lines.join('\n')).not.toContain(tokenHash(token).slice(0, 9));
    }
  });

  it('says so when a lab has no tokens yet', async () => {
    const { io } = await labFolder();
    expect(await run(['list-tokens', LAB], io)).toBe(0);
    expect(io.printed().at(-1)).toBe(
      `Lab "${LAB}" has no tokens; make one with "server add-token".`,
    );
  });

  it("a revoked token is refused by a server already running, while the lab's other token works", async () => {
    const { io, data } = await labFolder();
    const ana = await addToken(io, '--label', "Ana's phone");
    const ben = await addToken(io, '--label', "Ben's phone");
    const server = await startChildServer(data);
    try {
      const lab = (token: string) => call<LabInfo & SyncErrorBody>(`${server.sync}/lab`, token);
      const day = new Date().toISOString().slice(0, 10);
      // Both tokens are accepted first, so a server that remembered them would keep doing so.
      expect((await lab(ana.token)).status).toBe(200);
      expect((await lab(ben.token)).status).toBe(200);

      expect(await run(['revoke-token', LAB, ana.id], io)).toBe(0);
      expect(io.text()).toContain(
        `Token ${ana.id} ("Ana's phone") of lab "${LAB}" revoked: the server refuses it`,
      );
      const revokedOn = tables(data).tokens[0]!.revoked_at!.slice(0, 10);
      for (const route of ['/lab', '/changes?since=0']) {
        const refused = await call<SyncErrorBody>(server.sync + route, ana.token);
        expect(refused.status).toBe(401);
        expect(refused.json).toEqual({
          error: 'bad-token',
          message: `this token was revoked on ${revokedOn}: ask the lab for a new one`,
        });
      }
      const still = await lab(ben.token);
      expect(still.status).toBe(200);
      expect(still.json.lab).toBe(LAB);

      // Both were used today (a run across midnight UTC may see the day before).
      expect(await run(['list-tokens', LAB], io)).toBe(0);
      const [, , anaRow, benRow] = io.printed().at(-1)!.split('\n');
      const used = new RegExp(`  (${day}|${new Date().toISOString().slice(0, 10)})  `);
      expect(anaRow).toMatch(used);
      expect(benRow).toMatch(used);
      expect(anaRow).not.toMatch(/ no +Ana's phone$/);
      expect(benRow).toMatch(/ no +Ben's phone$/);
    } finally {
      await server.stop();
    }
  });

  it('revoking a token again changes nothing and says when it was revoked', async () => {
    const { io, data } = await labFolder();
    const { id } = await addToken(io);
    expect(await run(['revoke-token', LAB, id.toUpperCase()], io)).toBe(0);
    const first = tables(data).tokens[0]!.revoked_at!;
    expect(await run(['revoke-token', LAB, id], io)).toBe(0);
    expect(io.printed().at(-1)).toBe(
      `Token ${id} of lab "${LAB}" was revoked already, on ${first.slice(0, 10)}; nothing changed.`,
    );
    expect(tables(data).tokens[0]!.revoked_at).toBe(first);
  });

  it('revokes every token of the lab whose hash starts with the id, and no other', async () => {
    const { io, data } = await labFolder();
    const { store } = openDataFolder(data);
    try {
      const lab = (await store.findLab(LAB))!;
      const other = await store.addLab('Pond B', { photosEnabled: false, photoMaxBytes: 0 });
      await store.addToken(lab.id, `abcd0123${'1'.repeat(56)}`, 'one');
      await store.addToken(lab.id, `abcd0123${'2'.repeat(56)}`, 'two');
      await store.addToken(lab.id, `abcd0124${'3'.repeat(56)}`, 'three');
      await store.addToken(other.id, `abcd0123${'4'.repeat(56)}`, 'other lab');
    } finally {
      await store.close();
    }
    expect(await run(['revoke-token', LAB, 'abcd0123'], io)).toBe(0);
    expect(io.printed().at(-1)).toContain('(2 tokens share this id; all are revoked)');
    const revoked = tables(data).tokens.map((t) => [t.label, t.revoked_at !== null]);
    expect(revoked).toEqual([
      ['one', true],
      ['two', true],
      ['three', false],
      ['other lab', false],
    ]);
  });

  it('says what was wrong and changes nothing: unknown lab or id, a bad id or label, no data', async () => {
    const { cwd, io, data } = await labFolder();
    const { id } = await addToken(io);
    const before = tables(data);
    const refusals: [string[], number, string][] = [
      [
        ['revoke-token', 'Pond B', id],
        1,
        'no lab named "Pond B"; add it first with "server add-lab"',
      ],
      [['list-tokens', 'Pond B'], 1, 'no lab named "Pond B"'],
      [
        ['revoke-token', LAB, id === '0badf00d' ? '0badf00e' : '0badf00d'],
        1,
        `lab "${LAB}" has no token 0badf0`,
      ],
      [['revoke-token', LAB, 'rpt_abc'], 2, '"rpt_abc" is not a token id'],
      [['revoke-token', LAB], 2, 'expected "server revoke-token LAB ID"'],
      [['list-tokens'], 2, 'expected "server list-tokens LAB"'],
      [['add-token', LAB, '--label', '  '], 2, '--label is empty'],
      [['add-token', LAB, '--label', 'a\nb'], 2, '--label: expected one line of text'],
      [['add-token', LAB, '--label', 'x'.repeat(61)], 2, '--label: expected at most 60'],
      [['revoke-token', LAB, id, '--data', 'elsewhere'], 1, 'no sync database in'],
      [['list-tokens', LAB, '--data', 'elsewhere'], 1, 'no sync database in'],
      [['add-token', LAB, '--data', 'elsewhere'], 1, 'no sync database in'],
    ];
    for (const [args, status, message] of refusals) {
      const errors = io.errors().length;
      expect(await run(args, io), args.join(' ')).toBe(status);
      expect(io.errors().slice(errors), args.join(' ')).toContain(message);
    }
    expect(tables(data)).toEqual(before);
    expect(existsSync(join(cwd, 'elsewhere'))).toBe(false);
  });

  it('refuses a database file it cannot use, naming the file, and leaves it as it was', async () => {
    const { cwd, io, data } = await labFolder();
    const file = join(data, DATABASE_FILE);
    const newer = new Database(file);
    newer.pragma('user_version = 99');
    newer.close();
    expect(await run(['add-lab', 'Pond B'], io)).toBe(1);
    expect(io.errors()).toContain(`cannot use ${file}: the database was written by a newer server`);

    const junk = join(cwd, 'junk');
    mkdirSync(junk);
    writeFileSync(join(junk, DATABASE_FILE), 'colony counts, not a database');
    expect(await run(['start', '--port', '0', '--data', 'junk'], io)).toBe(1);
    expect(io.errors()).toMatch(/cannot use .*junk.*rivalplate-sync\.sqlite: /);
    expect(readFileSync(join(junk, DATABASE_FILE), 'utf8')).toBe('colony counts, not a database');
  });
});
