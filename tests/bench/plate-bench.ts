/**
 * `npm run bench`: time per stage and end to end, and peak memory, of the plate analysis on a
 * 12-megapixel and a 3-megapixel generated photo. The photos are generated and written here; each
 * is then analysed in a fresh Node process (plate-bench-run.ts) so that its peak resident memory is
 * the analysis's own: decoded once (not timed), analysed twice to warm up, then several times,
 * medians reported. Targets for 12 MP on this 2-core machine: end to end ≤ 800 ms, peak < 400 MB.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { writePlate } from '../../fixtures/plate-files.ts';
import { generatePlate } from '../../fixtures/plate-generator.ts';

const OUT = resolve(import.meta.dirname, '../../bench/out');
const RUNNER = resolve(import.meta.dirname, 'plate-bench-child.js');
const SIZES = [
  { name: '12 MP', width: 4000, height: 3000 },
  { name: '3 MP', width: 2000, height: 1500 },
];

interface RunResult {
  stages: Record<string, number>;
  total: number;
  peakMb: number;
  baseMb: number;
  runs: number;
  colonies: number;
}

mkdirSync(OUT, { recursive: true });
const rows: Record<string, string | number>[] = [];
const totals: number[] = [];
for (const size of SIZES) {
  const file = join(OUT, `plate-${size.width}x${size.height}.png`);
  const plate = generatePlate({ seed: 12, width: size.width, height: size.height, colonies: 200 });
  await writePlate(plate, file, { format: 'png' });
  const output = execFileSync(process.execPath, [RUNNER, file], {
    encoding: 'utf8',
  });
  const r = JSON.parse(output.trim().split('\n').at(-1)!) as RunResult;
  totals.push(r.total);
  rows.push({
    photo: size.name,
    ...Object.fromEntries(Object.entries(r.stages).map(([k, v]) => [k, Math.round(v)])),
    'end to end': Math.round(r.total),
    'peak RSS MB': Math.round(r.peakMb),
    'RSS before analysis MB': Math.round(r.baseMb),
    colonies: r.colonies,
    runs: r.runs,
  });
}
console.log('Plate analysis: medians in ms (decode excluded), Node, single-threaded opencv.js');
console.table(rows);
console.log(`12 MP / 3 MP end-to-end ratio: ${(totals[0]! / totals[1]!).toFixed(2)}`);
