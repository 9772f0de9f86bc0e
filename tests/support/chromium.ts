/**
 * Where the browser tests find Chromium: RIVALPLATE_CHROMIUM if set, else `chromium` or
 * `chromium-browser` on PATH, the lookup tests/e2e/ensure-chromium.sh makes (and installs for)
 * before any browser test runs. Null when there is none.
 */
import { accessSync, constants, statSync } from 'node:fs';
import { delimiter, join } from 'node:path';

const NAMES = ['chromium', 'chromium-browser'];

function executable(path: string): boolean {
  try {
    accessSync(path, constants.X_OK);
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

export function chromiumPath(env: NodeJS.ProcessEnv = process.env): string | null {
  if (env.RIVALPLATE_CHROMIUM) return env.RIVALPLATE_CHROMIUM;
  for (const name of NAMES)
    for (const dir of (env.PATH ?? '').split(delimiter).filter(Boolean)) {
      const path = join(dir, name);
      if (executable(path)) return path;
    }
  return null;
}

/** The path, or an error that says what to do (the tests run after ensure-chromium.sh). */
export function requiredChromium(): string {
  const path = chromiumPath();
  if (path) return path;
  throw new Error(
    'no chromium on PATH: run tests/e2e/ensure-chromium.sh, or set RIVALPLATE_CHROMIUM to its path',
  );
}
