/** One benchmark process: decode FILE, warm up, time RUNS analyses, print medians as JSON. */
import { decodePhoto } from '../../cli/decode-image.ts';
import { loadCvCore } from '../../cli/opencv-quiet.ts';

const RUNS = 7;
const WARM_UP = 2;

const file = process.argv[2];
if (!file) throw new Error('usage: plate-bench-run.ts FILE');
const core = await loadCvCore();
const photo = await decodePhoto(file);
// Node, tsx, opencv.js and the decoded photo, before any analysis.
const baseMb = process.memoryUsage().rss / 1048576;
const stageRuns: Record<string, number[]> = {};
const totals: number[] = [];
let colonies = 0;
for (let i = 0; i < WARM_UP + RUNS; i++) {
  const t0 = performance.now();
  const a = await core.analyzePlate(photo.pixels);
  const t = performance.now() - t0;
  colonies = a.colonies.length;
  if (i < WARM_UP) continue;
  totals.push(t);
  for (const [k, v] of Object.entries(a.timings)) {
    stageRuns[k] = [...(stageRuns[k] ?? []), v];
  }
}
const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1]!;
const stages = Object.fromEntries(Object.entries(stageRuns).map(([k, v]) => [k, median(v)]));
const peakMb = process.resourceUsage().maxRSS / 1024;
console.log(
  JSON.stringify({ stages, total: median(totals), peakMb, baseMb, runs: RUNS, colonies }),
);
