import { execFile } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../fitness/csv.ts';
import { capturedIo } from './captured-io.ts';
import { run } from './fitness-command.ts';
import { main } from './main.ts';

const ROOT = resolve(import.meta.dirname, '..');
const EXAMPLE = 'fixtures/example-competition.csv';
const dir = mkdtempSync(join(tmpdir(), 'rivalplate-fitness-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const capture = (cwd = ROOT) => capturedIo(cwd);

const HEADER =
  'assay,group,line,generation,replicate,sample,dilution_fold,volume_ul,test_colonies,reference_colonies,fold_dilution_since_start';

describe('rivalplate fitness', () => {
  it('turns the example CSV into one JSON document with the documented fields', async () => {
    const io = capture();
    expect(await run(['--json', EXAMPLE], io)).toBe(0);
    const doc = JSON.parse(io.stdout());
    expect(doc.errors).toEqual([]);
    expect(doc.assays.length).toBeGreaterThan(90);
    for (const key of [
      'assay',
      'group',
      'W',
      'r',
      'r_per_day',
      'm_test',
      'm_ref',
      'W_ci',
      'flags',
    ]) {
      expect(doc.assays[0]).toHaveProperty(key);
    }
    for (const key of [
      'group',
      'n',
      'mean_W',
      'sd_W',
      'se_W',
      'ci_W',
      'p_W_vs_1',
      'mean_r',
      'ci_r',
      'p_r_vs_0',
    ]) {
      expect(doc.groups[0]).toHaveProperty(key);
    }
    expect(doc.trajectories.map((t: { line: string }) => t.line)).toEqual([
      'L1',
      'L2',
      'L3',
      'L4',
      'L5',
      'L6',
    ]);
    const hyp = doc.trajectories[0].models.hyperbolic;
    expect(hyp).toMatchObject({ fitted: true, k: 3 });
    expect(Object.keys(hyp.parameters)).toEqual(['a', 'b']);
    expect(Object.keys(hyp.standard_errors)).toEqual(['a', 'b']);
    expect(doc.marker_effect).toMatchObject({ group: 'marker-control', n: 4, applied: false });
    expect(doc.reciprocal).toHaveLength(1);
    // Sensible: ancestors near W = 1, evolved lines fitter at 2000 generations than at 0.
    const mean = (g: string) => doc.groups.find((x: { group: string }) => x.group === g).mean_W;
    for (const line of ['L1', 'L2', 'L3', 'L4', 'L5', 'L6']) {
      expect(Math.abs(mean(`${line}-0`) - 1)).toBeLessThan(0.1);
      expect(mean(`${line}-2000`)).toBeGreaterThan(mean(`${line}-0`) + 0.1);
    }
    // L5 ran two-day competitions with one 100-fold transfer (D = 100).
    const l5 = doc.assays.find((x: { line: string }) => x.line === 'L5');
    expect(l5).toMatchObject({ D: 100, days: 2 });
    expect(l5.r_per_day).toBeCloseTo(l5.r / 2, 12);
  });

  it('prints readable tables by default', async () => {
    const io = capture();
    expect(await run([EXAMPLE, '--round', 'bam'], io)).toBe(0);
    const text = io.stdout();
    expect(text).toMatch(/^Assays: 97 computed/);
    expect(text).toContain('Groups (mean of replicate assays');
    expect(text).toContain('Marker effect (group marker-control, n = 4)');
    expect(text).toContain('Trajectory of L6');
    expect(text).toMatch(/hyperbolic {2}w = 1 \+ a·t\/\(t \+ b\)/);
    expect(text).toMatch(/FDA BAM ch\. 3 \(25–250\): row \d+ \(\d+, too-(few|many)\)/);
    expect(text).toMatch(/\d\.\d×10\^6 \/ \d\.\d×10\^6/);
    expect(text).toContain('Columns not used: plated_by');
  });

  it('applies the options: exclusion, marker correction, range, comparison', async () => {
    const io = capture();
    const args = [
      '--json',
      '--exclude-out-of-range',
      '--correct-marker',
      '--range',
      'iso7218',
      '--compare',
      'L1-2000,L2-2000',
      EXAMPLE,
    ];
    expect(await run(args, io)).toBe(0);
    const doc = JSON.parse(io.stdout());
    expect(doc.marker_effect.applied).toBe(true);
    expect(doc.comparison).toMatchObject({ test: 'welch', groups: ['L1-2000', 'L2-2000'] });
    expect(
      doc.assays.find((x: { group: string }) => x.group === 'L1-2000').uncorrected,
    ).toBeDefined();
    const flags = doc.assays.flatMap(
      (x: { flags: { code: string; message: string }[] }) => x.flags,
    );
    expect(flags.some((f: { message: string }) => f.message.includes('ISO 7218 (10–300)'))).toBe(
      true,
    );
    expect(flags.some((f: { code: string }) => f.code === 'plates-dropped')).toBe(true);
  });

  it('writes tidy CSV tables with --csv-dir: one per table, every row as wide as its header', async () => {
    const io = capture();
    const out = join(dir, 'tables');
    expect(await run(['--draws', '200', '--csv-dir', out, EXAMPLE], io)).toBe(0);
    expect(readdirSync(out).sort()).toEqual([
      'assays.csv',
      'comparisons.csv',
      'curve_points.csv',
      'groups.csv',
      'model_parameters.csv',
      'models.csv',
    ]);
    for (const name of readdirSync(out)) {
      const text = readFileSync(join(out, name), 'utf8');
      expect(text).not.toMatch(/NaN|Infinity|undefined/);
      const [header, ...rows] = parseCsv(text);
      expect(rows.length).toBeGreaterThan(0);
      for (const r of rows) expect(r.fields).toHaveLength(header!.fields.length);
    }
    const models = parseCsv(readFileSync(join(out, 'models.csv'), 'utf8'));
    expect(models[0]!.fields.slice(0, 4)).toEqual(['line', 'model', 'fitted', 'reason']);
    // Six lines, four models each (null, hyperbolic, power law, step).
    expect(models).toHaveLength(1 + 6 * 4);
  });

  it('compares lines with the blocks taken into account when the CSV has a block column', async () => {
    const rows: string[] = [];
    let n = 0;
    for (const block of ['day1', 'day2']) {
      for (const [line, base] of [
        ['L1', 120],
        ['L2', 150],
        ['L3', 180],
      ] as const) {
        for (const rep of [0, 1]) {
          n += 1;
          const end = base + (block === 'day2' ? 15 : 0) + rep * 7 + n;
          rows.push(`A${n},${line}-500,${line},500,${rep},start,100,100,50,50,,${block}`);
          rows.push(`A${n},${line}-500,${line},500,${rep},end,10000,100,${end},50,1,${block}`);
        }
      }
    }
    writeFileSync(join(dir, 'blocks.csv'), [`${HEADER},block`, ...rows].join('\n'));
    const io = capture(dir);
    expect(await run(['--draws', '0', '--json', 'blocks.csv'], io)).toBe(0);
    const [g] = JSON.parse(io.stdout()).comparisons.by_generation;
    expect(g.blocked.blocks).toEqual(['day1', 'day2']);
    expect(g.blocked.anova.line.df).toBe(2);
    expect(g.blocked.mixed_model.fixed_effects.map((f: { term: string }) => f.term)).toEqual([
      'L1',
      'L2 − L1',
      'L3 − L1',
    ]);
    const text = capture(dir);
    expect(await run(['--draws', '0', 'blocks.csv'], text)).toBe(0);
    expect(text.stdout()).toContain('Generation 500 in blocks (day1, day2)');
  });

  it('answers --help through the dispatcher and lists the command', async () => {
    const io = capture();
    expect(await main(['fitness', '--help'], io)).toBe(0);
    expect(io.stdout()).toContain('Usage: rivalplate fitness [options] FILE.csv');
    const top = capture();
    await main(['--help'], top);
    expect(top.stdout()).toMatch(/fitness +relative fitness/);
  });

  it('reports bad rows by line and exits 1; usage errors exit 2', async () => {
    const bad = join(dir, 'bad.csv');
    writeFileSync(
      bad,
      [HEADER, 'A1,g,L1,0,1,start,,100,50,50,', 'A1,g,L1,0,1,end,100,100,60,40,'].join('\n'),
    );
    const io = capture(dir);
    expect(await run(['bad.csv'], io)).toBe(1);
    expect(io.stderr()).toContain('row 2 (assay A1): dilution_fold is missing');
    expect(io.stderr()).toContain('row 3 (assay A1): fold_dilution_since_start is missing');
    expect(io.stdout()).toBe('');

    const zero = join(dir, 'zero.csv');
    writeFileSync(
      zero,
      [
        HEADER,
        'A1,g,L1,0,1,start,100,100,50,50,',
        'A1,g,L1,0,1,end,10000,100,0,40,1',
        'A2,g,L1,0,2,start,100,100,50,50,',
        'A2,g,L1,0,2,end,10000,100,60,40,1',
      ].join('\n'),
    );
    const z = capture(dir);
    expect(await run(['--json', 'zero.csv'], z)).toBe(0);
    const doc = JSON.parse(z.stdout());
    expect(
      doc.assays.map((x: { assay: string; bound: string | null }) => [x.assay, x.bound]),
    ).toEqual([
      ['A1', 'at-most'],
      ['A2', null],
    ]);
    expect(doc.groups[0]).toMatchObject({ group: 'g', n: 1, bounded: 1, dropped: 0 });
    expect(doc.left_out).toEqual([
      expect.objectContaining({ assay: 'A1', group: 'g', reason: 'bounded' }),
    ]);

    const u = capture();
    expect(await run(['--range', 'big', EXAMPLE], u)).toBe(2);
    expect(u.stderr()).toContain('--range: expected bam, sm9215, iso7218 or MIN-MAX');
    expect(await run(['--no-such-option', EXAMPLE], capture())).toBe(2);
    expect(await run([], capture())).toBe(2);
    const missing = capture();
    expect(await run(['nope.csv'], missing)).toBe(1);
    expect(missing.stderr()).toContain('cannot read nope.csv');
  });

  it('answers odd files with messages naming row and field, never a stack trace', async () => {
    const rows = [
      'A1,g,L1,0,1,start,100,100,50,50,',
      `A1,g,L1,0,1,end,10^2,100,${'7'.repeat(306)},40,1`,
      ',,,,,,,,,,',
    ];
    writeFileSync(join(dir, 'huge.csv'), [HEADER, ...rows].join('\n'));
    const io = capture(dir);
    expect(await run(['huge.csv'], io)).toBe(1);
    expect(io.stderr()).toContain(
      'row 3 (assay A1): test_colonies must be a whole number from 0 to 10000000 (colonies on one plate), got "777777777777…" (306 characters)',
    );
    expect(io.stderr()).not.toMatch(/at .*\.ts:\d+/);

    const fine = [HEADER, rows[0], 'A1,g,L1,0,1,end,10^4,100,70,40,1', ',,,,,,,,,,'];
    writeFileSync(join(dir, 'semi.csv'), fine.join('\n').replace(/,/g, ';'));
    const semi = capture(dir);
    expect(await run(['--draws', '0', 'semi.csv'], semi)).toBe(0);
    expect(semi.stdout()).toContain('Read as semicolon-separated (the header has no comma).');
  });

  it('runs as `rivalplate fitness` through bin/rivalplate.js', async () => {
    const { stdout } = await promisify(execFile)(
      process.execPath,
      [join(ROOT, 'bin/rivalplate.js'), 'fitness', '--help'],
      {
        cwd: ROOT,
      },
    );
    expect(stdout).toContain('Usage: rivalplate fitness');
  });
});
