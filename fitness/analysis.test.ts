import { describe, expect, it } from 'vitest';
import { analyse } from './analysis.ts';
import { type AssayInput, computeAssay } from './competition.ts';
import { correctedMean } from './marker-correction.ts';
import { hashSeed, poissonDraw, seededUniform } from './poisson.ts';
import { oneSampleTTest, welchTTest } from './replicate-stats.ts';
import { analysisJson, assertAllFinite } from './report.ts';

/** An assay whose end test count is set to give roughly the wanted W (100-fold regrowth). */
function assay(
  id: string,
  group: string,
  line: string,
  generation: number,
  endTest: number,
  marker?: string,
): AssayInput {
  return {
    assay: id,
    group,
    line,
    generation,
    replicate: id,
    days: 1,
    foldDilutionSinceStart: 1,
    ...(marker ? { testMarker: marker } : {}),
    start: [
      {
        label: `${id} start`,
        dilutionFold: 1e4,
        volumeMl: 0.1,
        testColonies: 100,
        referenceColonies: 100,
      },
    ],
    end: [
      {
        label: `${id} end`,
        dilutionFold: 1e6,
        volumeMl: 0.1,
        testColonies: endTest,
        referenceColonies: 100,
      },
    ],
  };
}

const controls = [98, 95, 101, 97].map((t, i) => assay(`M${i}`, 'marker-control', 'Anc', 0, t));
const evolved = [
  ...[100, 104, 97].map((t, i) => assay(`A${i}`, 'L1-0', 'L1', 0, t)),
  ...[180, 175, 190].map((t, i) => assay(`B${i}`, 'L1-1000', 'L1', 1000, t)),
  ...[230, 215, 240].map((t, i) => assay(`C${i}`, 'L1-2000', 'L1', 2000, t)),
];

