import { beforeAll, describe, expect, it } from 'vitest';
import { analyzePlate, learnPalette, type Palette, type PlateAnalysis } from '../cv/index.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import type { PlateScene, PlateTruth } from '../fixtures/plate-types.ts';
import { varietyScene } from '../fixtures/scene-variety.ts';
import { median, scoreAnalysis } from './support/plate-scoring.ts';

/**
 * Accuracy of the plate-analysis core on generated phone-like plates with known truth
 * (fixtures/plate-generator.ts, which shares no code with cv/). Thresholds are the targets of the
 * analysis core: median count error under 3 %, class accuracy above 98 %, nothing on empty plates.
 */
interface Run {
  scene: PlateScene;
  truth: PlateTruth;
  analysis: PlateAnalysis;
}

async function run(scene: PlateScene, palette?: Palette): Promise<Run> {
  const { image, truth } = generatePlate(scene);
  const analysis = await analyzePlate(image, palette ? { palette } : {});
  return { scene, truth, analysis };
}

/** Each seed's varied plate with these options, analysed and scored against its truth. */
async function scoredVariety(seeds: readonly number[], options: Omit<PlateScene, 'seed'>) {
  const out = [];
  for (const seed of seeds) {
    const r = await run(varietyScene(seed, options));
    out.push({ seed, run: r, score: scoreAnalysis(r.truth, r.analysis) });
  }
  return out;
}

const SWEEP_COUNTS = [25, 40, 60, 80, 100, 120, 150, 180, 210, 240, 270, 300];

describe('a batch of varied plates with 25–300 colonies', () => {
  let runs: Run[] = [];
  let palette: Palette | null = null;

  beforeAll(async () => {
    const first = [];
    for (const [i, colonies] of SWEEP_COUNTS.entries()) {
      // Glare is checked on its own below.
      const scene = varietyScene(100 + i, { colonies, fractionClass1: 0.3 + 0.04 * i, glare: 0 });
      first.push(await run(scene));
    }
    // As the batch command does: one palette from the whole batch, then every plate against it.
    palette = learnPalette(first.map((r) => r.analysis));
    runs = [];
    for (const r of first) runs.push(await run(r.scene, palette ?? undefined));
  }, 180_000);

  it('learns a two-colour palette from the batch', () => {
    expect(palette).not.toBeNull();
    expect(palette!.colours.map((c) => c.name).sort()).toEqual(['blue', 'cream']);
  });

  it('counts within 3 % (median) and finds the colonies that are there', () => {
    const scores = runs.map((r) => scoreAnalysis(r.truth, r.analysis));
    const table = runs.map((r, i) => ({
      truth: r.truth.colonies.length,
      found: r.analysis.colonies.reduce((s, c) => s + c.count, 0),
      error: scores[i]!.countError.toFixed(3),
      recall: scores[i]!.recall.toFixed(3),
      precision: scores[i]!.precision.toFixed(3),
    }));
    console.table(table);
    expect(median(scores.map((s) => Math.abs(s.countError)))).toBeLessThan(0.03);
    expect(Math.max(...scores.map((s) => Math.abs(s.countError)))).toBeLessThan(0.1);
    expect(median(scores.map((s) => s.recall))).toBeGreaterThan(0.95);
    expect(median(scores.map((s) => s.precision))).toBeGreaterThan(0.95);
  });

  it('sorts more than 98 % of matched colonies into the right colour', () => {
    let matched = 0;
    let right = 0;
    for (const r of runs) {
      const s = scoreAnalysis(r.truth, r.analysis);
      matched += s.truePositives;
      right += s.classAccuracy * s.truePositives;
    }
    expect(right / matched).toBeGreaterThan(0.98);
  });

  it('classifies a 97:3 plate and a 100:0 plate against the batch palette', async () => {
    const skewed = await run(varietyScene(7, { colonies: [97, 3] }), palette!);
    const single = await run(varietyScene(8, { colonies: [0, 120] }), palette!);
    expect(Math.abs((skewed.analysis.counts.blue ?? 0) - 97) / 97).toBeLessThan(0.05);
    expect(Math.abs((skewed.analysis.counts.cream ?? 0) - 3)).toBeLessThanOrEqual(1);
    expect(single.analysis.counts.blue ?? 0).toBeLessThanOrEqual(1);
    expect(Math.abs((single.analysis.counts.cream ?? 0) - 120) / 120).toBeLessThan(0.05);
  });
});

