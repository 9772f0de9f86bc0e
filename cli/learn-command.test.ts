import { mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readTruth } from '../fixtures/plate-files.ts';
import { capturedIo } from './captured-io.ts';
import { main } from './main.ts';

const DEMO = resolve('fixtures/demo');
const PLATES = ['marrowfield-L2-day0', 'marrowfield-L2-day1'];
const NAMES = ['blue', 'cream'];

async function run(args: string[]) {
  const io = capturedIo('.');
  const code = await main(args, io);
  return { code, out: io.stdout(), err: io.stderr() };
}

/** A demo plate as a person leaves it once checked: its true colonies with the lab's names. */
async function checkedLine(plate: string, file = `${DEMO}/${plate}.jpg`): Promise<string> {
  const truth = await readTruth(join(DEMO, `${plate}.truth.json`));
  const colonies = truth.colonies.map((c) => ({ x: c.x, y: c.y, cls: NAMES[c.cls] }));
  return JSON.stringify({ file, colonies });
}

describe('rivalplate learn and count --model', () => {
  let dir = '';
  let jsonl = '';
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'rivalplate-learn-'));
    jsonl = join(dir, 'checked.jsonl');
    await writeFile(
      jsonl,
      `${(await Promise.all(PLATES.map((p) => checkedLine(p)))).join('\n')}\n`,
    );
  });

  it('learns a small model, the same bytes twice, and counts in the lab’s names', async () => {
    const a = await run(['learn', jsonl, '--out', join(dir, 'a.json')]);
    expect(a.err).toBe('');
    expect(a.code).toBe(0);
    expect(a.out).toMatch(/learned from 2 checked plates/);
    await run(['learn', jsonl, '--out', join(dir, 'b.json')]);
    const bytes = await readFile(join(dir, 'a.json'), 'utf8');
    expect(await readFile(join(dir, 'b.json'), 'utf8')).toBe(bytes);
    expect(bytes.length).toBeLessThan(4096);

    const counted = await run([
      'count',
      '--json',
      '--model',
      join(dir, 'a.json'),
      `${DEMO}/marrowfield-L4-day1-tilted.jpg`,
    ]);
    expect(counted.code).toBe(0);
    const record = JSON.parse(counted.out.trim());
    expect(Object.keys(record.counts).sort()).toEqual(NAMES);
    expect(record.model).toEqual({ plates: 2 });
  }, 120_000);

  it.each([
    [
      'a third colour name',
      (l: string) => l.replace(/\]\}$/, ',{"x":10,"y":10,"cls":"pink"}]}'),
      /checked\.jsonl: line 1: "colonies\[\d+\]\.cls" is a third colour name "pink"/,
    ],
    [
      'a colony outside the photo',
      (l: string) => l.replace(/"x":[0-9.]+/, '"x":99999'),
      /line 1: "colonies\[0\]" at \(99999, [0-9.]+\) lies outside the 1600 × 1200 photo/,
    ],
    [
      'a missing photo',
      (l: string) => l.replace(/"file":"[^"]+"/, '"file":"gone.jpg"'),
      /line 1: "file" .*gone\.jpg: no such file/,
    ],
    ['a line that is not JSON', () => '{"file": ', /line 1: not JSON/],
    [
      'a colony without a place',
      (l: string) => l.replace(/"y":[0-9.]+,/, ''),
      /line 1: "colonies\[0\]\.y" must be a number/,
    ],
  ])(
    'refuses %s, naming the line and field',
    async (_, edit, message) => {
      const good = await readFile(jsonl, 'utf8');
      const first = good.split('\n')[0]!;
      const file = join(dir, 'bad.jsonl');
      await writeFile(file, `${edit(first)}\n`);
      const r = await run(['learn', file, '--out', join(dir, 'never.json')]);
      expect(r.code).toBe(2);
      expect(r.err.replace(file, 'checked.jsonl')).toMatch(message);
    },
    60_000,
  );

  it('count refuses a damaged model, naming the file', async () => {
    const damaged = join(dir, 'damaged.json');
    await writeFile(damaged, '{"format": "rivalplate-model", "version": 9}');
    const r = await run(['count', '--model', damaged, `${DEMO}/marrowfield-L2-day0.jpg`]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/damaged\.json: model version 9 was made by a newer Rivalplate/);
  });
});
