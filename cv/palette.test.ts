import { describe, expect, it } from 'vitest';
import { generatePlate } from '../fixtures/plate-generator.ts';
import { madeUpReading } from '../tests/support/made-up-reading.ts';
import { analyzePlate } from './analyze.ts';
import { classify, classifyAside } from './classify.ts';
import { classifyWithPalette, learnPalette, paletteFromExamples } from './palette.ts';
import type { Colony, Lab, Palette, PlateAnalysis } from './types.ts';

/**
 * A plate's analysis holding colonies of the given colours relative to the agar (ΔL*, Δa*, Δb*).
 * `scatter`: the direction and size of the colonies' spread (default a small one, mostly in L*).
 */
function plateOf(groups: { delta: Lab; n: number; scatter?: Lab }[]): PlateAnalysis {
  const agar: Lab = [55, 30, 0];
  const colonies: Colony[] = groups.flatMap(({ delta, n, scatter = [1.5, -1.5, 0.75] }) =>
    Array.from({ length: n }, (_, i) => {
      const wobble = Math.sin(i * 2.4); // a fixed spread, the same on every run
      const d: Lab = [
        delta[0] + wobble * scatter[0],
        delta[1] + wobble * scatter[1],
        delta[2] + wobble * scatter[2],
      ];
      return {
        x: i,
        y: 0,
        r: 5,
        area: 80,
        cls: 0 as const,
        confidence: 1,
        split: false,
        count: 1,
        lab: [agar[0] + d[0], agar[1] + d[1], agar[2] + d[2]] as Lab,
        deltaLab: d,
      };
    }),
  );
  return madeUpReading(colonies, { agarLab: agar });
}

/** Two strains, a dark ancestor and a pale evolved line, with the spreads given. */
function competitionPalette(ancestorSpread: number, evolvedSpread: number): Palette {
  return {
    version: 1,
    colours: [
      { name: 'ancestor', hex: '#5a1e28', deltaLab: [-24, 20, -6], spread: ancestorSpread },
      { name: 'evolved', hex: '#f0e6dc', deltaLab: [5, -2, -3], spread: evolvedSpread },
    ],
  };
}

