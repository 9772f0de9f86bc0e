import { readFile, writeFile } from 'node:fs/promises';
import type { Palette, PaletteColour } from '../cv/index.ts';

/**
 * Palette files: the JSON form of cv's Palette, `{"version": 1, "colours": [A, B]}` with each
 * colour `{"name", "hex", "deltaLab": [ΔL*, Δa*, Δb*], "spread"}`. Read back through one check
 * that names the field at fault.
 */
export class PaletteFileError extends Error {
  override name = 'PaletteFileError';
}

export async function readPaletteFile(path: string): Promise<Palette> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new PaletteFileError(`${path}: cannot read the palette file`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new PaletteFileError(`${path}: not JSON (${(e as Error).message})`);
  }
  return checkPalette(json, path);
}

export async function writePaletteFile(path: string, palette: Palette): Promise<void> {
  await writeFile(path, `${JSON.stringify(palette, null, 2)}\n`);
}

export function checkPalette(json: unknown, where: string): Palette {
  const fail = (field: string, want: string): never => {
    throw new PaletteFileError(`${where}: ${field} must be ${want}`);
  };
  if (typeof json !== 'object' || json === null) return fail('the file', 'a JSON object');
  const o = json as Record<string, unknown>;
  if (o.version !== 1) fail('version', '1');
  if (!Array.isArray(o.colours) || o.colours.length !== 2) fail('colours', 'a list of two colours');
  const colours = (o.colours as unknown[]).map((c, i): PaletteColour => {
    const at = `colours[${i}]`;
    if (typeof c !== 'object' || c === null) return fail(at, 'an object');
    const p = c as Record<string, unknown>;
    if (typeof p.name !== 'string' || p.name.trim() === '') fail(`${at}.name`, 'a non-empty text');
    if (typeof p.hex !== 'string' || !/^#[0-9a-f]{6}$/i.test(p.hex))
      fail(`${at}.hex`, 'a colour like #3a5fc0');
    const d = p.deltaLab;
    if (!Array.isArray(d) || d.length !== 3 || !d.every((v) => Number.isFinite(v))) {
      fail(`${at}.deltaLab`, 'three finite numbers [ΔL*, Δa*, Δb*]');
    }
    if (typeof p.spread !== 'number' || !(p.spread > 0) || !Number.isFinite(p.spread)) {
      fail(`${at}.spread`, 'a positive number');
    }
    const [dl, da, db] = d as [number, number, number];
    return {
      name: p.name as string,
      hex: p.hex as string,
      deltaLab: [dl, da, db],
      spread: p.spread as number,
    };
  });
  if (colours[0]!.name === colours[1]!.name)
    fail('colours[1].name', 'different from colours[0].name');
  return { version: 1, colours: [colours[0]!, colours[1]!] };
}
