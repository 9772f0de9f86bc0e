import { rmSync } from 'node:fs';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, it } from 'vitest';
import { DATABASE_FILE } from '../server/data-folder.ts';
import { tokenHash } from '../server/tokens.ts';
import { tempDir } from '../tests/sync/harness.ts';
import { capturedIo } from './captured-io.ts';
import { run } from './server-command.ts';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

function captured(cwd: string) {
  const io = capturedIo(cwd);
  return { ...io, text: () => io.printed().join('\n'), errors: io.stderr };
}

describe('rivalplate server add-lab / add-token', () => {
  it('adds a lab and shows a token once, keeping only its hash', async () => {
    const cwd = tempDir();
    dirs.push(cwd);
    const io = captured(cwd);
    expect(await run(['add-lab', 'Marrowfield pond', '--photo-max-mb', '8'], io)).toBe(0);
    expect(await run(['add-token', 'Marrowfield pond'], io)).toBe(0);
    const token = io.text().split('\n').at(-1)!;
    expect(token).toMatch(/^rpt_[A-Za-z0-9_-]{43}$/);

    const db = new Database(join(cwd, 'rivalplate-data', DATABASE_FILE), { readonly: true });
    const stored = db.prepare('SELECT hash FROM tokens').all();
    const lab = db.prepare('SELECT photos_enabled, photo_max_bytes FROM labs').get();
    db.close();
    expect(stored).toEqual([{ hash: tokenHash(token) }]);
    expect(JSON.stringify(stored)).not.toContain(token);
    expect(lab).toEqual({ photos_enabled: 1, photo_max_bytes: 8 * 1024 * 1024 });
  });

  it('says what was wrong: a lab that exists, a lab that does not, a bad option', async () => {
    const cwd = tempDir();
    dirs.push(cwd);
    const io = captured(cwd);
    await run(['add-lab', 'Marrowfield pond', '--no-photos'], io);
    expect(await run(['add-lab', 'Marrowfield pond'], io)).toBe(2);
    expect(io.errors()).toContain('a lab named "Marrowfield pond" exists already');
    expect(await run(['add-token', 'Pond B'], io)).toBe(1);
    expect(io.errors()).toContain('no lab named "Pond B"');
    expect(await run(['add-lab', 'X', '--photo-max-mb', 'lots'], io)).toBe(2);
    expect(io.errors()).toContain('--photo-max-mb expects a whole number above 0, got "lots"');
    expect(await run(['start', '--colour', 'blue'], io)).toBe(2);
    expect(io.errors()).toContain("Unknown option '--colour'");
    expect(await run(['nothing'], io)).toBe(2);
  });
});
