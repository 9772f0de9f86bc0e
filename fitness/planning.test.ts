import { describe, expect, it } from 'vitest';
import { COUNTABLE_RANGES } from './countable-range.ts';
import { planDilution, plannedCountingSe, planReplicates, replicatesNeeded } from './planning.ts';

describe('planDilution', () => {
  it('puts the expected plate near the middle of the countable range', () => {
    // 1.4×10⁹ CFU/mL, 100 µL: 10⁶ gives 140 colonies, the closest to (25 + 250)/2 = 137.5.
    const plan = planDilution({ cfuPerMl: 1.4e9 });
    expect(plan).toMatchObject({
      dilutionFold: 1e6,
      volumeUl: 100,
      target: 137.5,
      status: 'countable',
    });
    expect(plan.expectedColonies).toBeCloseTo(140, 9);
  });

  it('uses an OD with the lab calibration, other volumes and other ranges', () => {
    // OD 0.5 × 8×10⁸ CFU/mL per OD = 4×10⁸; with 50 or 100 µL and ISO 7218 (target 155):
    // 10⁵ × 50 µL gives 200 colonies, 10⁵ × 100 µL gives 400, 10⁶ × 100 µL gives 40 → 200 is closest.
    const plan = planDilution({
      od: 0.5,
      cfuPerOd: 8e8,
      volumesUl: [50, 100],
      range: COUNTABLE_RANGES.iso7218,
    });
    expect(plan.cfuPerMl).toBe(4e8);
    expect(plan).toMatchObject({ dilutionFold: 1e5, volumeUl: 50, status: 'countable' });
    expect(plan.expectedColonies).toBeCloseTo(200, 9);
  });

  it('prefers a plate inside the range to a nearer one outside it', () => {
    // 5.4×10⁸ CFU/mL with 50 or 100 µL under BAM 25–250: 10⁵ × 50 µL gives 270 (too many),
    // 10⁶ × 100 µL gives 54; 270 is nearer 137.5 on a log scale but cannot be counted.
    const plan = planDilution({ cfuPerMl: 5.4e8, volumesUl: [100, 50] });
    expect(plan).toMatchObject({ dilutionFold: 1e6, volumeUl: 100, status: 'countable' });
    expect(plan.expectedColonies).toBeCloseTo(54, 9);
  });

  it('refuses a density it cannot use', () => {
    expect(() => planDilution({})).toThrow(/density, or an OD/);
    expect(() => planDilution({ cfuPerMl: -5 })).toThrow(/> 0/);
    expect(() => planDilution({ cfuPerMl: 1e9, volumesUl: [0] })).toThrow(/volumes/);
  });
});

describe('replicates planner', () => {
  it('agrees with statsmodels power solutions (rounded up)', () => {
    // statsmodels 0.13.5 (Debian python3-statsmodels), exact noncentral-t power:
    //   TTestPower().solve_power(effect_size=δ/σ, alpha=0.05, power=0.8)
    //     δ/σ = 0.05/0.04 → 7.1716; 0.02/0.04 → 33.3671
    //   TTestIndPower().solve_power(effect_size=δ/σ, alpha=0.05, power=0.8) (n per group)
    //     δ/σ = 0.05/0.04 → 11.0942; 0.03/0.05 → 44.5858
    const cases: [number, number, 'one-sample' | 'two-sample', number][] = [
      [0.05, 0.04, 'one-sample', 7.1716352339917],
      [0.02, 0.04, 'one-sample', 33.36713118431864],
      [0.05, 0.04, 'two-sample', 11.094186257269874],
      [0.03, 0.05, 'two-sample', 44.58578933650372],
    ];
    for (const [delta, sd, design, exact] of cases) {
      const n = replicatesNeeded(delta, sd, design);
      // The central-t approximation can miss by one in general; on these cases it does not.
      expect(n).toBe(Math.ceil(exact));
    }
  });

  it('adds the counting noise at the planned colonies to the between-assay spread', () => {
    // 100 colonies per strain and sample, m_ref = ln 100, W = 1: Var(m) = 2/100 for each strain,
    // SE(W) = √(0.02 + 0.02)/ln 100 = 0.043429.
    const se = plannedCountingSe({ start: 100, end: 100 });
    expect(se).toBeCloseTo(Math.sqrt(0.04) / Math.log(100), 12);
    const plan = planReplicates({
      difference: 0.05,
      assaySd: 0.05,
      observedCountingSe: 0.03,
      plannedColonies: { start: 100, end: 100 },
    });
    expect(plan.betweenAssaySd).toBeCloseTo(0.04, 12);
    expect(plan.sdPerAssay).toBeCloseTo(Math.sqrt(0.04 ** 2 + se ** 2), 12);
    expect(plan.n).toBe(replicatesNeeded(0.05, plan.sdPerAssay, 'one-sample'));
    // More colonies per plate → less counting noise → fewer assays.
    const more = planReplicates({
      difference: 0.05,
      assaySd: 0.05,
      observedCountingSe: 0.03,
      plannedColonies: { start: 1000, end: 1000 },
    });
    expect(more.n).toBeLessThan(plan.n);
    expect(() =>
      planReplicates({ difference: 0, assaySd: 0.05, plannedColonies: { start: 100, end: 100 } }),
    ).toThrow();
  });
});