describe('palettes', () => {
  it('taught by one colony of each colour, classify a 97:3 plate right', async () => {
    const first = await analyzePlate(generatePlate({ seed: 61, colonies: [60, 60] }).image);
    const blue = first.colonies.find((c) => first.classes[c.cls]!.name === 'blue')!;
    const cream = first.colonies.find((c) => first.classes[c.cls]!.name === 'cream')!;
    const taught = paletteFromExamples(blue, cream, ['ancestor', 'evolved']);
    expect(taught.colours.map((c) => c.name)).toEqual(['ancestor', 'evolved']);

    const skewed = await analyzePlate(generatePlate({ seed: 62, colonies: [97, 3] }).image);
    const sorted = classifyWithPalette(skewed, taught);
    expect(Math.abs(sorted.counts.ancestor! - 97)).toBeLessThanOrEqual(3);
    expect(sorted.counts.evolved).toBe(3);
    expect(sorted.classes.map((c) => c.name)).toEqual(['ancestor', 'evolved']);
  }, 60_000);

  it('learned from several plates, and none learned from plates of one colour', async () => {
    const plates = [];
    for (const seed of [63, 64])
      plates.push(await analyzePlate(generatePlate({ seed, colonies: 80 }).image));
    expect(learnPalette(plates)!.colours.map((c) => c.name)).toEqual(['blue', 'cream']);
    const oneColour = await analyzePlate(generatePlate({ seed: 65, colonies: [0, 90] }).image);
    expect(learnPalette([oneColour])).toBeNull();
  }, 60_000);

  it('one plate that split glare from colonies does not drag the batch palette', () => {
    const dark: Lab = [-25, 15, -1];
    const pale: Lab = [6, -3, -1];
    const glare: Lab = [30, -18, -6];
    const good = [60, 50, 40].map((n) =>
      plateOf([
        { delta: dark, n },
        { delta: pale, n },
      ]),
    );
    // The largest plate of the batch, whose second "colour" is pieces of a glare arc.
    const bad = plateOf([
      { delta: dark, n: 270 },
      { delta: glare, n: 70 },
    ]);
    const palette = learnPalette([...good, bad])!;
    const learnedPale = palette.colours.find((c) => c.deltaLab[0] > 0)!;
    expect(Math.abs(learnedPale.deltaLab[0] - pale[0])).toBeLessThan(2);
    expect(Math.abs(learnedPale.deltaLab[1] - pale[1])).toBeLessThan(2);
  });

  it('a few far strays on a two-colour plate are set aside, and its two colours still teach', () => {
    const dark: Lab = [-27, 4, -20];
    const pale: Lab = [5, -2, 3];
    // Three pieces of green writing, far from both colours and alike: a cluster of their own for
    // k-means (its strays are single objects), 1 % of the plate, too few to be a colour.
    const ink: Lab = [-20, -52, 50];
    const plate = (withInk: boolean) =>
      plateOf([
        { delta: dark, n: 130 },
        { delta: pale, n: 130 },
        ...(withInk ? [{ delta: ink, n: 3 }] : []),
      ]);
    const clean = learnPalette([plate(false), plate(false)])!;
    const palette = learnPalette([plate(true), plate(true)]);
    expect(palette).not.toBeNull();
    palette!.colours.forEach((c, k) => {
      for (let j = 0; j < 3; j++)
        expect(Math.abs(c.deltaLab[j]! - clean.colours[k]!.deltaLab[j]!)).toBeLessThan(0.5);
    });
  });

  it('colonies weaker than the palette colour are sorted by their pigment, not their strength', () => {
    // This plate's dark colonies are half as far from the agar as the palette's (young colonies:
    // by the Beer–Lambert law a thinner layer of the same pigment differs less from the agar, in
    // the same direction). In plain distance, scaled by the colours' spreads, they are nearer the
    // widely spread pale colour; along the dark colour's line they are the dark strain.
    const young = plateOf([{ delta: [-12, 10, -3], n: 30 }]);
    const sorted = classifyWithPalette(young, competitionPalette(4, 8));
    expect(sorted.counts).toEqual({ ancestor: 30, evolved: 0 });
  });

  it('a plate sorted by its own two colours puts weak colonies with their pigment', () => {
    // A plate of both strains whose dark colonies vary widely in strength and whose pale ones
    // hardly vary, plus eight small dark colonies a third as far from the agar as the dark
    // colour (Beer–Lambert, as above). In plain distance they are nearer the tight pale centre,
    // where k-means's split left them; in the plate's own spreads, and along the dark colour's
    // line from the agar, they are the dark strain.
    const plate = plateOf([
      { delta: [-24, 20, -6], n: 60, scatter: [8, -8, 4] },
      { delta: [5, -2, -3], n: 60, scatter: [1, -0.5, 0.3] },
      { delta: [-6, 6, -4.5], n: 8, scatter: [0.2, 0.2, 0.1] },
    ]);
    const sorted = classifyWithPalette(plate, competitionPalette(6, 2));
    expect(sorted.flags.map((f) => f.kind)).not.toContain('one-colour');
    expect(sorted.counts).toEqual({ ancestor: 68, evolved: 60 });
  });

  it('a weaker shade of a palette colour is that colour, never of neither colour', () => {
    // Colonies 0.6 as far from the agar as the palette's dark colour, against a palette learned
    // from plates whose colonies hardly varied: far from both colours' centres in their spreads,
    // but on the dark colour's line from the agar (Beer–Lambert, as above).
    const young = plateOf([{ delta: [-14.4, 12, -3.6], n: 30 }]);
    const sorted = classifyWithPalette(young, competitionPalette(2, 2));
    expect(sorted.neither).toEqual([]);
    expect(sorted.counts).toEqual({ ancestor: 30, evolved: 0 });
  });

  it('one sharp plate does not teach a batch alone: plates doubted only for focus join it', () => {
    // Two plates of the same two strains; the second was flagged out of focus, and blur mixes its
    // dark colonies' edges with the agar and their neighbours, so their colour varies more (here
    // in b*, across the colour's shades). With the sharp plate alone, the palette's dark colour is
    // as narrow as that plate's colonies and a third of the second plate's dark colonies are of
    // neither colour.
    const sharp = plateOf([
      { delta: [-24, 20, -6], n: 30 },
      { delta: [5, -2, -3], n: 30 },
    ]);
    const soft = {
      ...plateOf([
        { delta: [-24, 20, -6], n: 30, scatter: [0, 0, 10] },
        { delta: [5, -2, -3], n: 30 },
      ]),
      flags: [{ kind: 'out-of-focus' as const, edgeWidthMm: 0.6 }],
    };
    const alone = classifyWithPalette(soft, learnPalette([sharp])!);
    expect(alone.neither!.length).toBeGreaterThan(5);
    const batch = classifyWithPalette(soft, learnPalette([sharp, soft])!);
    expect(batch.neither).toEqual([]);
    expect(Object.values(batch.counts).sort()).toEqual([30, 30]);
  });

  // Lid glare adds its own light to a colony seen through it: a red colony there reads as a
  // much lighter, greyer shade. Such colonies must not move the colours a batch learns.
  it('colonies seen through lid glare teach no colours', () => {
    const clear = plateOf([
      { delta: [-24, 20, -6], n: 30 },
      { delta: [5, -2, -3], n: 30 },
    ]);
    const lit = plateOf([{ delta: [-40, 4, -2], n: 25 }]).colonies.map((c) => ({
      ...c,
      glareLit: true as const,
    }));
    const withLit = { ...clear, colonies: [...clear.colonies, ...lit] };
    expect(learnPalette([withLit])).toEqual(learnPalette([clear]));
    // Counted as colonies, they would have taught a different pair.
    const counted = {
      ...clear,
      colonies: [...clear.colonies, ...lit.map(({ glareLit, ...c }) => c)],
    };
    expect(learnPalette([counted])).not.toEqual(learnPalette([clear]));
  });

  it('a plate is sorted by its clear colonies, and a washed-out colony under glare by its shade', () => {
    const clear = plateOf([
      { delta: [-24, 20, -6], n: 30 },
      { delta: [5, -2, -3], n: 30 },
    ]).colonies;
    // Half the dark colour's difference from the agar, as a reflection over it leaves.
    const washed = plateOf([{ delta: [-12, 10, -3], n: 12 }]).colonies;
    const all = [...clear, ...washed];
    const aside = all.map((_, i) => i >= clear.length);
    const own = classify(clear);
    const sorted = classifyAside(all, aside);
    expect(sorted.classes).toEqual(own.classes);
    expect(sorted.cls.slice(0, clear.length)).toEqual(own.cls);
    const dark = own.cls[0]!;
    expect(sorted.cls.slice(clear.length).every((k) => k === dark)).toBe(true);
    expect(sorted.outlier.every((o) => !o)).toBe(true);
    // A plate seen wholly through glare has nothing clear to decide by: it is sorted as it is.
    expect(
      classifyAside(
        washed,
        washed.map(() => true),
      ),
    ).toEqual(classify(washed));
  });

  it('re-sorting keeps image flags and recounts the colony flags', async () => {
    const a = await analyzePlate(generatePlate({ seed: 66, colonies: [0, 90] }).image);
    expect(a.flags.map((f) => f.kind)).toContain('one-colour');
    const other = await analyzePlate(generatePlate({ seed: 67, colonies: [40, 40] }).image);
    const palette = learnPalette([other])!;
    const sorted = classifyWithPalette(a, palette);
    expect(sorted.flags.map((f) => f.kind)).not.toContain('one-colour');
    expect(sorted.counts.blue ?? 0).toBeLessThanOrEqual(1);
  }, 60_000);
});
