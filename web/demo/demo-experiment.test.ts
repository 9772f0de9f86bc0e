import { describe, expect, it } from 'vitest';
import { analyse } from '../../fitness/analysis.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { fitnessInputs } from '../results/assay-inputs.ts';
import { demoSeed } from './demo-experiment.ts';

const NAMES = [
  'marrowfield-L2-day0.jpg',
  'marrowfield-L2-day1.jpg',
  'marrowfield-L6-day1-mostly-blue.jpg',
  'notes.txt',
];

function dataOf(seed: ReturnType<typeof demoSeed>): ExperimentData {
  const b = seed.batch;
  return {
    experiment: b.experiments![0]!,
    assays: b.assays!,
    samples: b.samples!,
    plates: b.plates!,
    analyses: new Map(),
    corrections: new Map(),
  };
}

describe('the demo experiment', () => {
  it('is marked as demo data and has six lines at three generations, two replicates each', () => {
    const seed = demoSeed(NAMES);
    expect(seed.batch.experiments![0]!.demo).toBe(true);
    expect(seed.batch.experiments![0]!.name).toMatch(/demo/);
    expect(seed.batch.assays).toHaveLength(6 * 3 * 2);
  });

  it('puts each bundled photo on the plate its name says, leaving that plate untyped', () => {
    const seed = demoSeed(NAMES);
    const where = seed.photoPlates.map(({ name, plate }) => {
      const a = seed.batch.assays!.find((x) => x.id === plate.assayId)!;
      const s = seed.batch.samples!.find((x) => x.id === plate.sampleId)!;
      return `${name} → ${a.line} g${a.generation} r${a.replicate} ${s.timepoint} ${plate.typedCounts === null}`;
    });
    expect(where).toEqual([
      'marrowfield-L2-day0.jpg → L2 g2000 r1 start true',
      'marrowfield-L2-day1.jpg → L2 g2000 r1 end true',
      'marrowfield-L6-day1-mostly-blue.jpg → L6 g2000 r1 end true',
    ]);
  });

  it('is the same on every device: the counts come from a seeded generator', () => {
    const counts = () => demoSeed(NAMES).batch.plates!.map((p) => p.typedCounts);
    expect(counts()).toEqual(counts());
  });

  it('its typed counts carry the invented fitness gains, and most plates are countable', () => {
    const seed = demoSeed([]);
    const fit = analyse(fitnessInputs(dataOf(seed)).inputs);
    const group = fit.groups.find((g) => g.group === 'L3 g2000')!;
    // Invented model for L3: W = 1 + 0.40·t/(t + 800) = 1.286 at t = 2000; two replicates of
    // Poisson counts around 100 put the mean within a few hundredths of it.
    expect(group.W.mean).toBeGreaterThan(1.286 - 0.06);
    expect(group.W.mean).toBeLessThan(1.286 + 0.06);
    const outOfRange = fit.assays.filter((a) => a.flags.some((f) => f.code === 'out-of-range'));
    expect(outOfRange.length).toBeLessThan(fit.assays.length / 4);
  });
});
