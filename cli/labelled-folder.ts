import { readdir, readFile } from 'node:fs/promises';
import { basename, extname, isAbsolute, join } from 'node:path';

/**
 * A folder of plate photos labelled by hand: beside each photo a JSON file holding what a careful
 * person counted on it.
 *
 *   {"file": "plate_07.jpg", "width": W, "height": H, "batch": "…" (or "style"),
 *    "colonies": [{"x", "y", "r", "cls", "visible"?}]}
 *
 * Coordinates are the upright photo's pixels (EXIF orientation applied); `cls` is any colour name,
 * at most two per batch; `visible: false` marks a colony the labeller knows is there but that
 * cannot be seen in the photo (it counts neither for nor against a detection). Photos sharing a
 * batch are counted as one batch (one palette), as a lab counts one experiment's plates.
 */
export interface TruthColony {
  x: number;
  y: number;
  r: number;
  cls: string;
  visible: boolean;
}

export interface LabelledPhoto {
  photo: string;
  truthFile: string;
  batch: string;
  width: number;
  height: number;
  colonies: TruthColony[];
}

export class LabelError extends Error {
  override name = 'LabelError';
}

export async function readLabelledFolder(dir: string): Promise<LabelledPhoto[]> {
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    throw new LabelError(`${dir}: not a readable folder`);
  }
  const out: LabelledPhoto[] = [];
  for (const name of names.filter((n) => extname(n).toLowerCase() === '.json').sort()) {
    const path = join(dir, name);
    let raw: unknown;
    try {
      raw = JSON.parse(await readFile(path, 'utf8'));
    } catch (e) {
      throw new LabelError(`${path}: not JSON (${(e as Error).message})`);
    }
    if (!isRecord(raw) || !Array.isArray(raw.colonies)) continue; // an index or notes file
    out.push(parseTruth(raw, path, dir, names));
  }
  if (out.length === 0) throw new LabelError(`${dir}: no truth files (JSON with "colonies")`);
  return out;
}

function parseTruth(
  raw: Record<string, unknown>,
  path: string,
  dir: string,
  names: readonly string[],
): LabelledPhoto {
  const field = (f: string) => `${path}: field "${f}"`;
  const file = typeof raw.file === 'string' ? raw.file : photoBeside(path, names);
  if (!file) throw new LabelError(`${field('file')} is missing and no photo has this file's name`);
  const num = (v: unknown, f: string) => {
    if (typeof v !== 'number' || !Number.isFinite(v))
      throw new LabelError(`${field(f)} is not a number`);
    return v;
  };
  const width = num(raw.width, 'width');
  const height = num(raw.height, 'height');
  const colonies = (raw.colonies as unknown[]).map((c, i): TruthColony => {
    const f = `colonies[${i}]`;
    if (!isRecord(c)) throw new LabelError(`${field(f)} is not an object`);
    const x = num(c.x, `${f}.x`);
    const y = num(c.y, `${f}.y`);
    if (x < 0 || y < 0 || x > width || y > height)
      throw new LabelError(`${field(f)} lies outside the ${width}×${height} photo`);
    return {
      x,
      y,
      r: typeof c.r === 'number' && c.r > 0 ? c.r : 0,
      cls: String(c.cls ?? ''),
      visible: c.visible !== false,
    };
  });
  const batch = raw.batch ?? raw.style ?? '';
  return {
    photo: isAbsolute(file) ? file : join(dir, file),
    truthFile: path,
    batch: String(batch),
    width,
    height,
    colonies,
  };
}

function photoBeside(truthPath: string, names: readonly string[]): string | undefined {
  const stem = basename(truthPath, extname(truthPath));
  return names.find((n) => n !== basename(truthPath) && basename(n, extname(n)) === stem);
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}
