import { describe, expect, it } from 'vitest';
import { parseModel } from '../cv/model-file.ts';
import type { CandidateFeatures } from '../cv/types.ts';
import { fitExperimentModel, type TeachingPlate } from './learning.ts';

/** An object the analysis considered, at (x, 0). Colonies are dark and round, the rest faint specks. */
function candidate(id: number, colony: boolean): CandidateFeatures {
  return {
    id,
    x: id * 40,
    y: 0,
    r: colony ? 6 : 2,
    dL: colony ? -20 - (id % 5) : 1 + (id % 3) * 0.3,
    da: colony ? 15 + (id % 4) : 0.5,
    db: colony ? -2 + (id % 3) : 0.2,
    dE: colony ? 25 + (id % 6) : 3 + (id % 2),
    radiusMm: colony ? 0.6 + (id % 5) * 0.05 : 0.18,
    elongation: 1.1,
    ridgeVariation: 0.05,
    wallMm: 10 + (id % 7),
    verdict: colony ? 'colony' : 'rejected',
    plateColonies: 60,
  };
}

/**
 * A checked plate: 60 colonies the analysis found, 20 specks it rejected, and `added` colonies the
 * person tapped where the analysis had considered nothing.
 */
function plate(added: number, readByDefaults: boolean): TeachingPlate {
  const candidates = Array.from({ length: 80 }, (_, i) => candidate(i, i < 60));
  const final = [
    ...candidates.slice(0, 60).map((c) => ({ x: c.x, y: c.y, cls: 'red' })),
    ...Array.from({ length: added }, (_, i) => ({ x: i * 40, y: 500, cls: 'red' })),
  ];
  return { readByDefaults, candidates, final };
}

function reachOf(plates: TeachingPlate[], currentReach?: number): number {
  const fit = fitExperimentModel(plates, ['red', 'white'], currentReach);
  if (!fit.ok) throw new Error(fit.reason);
  return parseModel(fit.model).reach;
}

describe('how far the search reaches, refitted after every checked plate', () => {
  it('comes from the plates the default analysis read: 15 of 75 colonies missed gives 0.8', () => {
    expect(reachOf([plate(15, true)])).toBe(0.8);
  });

  it('does not fall again for the same missed colonies when plates read with the model are added', () => {
    // Refitting after each later plate must not multiply the reach down for plate 1's misses.
    const first = plate(15, true);
    expect(reachOf([first, plate(0, false)], 0.8)).toBe(0.8);
    expect(reachOf([first, plate(0, false), plate(2, false)], 0.8)).toBe(0.8);
  });

  it('keeps the current reach when no plate was read by the defaults', () => {
    expect(reachOf([plate(0, false)], 0.8)).toBe(0.8);
    expect(reachOf([plate(0, true)])).toBe(1);
  });
});
