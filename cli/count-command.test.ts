import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { readTruth } from '../fixtures/plate-files.ts';
import { scoreDetections } from '../fixtures/score.ts';
import { capturedIo } from './captured-io.ts';
import { main } from './main.ts';

const DEMO = 'fixtures/demo';

async function runCount(args: string[]) {
  const io = capturedIo('.');
  const code = await main(['count', ...args], io);
  return { code, out: io.stdout(), err: io.stderr() };
}

describe('rivalplate count on the demo plates', () => {
  let lines: Record<string, unknown>[] = [];
  beforeAll(async () => {
    const r = await runCount(['--json', DEMO]);
    expect(r.code).toBe(0);
    lines = r.out
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
  }, 120_000);

  it('prints one JSON object per photo with the documented fields', () => {
    expect(lines).toHaveLength(6);
    for (const l of lines) {
      expect(Object.keys(l)).toEqual(
        expect.arrayContaining(['file', 'width', 'height', 'dish', 'colonies', 'counts', 'ms']),
      );
      expect(l.width).toBe(1600);
      expect(l.height).toBe(1200);
    }
  });

  it('counts each demo plate within 8 % of its truth, in the same two colours', async () => {
    const manifest = JSON.parse(await readFile(join(DEMO, 'manifest.json'), 'utf8')) as {
      plates: { file: string; counts: [number, number] }[];
    };
    for (const plate of manifest.plates) {
      const line = lines.find((l) => String(l.file).endsWith(plate.file))!;
      const counts = line.counts as Record<string, number>;
      const truthTotal = plate.counts[0] + plate.counts[1];
      const total = (counts.blue ?? 0) + (counts.cream ?? 0);
      expect(Math.abs(total - truthTotal) / truthTotal, plate.file).toBeLessThan(0.08);
    }
  });

  it('reports an EXIF-rotated photo in upright pixels, where its truth puts the colonies', async () => {
    const file = 'marrowfield-L5-day1-rotated.jpg';
    const line = lines.find((l) => String(l.file).endsWith(file))!;
    const truth = await readTruth(join(DEMO, file.replace('.jpg', '.truth.json')));
    const colonies = line.colonies as { x: number; y: number }[];
    expect(scoreDetections(truth, colonies).recall).toBeGreaterThan(0.9);
  });
});

describe('rivalplate count on bad input', () => {
  let dir = '';
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'rivalplate-count-'));
    const good = await readFile(join(DEMO, 'marrowfield-L2-day0.jpg'));
    await writeFile(join(dir, 'a-good.jpg'), good);
    await writeFile(join(dir, 'b-empty.jpg'), '');
    await writeFile(join(dir, 'c-notes.png'), 'plate 4 was dropped on the floor\n');
    await writeFile(join(dir, 'd-cut-short.jpg'), good.subarray(0, good.length >> 1));
  });

  it('names each bad file and why, counts the rest, and exits 1', async () => {
    const r = await runCount(['--json', dir]);
    expect(r.code).toBe(1);
    const counted = r.out
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(counted.find((l) => l.file.endsWith('a-good.jpg')).total).toBeGreaterThan(100);
    expect(r.err).toMatch(/b-empty\.jpg: the file is empty \(0 bytes\)/);
    expect(r.err).toMatch(/c-notes\.png: not a readable JPEG, PNG or WebP image/);
    expect(r.err).toMatch(/d-cut-short\.jpg: the image data is damaged or cut short/);
    expect(r.err).not.toMatch(/a-good/);
  }, 60_000);

  it('reports a missing file and a bad palette file clearly', async () => {
    const missing = await runCount([join(dir, 'nope.jpg')]);
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/nope\.jpg: no such file/);
    const palette = join(dir, 'palette.json');
    await writeFile(palette, JSON.stringify({ version: 1, colours: [{ name: 'blue' }] }));
    const bad = await runCount(['--palette', palette, join(dir, 'a-good.jpg')]);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/palette\.json: colours must be a list of two colours/);
  });

  it('refuses conflicting options with its usage', async () => {
    const r = await runCount(['--json', '--csv', DEMO]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/choose one of --json and --csv/);
  });
});

describe('rivalplate count options', () => {
  it('saves the batch palette and classifies a later plate against it', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'rivalplate-palette-'));
    const palette = join(dir, 'palette.json');
    const first = await runCount(['--save-palette', palette, DEMO]);
    expect(first.code).toBe(0);
    const saved = JSON.parse(await readFile(palette, 'utf8'));
    expect(saved.colours.map((c: { name: string }) => c.name).sort()).toEqual(['blue', 'cream']);
    // The person names the palette's two classes; the columns keep those names and that order.
    const names = saved.colours.map((c: { name: string }) =>
      c.name === 'blue' ? 'anc' : 'evolved',
    );
    const later = await runCount([
      '--csv',
      '--palette',
      palette,
      '--names',
      names.join(','),
      join(DEMO, 'marrowfield-L6-day1-mostly-blue.jpg'),
    ]);
    const [header, row] = later.out.trim().split('\n');
    expect(header).toMatch(
      new RegExp(
        `^file,width,height,dish_cx,dish_cy,dish_r,total,count_${names[0]},count_${names[1]},`,
      ),
    );
    const cells = row!.split(',');
    const blue = Number(cells[names[0] === 'anc' ? 7 : 8]);
    const cream = Number(cells[names[0] === 'anc' ? 8 : 7]);
    expect(blue).toBeGreaterThan(180); // truth 194 blue : 6 cream
    expect(cream).toBeLessThanOrEqual(10);
  }, 120_000);

  it('names its count columns by class, never by a measured colour', async () => {
    const plain = await runCount(['--csv', join(DEMO, 'marrowfield-L2-day0.jpg')]);
    expect(plain.out.split('\n')[0]).toMatch(/,total,count_colour_1,count_colour_2,/);
    const bad = await runCount(['--csv', '--names', 'red', DEMO]);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--names takes two different names/);
  }, 120_000);

  it('decodes a 100-megapixel photo at a reduced size and reports it in full-size pixels', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'rivalplate-big-'));
    const big = join(dir, 'big.jpg');
    await sharp(join(DEMO, 'marrowfield-L2-day0.jpg'))
      .resize(11_550, 8_660)
      .jpeg({ quality: 80 })
      .toFile(big);
    const r = await runCount(['--json', big]);
    expect(r.code).toBe(0);
    const line = JSON.parse(r.out);
    expect(line.width).toBe(11_550);
    expect(line.dish.cx).toBeGreaterThan(5_400);
    expect(line.dish.cx).toBeLessThan(6_150);
    expect(Math.abs(line.total - 122) / 122).toBeLessThan(0.1);
  }, 120_000);

  it('documents itself', async () => {
    const r = await runCount(['--help']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Usage: rivalplate count \[options\] FILE\|FOLDER/);
  });
});
