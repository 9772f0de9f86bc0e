/**
 * `npm run bench` (batch part): `rivalplate count` on a folder of generated photos with 1 job, 2
 * jobs and all the machine's cores, timed end to end as a user runs it (a fresh process each, so
 * opencv.js starting in every worker is counted), with photos per second and the speed-up over
 * one job; each is run RIVALPLATE_BENCH_RUNS times (default 3) and the medians are shown. The
 * outputs are compared too: every run must print the same records (the time each photo took
 * aside). Target: speed-up ≥ 0.8 × jobs up to the cores.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import { writePlate } from '../../fixtures/plate-files.ts';
import { generatePlate } from '../../fixtures/plate-generator.ts';
import { machineBusySeconds } from './process-cpu.ts';

const OUT = resolve(import.meta.dirname, '../../bench/out/batch');
const BIN = resolve(import.meta.dirname, '../../bin/rivalplate.js');
const TIME = '/usr/bin/time';
const PHOTOS = Number(process.env.RIVALPLATE_BENCH_PHOTOS ?? 24);

mkdirSync(OUT, { recursive: true });
for (let i = 0; i < PHOTOS; i++) {
  const file = join(OUT, `plate-${String(i).padStart(3, '0')}.jpg`);
  if (existsSync(file)) continue;
  const plate = generatePlate({ seed: 100 + i, width: 2000, height: 1500, colonies: 120 + 5 * i });
  await writePlate(plate, file, { format: 'jpeg' });
}

const cores = availableParallelism();
const jobsList = [...new Set([1, 2, cores])].sort((a, b) => a - b);
/** Runs of each number of jobs, taken in turn (1, 2, …, 1, 2, …) so a busy spell hits all alike. */
const RUNS = Number(process.env.RIVALPLATE_BENCH_RUNS ?? 3);

/**
 * One `count --jobs N` run as a user starts it: wall ms, CPU s (NaN without GNU time), the CPU
 * seconds other work on the machine took meanwhile (NaN without /proc), and the output.
 */
function countRun(jobs: number): { ms: number; cpu: number; others: number; records: string } {
  const busy = machineBusySeconds();
  const started = performance.now();
  // GNU time, when there, also says how much CPU the run got: on a machine busy with other work
  // the wall time says more about the neighbours than about the jobs.
  const timed = existsSync(TIME);
  const command = [process.execPath, BIN, 'count', '--json', '--jobs', String(jobs), OUT];
  const run = spawnSync(
    timed ? TIME : command[0]!,
    timed ? ['-f', '%U %S', ...command] : command.slice(1),
    { encoding: 'utf8', maxBuffer: 256 << 20 },
  );
  const ms = performance.now() - started;
  const machine = machineBusySeconds() - busy;
  if (run.status !== 0) throw new Error(`count --jobs ${jobs} failed: ${run.stderr}`);
  const cpu = timed
    ? run.stderr
        .trim()
        .split('\n')
        .at(-1)!
        .split(' ')
        .reduce((sum, t) => sum + Number(t), 0)
    : Number.NaN;
  const records = run.stdout
    .trim()
    .split('\n')
    .map((l) => {
      const { ms: _ms, ...rest } = JSON.parse(l) as Record<string, unknown>;
      return JSON.stringify(rest);
    })
    .join('\n');
  return { ms, cpu, others: Math.max(0, machine - cpu), records };
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

const runs = new Map(jobsList.map((jobs) => [jobs, [] as ReturnType<typeof countRun>[]]));
for (let i = 0; i < RUNS; i++) for (const jobs of jobsList) runs.get(jobs)!.push(countRun(jobs));
const reference = runs.get(1)![0]!.records;
const oneJobMs = median(runs.get(1)!.map((r) => r.ms));
const rows = jobsList.map((jobs) => {
  const of = runs.get(jobs)!;
  const ms = median(of.map((r) => r.ms));
  const cpu = median(of.map((r) => r.cpu));
  return {
    jobs,
    photos: PHOTOS,
    'wall s': Number((ms / 1000).toFixed(1)),
    'photos/s': Number(((PHOTOS * 1000) / ms).toFixed(2)),
    'speed-up': Number((oneJobMs / ms).toFixed(2)),
    'CPU s': Number(cpu.toFixed(1)),
    'cores it got': Number((cpu / (ms / 1000)).toFixed(2)),
    'same output as 1 job': of.every((r) => r.records === reference) ? 'yes' : 'NO',
    // Each run's wall time, and the cores other work took meanwhile (CPU s / wall s).
    runs: of
      .map((r) => `${(r.ms / 1000).toFixed(1)} s (others ${(r.others / (r.ms / 1000)).toFixed(2)})`)
      .join(', '),
  };
});
/**
 * The control: the same fixed busy loop in `threads` worker threads at once, and how many cores
 * that got (1 thread's time × threads / the time taken). On a machine shared with other work this
 * says how much of a speed-up there was room for while the batch ran.
 */
async function coresFree(threads: number): Promise<number> {
  const loop = `let x = 0; for (let i = 0; i < 4e8; i++) x += i; require('node:worker_threads').parentPort.postMessage(x);`;
  const once = () =>
    new Promise<void>((done) => {
      const w = new Worker(loop, { eval: true });
      w.once('message', () => void w.terminate().then(() => done()));
    });
  let t0 = performance.now();
  await once();
  const single = performance.now() - t0;
  t0 = performance.now();
  await Promise.all(Array.from({ length: threads }, once));
  return (single * threads) / (performance.now() - t0);
}
const control = await coresFree(cores);

console.log(
  `Batch counting: rivalplate count --jobs N on ${PHOTOS} generated 3 MP photos, medians of ${RUNS} runs each, ${cores} cores, load average ${loadavg()[0]!.toFixed(1)} at the end`,
);
console.table(rows);
console.log(
  'runs: the wall time of each run, and in brackets the cores other work on the machine took meanwhile',
);
console.log(
  `Control: a busy loop in ${cores} threads at once got ${control.toFixed(2)} cores of ${cores} (the room there was for a speed-up)`,
);
