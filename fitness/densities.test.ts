import { describe, expect, it } from 'vitest';
import { COUNTABLE_RANGES } from './countable-range.ts';
import { type Plate, plateDensity, pooledCfuPerMl, sampleDensity } from './densities.ts';
import { FitnessError } from './errors.ts';
import { poissonExactInterval } from './poisson.ts';

const plate = (label: string, fold: number, test: number, ref: number, volumeMl = 1): Plate => ({
  label,
  dilutionFold: fold,
  volumeMl,
  testColonies: test,
  referenceColonies: ref,
});

describe('plate densities', () => {
  it('CFU/mL = colonies × dilution fold / volume (GOST ISO 21149-2020 §12.3.1, §12.3.2)', () => {
    // 10⁻¹, 1 mL: 38 and 42 colonies, mean 40 → 400 CFU/mL; one plate of 60 → 600.
    expect(
      pooledCfuPerMl([38, 42].map((c) => ({ colonies: c, dilutionFold: 10, volumeMl: 1 }))),
    ).toBe(400);
    expect(plateDensity(60, 10, 1)).toBe(600);
    // 0.1 mL of 10⁻³ with 68 colonies: 6.8×10⁵ CFU/mL (arithmetic).
    expect(plateDensity(68, 1000, 0.1)).toBeCloseTo(6.8e5, 6);
  });

  it('pooled over two dilutions equals the standard weighted mean', () => {
    const pool = (counts: [number, number][]) =>
      pooledCfuPerMl(counts.map(([fold, c]) => ({ colonies: c, dilutionFold: fold, volumeMl: 1 })));
    // E1, FDA BAM ch. 3: 1:100 → 232, 244; 1:1000 → 33, 28: 537/0.022 = 24,409.
    expect(
      pool([
        [100, 232],
        [100, 244],
        [1000, 33],
        [1000, 28],
      ]),
    ).toBeCloseTo(24_409.09, 1);
    // E2, GOST ISO 21149-2020 §12.3.3: 10⁻²: 235, 282; 10⁻³: 31, 39 → 587/(2.2×10⁻²) = 26,682.
    expect(
      pool([
        [100, 235],
        [100, 282],
        [1000, 31],
        [1000, 39],
      ]),
    ).toBeCloseTo(26_681.8, 1);
    // E3–E5, ISO/TS 19036:2006/Amd 1:2009 examples 1–3: 100,000; 281.8; 100 per g.
    expect(
      pool([
        [1000, 102],
        [10_000, 8],
      ]),
    ).toBeCloseTo(100_000, 6);
    expect(
      pooledCfuPerMl([
        ...[9, 9, 9].map((c) => ({ colonies: c, dilutionFold: 10, volumeMl: 1 / 3 })),
        { colonies: 4, dilutionFold: 100, volumeMl: 1 },
      ]),
    ).toBeCloseTo(281.82, 2);
    expect(
      pool([
        [10, 9],
        [100, 2],
      ]),
    ).toBeCloseTo(100, 8);
  });
});

describe('sampleDensity', () => {
  it('pools both strains over the same plates, with exact Poisson limits', () => {
    const s = sampleDensity(
      [plate('row 2', 100, 120, 112), plate('row 3', 1000, 13, 15)],
      'assay X, start sample',
    );
    expect(s.cultureMl).toBeCloseTo(0.011, 12);
    expect(s.test.colonies).toBe(133);
    expect(s.test.cfuPerMl).toBeCloseTo(133 / 0.011, 6);
    const [lo, hi] = poissonExactInterval(133);
    expect(s.test.ci95[0]).toBeCloseTo(lo / 0.011, 6);
    expect(s.test.ci95[1]).toBeCloseTo(hi / 0.011, 6);
    expect(s.test.logVariance).toBeCloseTo(1 / 133, 12);
    // The 10⁻³ plate has 28 colonies in all: countable under BAM 25–250.
    expect(s.plates.map((p) => p.status)).toEqual(['countable', 'countable']);
  });

  it('flags out-of-range plates and keeps them unless the exclusion is asked for', () => {
    const plates = [plate('row 2', 100, 120, 110), plate('row 3', 1000, 9, 11)];
    const kept = sampleDensity(plates, 'assay X, end sample');
    expect(kept.plates[1]).toMatchObject({
      label: 'row 3',
      total: 20,
      status: 'too-few',
      dropped: false,
    });
    expect(kept.test.colonies).toBe(129);
    const dropped = sampleDensity(plates, 'assay X, end sample', { excludeOutOfRange: true });
    expect(dropped.plates[1]!.dropped).toBe(true);
    expect(dropped.test.colonies).toBe(120);
    expect(dropped.cultureMl).toBeCloseTo(0.01, 12);
    // With no in-range plate at all, nothing is dropped.
    const none = sampleDensity([plate('row 4', 10, 400, 300)], 'assay Y', {
      excludeOutOfRange: true,
    });
    expect(none.plates[0]).toMatchObject({ status: 'too-many', dropped: false });
    // Another range changes the verdict: ISO 7218 counts 10–300.
    const iso = sampleDensity(plates, 'assay X', { range: COUNTABLE_RANGES.iso7218 });
    expect(iso.plates[1]!.status).toBe('countable');
  });

  it('gives a strain with no colony density 0 and the upper limit of a zero count', () => {
    const s = sampleDensity([plate('row 7', 100, 0, 50)], 'assay A3, end sample');
    expect(s.test.cfuPerMl).toBe(0);
    // R 4.2.2: poisson.test(0, alternative = "less")$conf.int[2] = 2.99573227355399
    expect(s.test.atMostCfuPerMl! * s.cultureMl).toBeCloseTo(2.99573227355399, 12);
    expect(s.reference.atMostCfuPerMl).toBeNull();
    expect(Number.isFinite(s.test.logVariance)).toBe(true);
  });

  it('names the assay and the plate when the numbers are unusable', () => {
    expect(() =>
      sampleDensity([plate('row 9', 100, 5, 5, -0.1)], 'assay A4, start sample'),
    ).toThrow(/assay A4, start sample, row 9: plated volume must be > 0/);
    expect(() => sampleDensity([plate('row 9', Number.NaN, 5, 5)], 'assay A4')).toThrow(
      /dilution fold/,
    );
    expect(() => sampleDensity([plate('row 9', 10, 5.5, 5)], 'assay A4')).toThrow(/whole number/);
    expect(() => sampleDensity([], 'assay A5, end sample')).toThrow(FitnessError);
  });
});