describe('plates under lid glare', () => {
  it('flags the glare and counts the colonies seen through it', async () => {
    for (const { run: r, score: s } of await scoredVariety([41, 42, 43], {
      colonies: 150,
      glare: 2,
    })) {
      expect(r.analysis.flags.map((f) => f.kind)).toContain('glare');
      expect(s.precision).toBeGreaterThan(0.95);
      expect(s.recall).toBeGreaterThan(0.95);
      expect(Math.abs(s.countError)).toBeLessThan(0.03);
    }
  }, 60_000);

  // A window's reflection has sharp edges and the dark bars of its frame; colonies show through
  // it washed out. Before the background followed the glare (glare-background.ts), these plates
  // lost up to 15 % of their colonies (recall 0.85–0.91) with the glare set aside.
  // The wall's background follows the meniscus's rings (cv wall-background.ts) and must leave the
  // colonies growing in them out of it.
  it('counts the colonies at the wall through a ringed meniscus', async () => {
    for (const { score: s } of await scoredVariety([51, 52, 53], {
      colonies: 150,
      meniscus: 'ringed',
    })) {
      expect(s.recall).toBeGreaterThan(0.97);
      expect(s.precision).toBeGreaterThan(0.97);
    }
  }, 60_000);

  it('counts the colonies under a reflected window, not its frame', async () => {
    for (const { run: r, score: s } of await scoredVariety([41, 42, 43], {
      colonies: 150,
      glare: 2,
      glareShape: 'window',
    })) {
      expect(r.analysis.flags.map((f) => f.kind)).toContain('glare');
      expect(s.recall).toBeGreaterThan(0.93);
      expect(s.precision).toBeGreaterThan(0.92);
    }
  }, 60_000);
});

describe('plates that hold one colour or none', () => {
  it('reports no colonies on empty plates, clutter and all', async () => {
    for (const seed of [1, 2, 3]) {
      const r = await run(varietyScene(seed, { colonies: 0 }));
      expect(r.analysis.colonies).toEqual([]);
    }
  }, 60_000);

  // A guard, not a sweep: of seeds 1–30 drawn like these, 5 still get 1–3 objects (seeds 11, 15,
  // 18 and 27 at the soft edge of a glare patch, beyond glare.ts's mask, as before glare was
  // counted; seed 25 inside a pen loop under glare). Windows are not in this guard: on the palest
  // agar a window's reflection is too faint for glare.ts's fixed lighter-and-greyer test, and
  // seeds 6 and 7 drawn with windows get 12 and 17 objects along its edges.
  it('reports no colonies on empty plates under lid glare', async () => {
    for (const seed of [4, 5, 6, 7, 8, 9]) {
      const r = await run(varietyScene(seed, { colonies: 0, glare: 2 }));
      expect(r.analysis.colonies).toEqual([]);
    }
  }, 60_000);

  // A ringed meniscus (fixtures render-base.ts: a bright ring half a millimetre in from the wall, a
  // lumpy darker band inside it) is what the 9 mm median background cannot follow; before the
  // background followed the wall (cv wall-background.ts) seeds 3, 4 and 6 got 1–3 objects there.
  it('reports no colonies on empty plates with a ringed meniscus', async () => {
    for (const seed of [1, 2, 3, 4, 5, 6]) {
      const r = await run(varietyScene(seed, { colonies: 0, meniscus: 'ringed' }));
      expect(r.analysis.colonies).toEqual([]);
    }
  }, 60_000);

  it('does not split a one-colour plate in two when it has no palette', async () => {
    const r = await run({ seed: 21, colonies: [0, 150] });
    expect(r.analysis.classes).toHaveLength(1);
    expect(r.analysis.flags.map((f) => f.kind)).toContain('one-colour');
  });
});

describe('a noisy photo from a small camera', () => {
  it('finds most pale colonies, and flags the count if it leans on the threshold', async () => {
    // Sensor noise of 8 (of 255) on a 1200 × 900 photo: the pixel threshold rises above the pale
    // colonies, and only the faint-disc search can find them. Its contrast was a ΔE averaged over
    // a small disc, which keeps the noise's own floor: 31 of the 64 pale colonies were found and
    // the count came out at 126 of 160, with no flag. Averaging the colour first (noise cancels)
    // finds 43 and flags the count as unstable.
    const r = await run({
      seed: 77,
      colonies: 160,
      fractionClass1: 0.4,
      width: 1200,
      height: 900,
      noise: 8,
    });
    const pale = r.truth.colonies.filter((t) => t.cls === 1);
    const found = pale.filter((t) =>
      r.analysis.colonies.some((c) => Math.hypot(c.x - t.x, c.y - t.y) < Math.max(3, 0.6 * t.r)),
    );
    expect(found.length / pale.length).toBeGreaterThan(0.6);
    const count = r.analysis.colonies.reduce((n, c) => n + c.count, 0);
    const flagged = r.analysis.flags.some((f) => f.kind === 'unstable-count');
    expect(flagged || Math.abs(count - 160) / 160 < 0.1).toBe(true);
  }, 60_000);
});