describe('analyse', () => {
  it('summarises groups and estimates the marker effect without applying it by default', () => {
    const a = analyse([...controls, ...evolved], { bootstrapDraws: 0 });
    expect(a.errors).toEqual([]);
    const g = a.groups.find((x) => x.group === 'L1-1000')!;
    const ws = evolved
      .filter((e) => e.group === 'L1-1000')
      .map((e) => computeAssay(e, { bootstrapDraws: 0 }).W);
    expect(g.W.n).toBe(3);
    expect(g.W.mean).toBeCloseTo(ws.reduce((s, w) => s + w, 0) / 3, 12);
    expect(g.W_vs_1!.p).toBeCloseTo(oneSampleTTest(ws, 1)!.p, 12);
    expect(a.markerEffect).toMatchObject({ group: 'marker-control', n: 4, applied: false });
    expect(a.markerEffect!.W.mean).toBeLessThan(1);
    expect(a.assays.every((x) => x.uncorrected === undefined)).toBe(true);
    // No test across chosen groups unless asked; the lab's comparisons of one line: its three
    // generations against W = 1 and its two changes (no second line to compare it with).
    expect(a.comparison).toBeNull();
    expect(a.comparisons.byGeneration).toEqual([]);
    expect(a.comparisons.vsAncestor.map((x) => x.generation)).toEqual([0, 1000, 2000]);
    expect(a.comparisons.changes.map((x) => [x.from, x.to])).toEqual([
      [0, 1000],
      [1000, 2000],
    ]);
    expect(a.trajectories).toHaveLength(1);
    expect(a.trajectories[0]!.points).toHaveLength(9);
    expect(a.trajectories[0]!.ranking.length).toBeGreaterThan(0);
  });

  it('corrects by the marker effect when asked: W / mean control W, r − mean control r', () => {
    const plain = analyse([...controls, ...evolved], { bootstrapDraws: 0 });
    const fixed = analyse([...controls, ...evolved], { bootstrapDraws: 0, correctMarker: true });
    const meanW = plain.markerEffect!.W.mean;
    const meanR = plain.markerEffect!.r.mean;
    for (const [i, x] of fixed.assays.entries()) {
      const before = plain.assays[i]!;
      if (x.group === 'marker-control') {
        expect(x.W).toBe(before.W);
        continue;
      }
      expect(x.W).toBeCloseTo(before.W / meanW, 12);
      expect(x.r).toBeCloseTo(before.r - meanR, 12);
      expect(x.uncorrected).toEqual({ W: before.W, r: before.r, W_ci: before.W_ci });
      expect(x.flags.map((f) => f.code)).toContain('marker-corrected');
    }
    expect(fixed.markerEffect!.applied).toBe(true);
    // Group statistics carry the controls' uncertainty (marker-correction.ts, checked against R).
    const raw = (g: string, f: 'W' | 'r') =>
      plain.assays.filter((x) => x.group === g).map((x) => x[f]);
    const g = fixed.groups.find((x) => x.group === 'L1-1000')!;
    const expected = correctedMean(raw('L1-1000', 'W'), raw('marker-control', 'W'), 'ratio');
    expect(g.W).toEqual(expected.summary);
    expect(g.W_vs_1).toEqual(expected.test);
    expect(g.r_vs_0).toEqual(
      correctedMean(raw('L1-1000', 'r'), raw('marker-control', 'r'), 'difference').test,
    );
    // So do the lab's comparisons of each line with the ancestor (lab-comparisons.ts).
    const vs = fixed.comparisons.vsAncestor.find((x) => x.generation === 1000)!;
    expect(vs.test).toEqual(expected.test);
    expect(vs.ci).toEqual(expected.summary.ci);
    expect(() => analyse(evolved, { correctMarker: true })).toThrow(
      /no assay of group "marker-control"/,
    );
  });

  it('plans replicates per group and from the pooled within-group SD when asked', () => {
    const a = analyse([...controls, ...evolved], { bootstrapDraws: 0, detectDifference: 0.05 });
    for (const g of a.groups) expect(g.replicatesNeeded!.n).toBeGreaterThanOrEqual(2);
    // Pooled SD over the three L1 groups (two df each) is the root mean of their variances.
    const sds = a.groups.filter((g) => g.group !== 'marker-control').map((g) => g.W.sd!);
    const pooled = Math.sqrt(sds.reduce((s, x) => s + x * x, 0) / sds.length);
    const p = a.pooledReplicatesNeeded!;
    expect(p.sdPerAssay ** 2).toBeCloseTo(p.betweenAssaySd ** 2 + p.countingSe ** 2, 12);
    const se = a.assays.filter((x) => x.group !== 'marker-control').map((x) => x.countingSe.W);
    const rms2 = se.reduce((s, x) => s + x * x, 0) / se.length;
    expect(p.betweenAssaySd ** 2).toBeCloseTo(Math.max(0, pooled ** 2 - rms2), 12);
    expect(analyse(evolved, { bootstrapDraws: 0 }).pooledReplicatesNeeded).toBeUndefined();
  });

  it("compares two chosen groups with Welch's t-test", () => {
    const a = analyse(evolved, { bootstrapDraws: 0, compare: ['L1-1000', 'L1-2000'] });
    const w = (g: string) => a.assays.filter((x) => x.group === g).map((x) => x.W);
    expect(a.comparison!.test).toBe('welch');
    expect(a.comparison!.W).toEqual(welchTTest(w('L1-1000'), w('L1-2000')));
    expect(() => analyse(evolved, { compare: ['L1-1000', 'nope'] })).toThrow(/group "nope"/);
  });

  it('averages reciprocal designs per line: each marker weighs the same', () => {
    const recip = [
      ...[180, 175, 190].map((t, i) => assay(`W${i}`, 'L1-1000', 'L1', 1000, t, 'white')),
      ...[170, 168].map((t, i) => assay(`R${i}`, 'L1-1000-red', 'L1', 1000, t, 'red')),
    ];
    const a = analyse(recip, { bootstrapDraws: 0 });
    expect(a.reciprocal).toHaveLength(1);
    const r = a.reciprocal[0]!;
    const mean = (ids: string) => {
      const ws = a.assays.filter((x) => x.assay.startsWith(ids)).map((x) => x.W);
      return ws.reduce((s, w) => s + w, 0) / ws.length;
    };
    expect(r.byMarker.map((m) => [m.marker, m.n])).toEqual([
      ['white', 3],
      ['red', 2],
    ]);
    expect(r.meanW).toBeCloseTo((mean('W') + mean('R')) / 2, 12);
  });

  it('lists assays that fail, by name, and goes on with the rest; the report has no NaN', () => {
    const dead = assay('X9', 'L1-1000', 'L1', 1000, 50);
    dead.end[0]!.referenceColonies = 1; // the reference shrank 100-fold: m_ref < 0
    const a = analyse([...controls, ...evolved, dead], {});
    expect(a.errors).toHaveLength(1);
    expect(a.errors[0]!.assay).toBe('X9');
    expect(a.errors[0]!.message).toMatch(/^assay X9: the reference did not grow/);
    expect(a.assays).toHaveLength(controls.length + evolved.length);
    const doc = analysisJson(a);
    expect(() => assertAllFinite(doc)).not.toThrow();
    expect(doc.groups[0]).toHaveProperty('p_W_vs_1');
    expect(doc.groups[0]).toHaveProperty('ci_r');
    expect(() => assertAllFinite({ x: [1, { y: Number.NaN }] })).toThrow(/\$\.x\[1\]\.y/);
  });

  it('never puts NaN or Infinity in the report, whatever the counts (seeded random experiments)', () => {
    for (let trial = 0; trial < 25; trial++) {
      const u = seededUniform(hashSeed(`experiment-${trial}`));
      const count = (mean: number) => poissonDraw(mean, u);
      const inputs: AssayInput[] = [];
      for (let i = 0; i < 12; i++) {
        const gen = [0, 500, 1000, 2000][i % 4]!;
        const group = i < 3 && trial % 2 ? 'marker-control' : `G${i % 3}`;
        inputs.push({
          assay: `T${trial}-${i}`,
          group,
          line: `L${i % 2}`,
          generation: gen,
          replicate: String(i),
          days: 1 + (i % 2),
          foldDilutionSinceStart: [1, 1, 100][i % 3]!,
          ...(i % 4 === 0 ? { testMarker: i % 8 ? 'red' : 'white' } : {}),
          start: [
            {
              label: 's',
              dilutionFold: 1e4,
              volumeMl: 0.1,
              testColonies: count(1 + 100 * u()),
              referenceColonies: count(1 + 100 * u()),
            },
          ],
          end: [
            {
              label: 'e',
              dilutionFold: 1e6,
              volumeMl: 0.1,
              testColonies: count(300 * u() ** 2),
              referenceColonies: count(1 + 150 * u()),
            },
          ],
        });
      }
      const a = analyse(inputs, {
        bootstrapDraws: 200,
        detectDifference: 0.05,
        correctMarker: trial % 4 === 1,
      });
      expect(a.assays.length + a.errors.length).toBe(inputs.length);
      expect(() => assertAllFinite(analysisJson(a))).not.toThrow();
    }
  });
});
