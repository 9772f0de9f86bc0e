import { describe, expect, it } from 'vitest';
import type { LineTrajectory } from '../../fitness/analysis.ts';
import type { CurveFit } from '../../fitness/trajectories.ts';
import { generationSpan, modelDoubt } from './model-trust.ts';

const line = (generations: number[]) =>
  ({ points: generations.map((g) => ({ generation: g, w: 1, assay: `a${g}` })) }) as LineTrajectory;
const curve = (poorly: boolean) =>
  ({
    model: 'power-law',
    parameters: [
      { name: 'a', estimate: 52.3e6, se: 9.2e6, poorlyDetermined: false },
      { name: 'b', estimate: 1e-9, se: 5e-9, poorlyDetermined: poorly },
    ],
  }) as unknown as CurveFit;

describe('which trajectory models may be shown as results', () => {
  it('none with fewer than three generations, however well they fit', () => {
    expect(modelDoubt(line([0, 500, 500]), curve(false))).toBe(
      'measured at 2 generations; a model needs 3',
    );
  });

  it('none with a poorly determined parameter, or a failed fit', () => {
    expect(modelDoubt(line([0, 500, 1000]), curve(true))).toMatch(/poorly determined/);
    expect(modelDoubt(line([0, 500, 1000]), { model: 'step', reason: 'x' })).toBe('not fitted: x');
    expect(modelDoubt(line([0, 500, 1000]), curve(false))).toBeNull();
  });

  it('a span of one generation is named as one', () => {
    expect(generationSpan(500, 500)).toBe('generation 500');
    expect(generationSpan(0, 500)).toBe('generations 0–500');
  });
});