describe('dense plates (450–700 colonies)', () => {
  it('reports its count error honestly: printed, and within 10 %', async () => {
    for (const colonies of [450, 700]) {
      const r = await run({ seed: 31, colonies, colonyRadiusMm: [0.3, 0.8] });
      const s = scoreAnalysis(r.truth, r.analysis);
      console.log(
        `dense plate, ${colonies} colonies: count error ${(100 * s.countError).toFixed(1)} %`,
      );
      expect(Math.abs(s.countError)).toBeLessThan(0.1);
    }
  }, 60_000);
});

describe('media and writing the first rules got wrong', () => {
  // Each case is a failure seen on photos the generator did not draw: dark colonies of the agar's
  // own hue dropped as "grey shades" (a plate of 150–300 deep red colonies on pink agar read as 0),
  // blue-grey colonies dropped as ink because ink was told by colour, and writing in a coloured
  // pen counted as colonies.
  it('finds deep red colonies on pink agar and does not take them for shading', async () => {
    const plates = await scoredVariety([201, 202], {
      colonies: 150,
      colours: 'deepred-pink',
      glare: 0,
    });
    for (const { score: s } of plates) {
      expect(Math.abs(s.countError)).toBeLessThan(0.05);
      expect(s.recall).toBeGreaterThan(0.95);
    }
  }, 60_000);

  it('finds blue-grey colonies as dark and colourless as ink, and does not drop them as writing', async () => {
    const plates = await scoredVariety([201, 202], {
      colonies: 150,
      colours: 'slate-yellow',
      glare: 0,
      penMarks: true,
    });
    for (const { score: s } of plates) {
      expect(Math.abs(s.countError)).toBeLessThan(0.05);
      expect(s.recall).toBeGreaterThan(0.95);
    }
  }, 60_000);

  it('finds large pale colonies only about 4 ΔE lighter than the agar, and nothing on that agar bare', async () => {
    // Such colonies stay under the per-pixel threshold; the lower threshold for round patches of
    // colony size (cv/foreground.ts) finds them. Before it, recall was 0.59–0.70 on these seeds.
    const plates = await scoredVariety([211, 212, 213], {
      colonies: 150,
      colours: 'faint-peach',
      fractionClass1: 0.7,
      glare: 0,
    });
    const recalls = plates.map((p) => p.score.recall);
    expect(Math.min(...recalls)).toBeGreaterThan(0.65);
    expect(recalls.reduce((a, b) => a + b, 0) / recalls.length).toBeGreaterThan(0.72);
    const bare = await run(varietyScene(214, { colonies: 0, colours: 'faint-peach', glare: 0 }));
    expect(bare.analysis.colonies).toEqual([]);
  }, 90_000);

  it('does not count writing in the colonies own colour that crosses the wall', async () => {
    // Blue ink on a plate of blue colonies: colour cannot tell the writing's pieces from colonies
    // anywhere on the plate, but inside the writing's own blob the pieces of its ink that are
    // thinner than a colony are the line (cv/candidates.ts). Before that rule, precision on these
    // seeds was 0.76, 0.78 and 0.90 and the count 10–30 % high.
    const plates = await scoredVariety([401, 402, 403], {
      colonies: 80,
      colours: 'blue-cream',
      penInk: 'blue',
      penMarks: true,
      penAcrossWall: true,
      glare: 0,
    });
    for (const { seed, score } of plates)
      expect(score.precision, `seed ${seed}`).toBeGreaterThan(0.85);
    const errors = plates.map((p) => Math.abs(p.score.countError));
    expect(errors.reduce((a, b) => a + b, 0) / errors.length).toBeLessThan(0.1);
  }, 90_000);

  it('counts nothing on empty plates written on in any ink colour', async () => {
    for (const penInk of ['black', 'blue', 'green', 'red'] as const) {
      for (const colours of ['blue-cream', 'deepred-pink', 'slate-yellow'] as const) {
        const r = await run(varietyScene(300, { colonies: 0, colours, penInk, penMarks: true }));
        expect(r.analysis.colonies, `${penInk} ink on ${colours}`).toEqual([]);
      }
    }
  }, 120_000);
});
