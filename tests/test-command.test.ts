/**
 * The README's test command, read from package.json, against the tree: every source folder is
 * typechecked as a project reference with a tsconfig of its own (a missing one fails the build
 * instead of being skipped), and the browser is found or installed before the first test that
 * drives it.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { chromiumPath } from './support/chromium.ts';

const ROOT = resolve(import.meta.dirname, '..');
const scripts = (
  JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as {
    scripts: Record<string, string>;
  }
).scripts;

/** Folders holding TypeScript outside the tests' own tsconfig (tests/, configs at the root). */
function sourceFolders(): string[] {
  const skip = new Set(['node_modules', 'dist', 'tests', '.git']);
  return readdirSync(ROOT, { withFileTypes: true })
    .filter((d) => d.isDirectory() && !skip.has(d.name))
    .map((d) => d.name)
    .filter((name) =>
      readdirSync(join(ROOT, name), { recursive: true }).some((f) => /\.tsx?$/.test(String(f))),
    );
}

describe('the test command', () => {
  const realms = (
    JSON.parse(readFileSync(join(ROOT, 'tsconfig.json'), 'utf8')) as {
      references: { path: string }[];
    }
  ).references.map((r) => r.path.replace(/^\.\//, ''));

  it('typechecks every source folder as a project reference, each with its own tsconfig', () => {
    expect(scripts.typecheck).toBe('tsc -b');
    for (const folder of sourceFolders()) expect(realms, folder).toContain(folder);
    expect(realms).toContain('tsconfig.tests.json');
    // `tsc -b` fails on a reference whose tsconfig is missing; this names which.
    for (const realm of realms)
      expect(
        existsSync(join(ROOT, realm.endsWith('.json') ? realm : join(realm, 'tsconfig.json'))),
        realm,
      ).toBe(true);
  });

  it('finds or installs the browser before the unit tests, which drive it too', () => {
    const unit = scripts['test:unit'] ?? '';
    expect(unit.indexOf('tests/e2e/ensure-chromium.sh')).toBe(0);
    expect(unit.indexOf('vitest run')).toBeGreaterThan(0);
    expect(scripts.test).toMatch(/npm run test:unit && npm run test:e2e$/);
  });

  it('says clearly when the browser it is pointed at is not there, and goes on when it is', () => {
    const ensure = (path: string) =>
      spawnSync('bash', [join(ROOT, 'tests/e2e/ensure-chromium.sh')], {
        env: { ...process.env, RIVALPLATE_CHROMIUM: path },
        encoding: 'utf8',
      });
    const missing = ensure('/nonexistent/chromium');
    expect(missing.status).toBe(1);
    expect(missing.stderr).toContain(
      'RIVALPLATE_CHROMIUM=/nonexistent/chromium is not an executable file',
    );
    // Any executable stands in for the browser here: the script checks that it can run it.
    expect(ensure(process.execPath).status).toBe(0);
  });

  it('looks for chromium on PATH, and stops with what to do when there is none and no way to install', () => {
    // A PATH of one folder holding only what the script itself runs: no browser, no apt-get.
    const bin = mkdtempSync(join(tmpdir(), 'rivalplate-path-'));
    const id = spawnSync('/bin/sh', ['-c', 'command -v id'], { encoding: 'utf8' }).stdout.trim();
    symlinkSync(id, join(bin, 'id'));
    const env = { PATH: bin, HOME: process.env.HOME ?? '/' };
    const run = () =>
      spawnSync('/bin/bash', [join(ROOT, 'tests/e2e/ensure-chromium.sh')], {
        env,
        encoding: 'utf8',
      });
    const absent = run();
    expect(absent.status).toBe(1);
    expect(absent.stderr).toContain(
      'No chromium on PATH, and this shell cannot install it. Install it (Debian: apt-get install -y chromium)',
    );
    expect(chromiumPath(env)).toBeNull();
    // Any executable named chromium stands in for the browser: the lookup only finds it.
    symlinkSync(process.execPath, join(bin, 'chromium'));
    expect(run().status).toBe(0);
    expect(chromiumPath(env)).toBe(join(bin, 'chromium'));
  });
});
