import { readFile } from 'node:fs/promises';
import { dirname, isAbsolute, join } from 'node:path';

/**
 * Corrected plates as JSON Lines, one object per checked photo:
 *
 *   {"file": PATH, "colonies": [{"x": X, "y": Y, "cls": NAME}, ...]}
 *
 * x, y in the upright photo's full-resolution pixels; `cls` any text, at most two names in the
 * whole file (the lab's own colour names); `file` relative to the JSON Lines file or absolute.
 * Blank lines are skipped. Every problem is named by file, line and field.
 */
export interface CorrectedPlate {
  /** The photo's path as resolved. */
  photo: string;
  /** Line in the JSON Lines file (1-based). */
  line: number;
  colonies: { x: number; y: number; cls: string }[];
}

export class CorrectedFileError extends Error {
  override name = 'CorrectedFileError';
}

export async function readCorrectedFile(
  path: string,
): Promise<{ plates: CorrectedPlate[]; names: string[] }> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new CorrectedFileError(`${path}: cannot read the file`);
  }
  const plates: CorrectedPlate[] = [];
  const names: string[] = [];
  const lines = text.split(/\r?\n/);
  lines.forEach((raw, i) => {
    const line = i + 1;
    if (raw.trim() === '') return;
    const fail = (what: string): never => {
      throw new CorrectedFileError(`${path}: line ${line}: ${what}`);
    };
    let v: unknown;
    try {
      v = JSON.parse(raw);
    } catch (e) {
      fail(`not JSON (${(e as Error).message})`);
    }
    if (typeof v !== 'object' || v === null || Array.isArray(v)) fail('not a JSON object');
    const o = v as Record<string, unknown>;
    if (typeof o.file !== 'string' || o.file === '') fail('"file" must name the photo');
    if (!Array.isArray(o.colonies)) fail('"colonies" must be a list');
    const colonies = (o.colonies as unknown[]).map((c, k) => {
      const at = `colonies[${k}]`;
      if (typeof c !== 'object' || c === null) fail(`"${at}" is not an object`);
      const col = c as Record<string, unknown>;
      for (const f of ['x', 'y'] as const) {
        if (typeof col[f] !== 'number' || !Number.isFinite(col[f]) || (col[f] as number) < 0) {
          fail(`"${at}.${f}" must be a number ≥ 0 (pixels of the upright photo)`);
        }
      }
      if (typeof col.cls !== 'string' || col.cls.trim() === '')
        fail(`"${at}.cls" must name a colour`);
      const cls = (col.cls as string).trim();
      if (!names.includes(cls)) {
        if (names.length === 2) {
          fail(
            `"${at}.cls" is a third colour name "${cls}" (this file already uses "${names[0]}" and "${names[1]}")`,
          );
        }
        names.push(cls);
      }
      return { x: col.x as number, y: col.y as number, cls };
    });
    const file = o.file as string;
    plates.push({ photo: isAbsolute(file) ? file : join(dirname(path), file), line, colonies });
  });
  if (plates.length === 0) throw new CorrectedFileError(`${path}: no corrected plates in the file`);
  return { plates, names };
}
