import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

/**
 * Which top-level folder may import which (DEVELOPERS.md draws the same picture). Pure cores sit
 * at the bottom; nothing imports upward. npm packages are policed per realm too: the pure cores
 * must not pull in React or the DOM-bound storage libraries.
 */
const ROOT = resolve(import.meta.dirname, '..');
const MAY_IMPORT: Record<string, string[]> = {
  cv: ['cv'],
  fitness: ['fitness'],
  schema: ['schema'],
  fixtures: ['fixtures'],
  worker: ['worker', 'cv'],
  web: ['web', 'worker', 'fitness', 'schema'],
  server: ['server', 'fitness', 'schema'],
  cli: ['cli', 'cv', 'fitness', 'schema', 'server'],
};
const FORBIDDEN_PACKAGES: Record<string, RegExp> = {
  cv: /^(react|react-dom|idb|comlink|workbox-|sharp|node:)/,
  fitness: /^(react|react-dom|idb|comlink|workbox-|@techstark\/opencv-js|sharp|node:)/,
  schema: /^(react|react-dom|idb|comlink|workbox-|@techstark\/opencv-js|sharp|node:)/,
  worker: /^(react|react-dom|idb|sharp|node:)/,
  web: /^(@techstark\/opencv-js|sharp|better-sqlite3|fastify|node:)/,
  server: /^(react|react-dom|idb|comlink|workbox-|@techstark\/opencv-js)/,
};

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (name === 'node_modules' || name === 'dist') continue;
    if (statSync(path).isDirectory()) out.push(...sourceFiles(path));
    else if (/\.(ts|tsx)$/.test(name) && !/\.test\.tsx?$/.test(name)) out.push(path);
  }
  return out;
}

function importsOf(source: string): string[] {
  const specs: string[] = [];
  const re = /(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
  for (const m of source.matchAll(re)) specs.push((m[1] ?? m[2])!);
  return specs;
}

function violations(): string[] {
  const found: string[] = [];
  for (const realm of Object.keys(MAY_IMPORT)) {
    let files: string[];
    try {
      files = sourceFiles(join(ROOT, realm));
    } catch {
      continue; // the folder does not exist yet
    }
    for (const file of files) {
      for (const spec of importsOf(readFileSync(file, 'utf8'))) {
        const where = relative(ROOT, file);
        if (spec.startsWith('.')) {
          const target = relative(ROOT, resolve(file, '..', spec)).split(sep)[0]!;
          if (!MAY_IMPORT[realm]!.includes(target))
            found.push(`${where} imports ${spec} (${target}/)`);
        } else if (FORBIDDEN_PACKAGES[realm]?.test(spec)) {
          found.push(`${where} imports package ${spec}`);
        }
      }
    }
  }
  return found;
}

describe('layering (DEVELOPERS.md, "Who may import whom")', () => {
  it('no folder imports a folder above it or a package outside its realm', () => {
    expect(violations()).toEqual([]);
  });

  it('the checker itself catches an upward import', () => {
    expect(importsOf("import { x } from '../web/app.ts';")).toEqual(['../web/app.ts']);
    expect(importsOf("export type { Y } from './y.ts'")).toEqual(['./y.ts']);
    expect(importsOf("const m = await import('../cv/opencv.ts')")).toEqual(['../cv/opencv.ts']);
  });
});
