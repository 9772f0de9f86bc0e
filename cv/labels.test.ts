import { describe, expect, it } from 'vitest';
import { labelsFromCorrections } from './labels.ts';
import type { CandidateFeatures } from './types.ts';

function object(
  id: number,
  x: number,
  y: number,
  verdict: 'colony' | 'rejected',
): CandidateFeatures {
  return {
    id,
    x,
    y,
    r: 5,
    dL: -20,
    da: 10,
    db: 0,
    dE: 22,
    radiusMm: 0.5,
    elongation: 1,
    ridgeVariation: 0,
    wallMm: 10,
    verdict,
    plateColonies: 3,
  };
}

describe('labels from a checked plate', () => {
  const objects = [
    object(1, 100, 100, 'colony'), // kept as red
    object(2, 200, 100, 'colony'), // switched to white (the analysis said red)
    object(3, 300, 100, 'colony'), // removed
    object(4, 400, 100, 'rejected'), // found: a colony the rules rejected
    object(5, 500, 100, 'rejected'), // rightly rejected
  ];
  const final = [
    { x: 102, y: 99, cls: 'red' }, // a tap off-centre, inside the colony
    { x: 200, y: 104, cls: 'white' },
    { x: 401, y: 100, cls: 'white' },
    { x: 700, y: 700, cls: 'red' }, // added where nothing was measured
  ];
  const said = new Map([
    [1, 'red'],
    [2, 'red'],
    [3, 'white'],
  ]);
  const labels = labelsFromCorrections(objects, final, (id) => said.get(id));

  it.each([
    [0, 'kept', true, 'red'],
    [1, 'switched', true, 'white'],
    [2, 'removed', false, null],
    [3, 'found', true, 'white'],
    [4, 'rejected', false, null],
    [5, 'added', true, 'red'],
  ] as const)('label %i is %s', (i, kind, colony, cls) => {
    expect(labels[i]).toMatchObject({ kind, colony, cls });
  });

  it('an added colony carries no features, only its place', () => {
    expect(labels[5]).toMatchObject({ features: null, x: 700, y: 700 });
    expect(labels).toHaveLength(6);
  });

  it('without the analysis colours, kept and switched are not told apart', () => {
    const plain = labelsFromCorrections(objects, final);
    expect(plain[1]!.kind).toBe('kept');
  });

  it('each final colony labels one object: the nearer of two', () => {
    const two = [object(1, 100, 100, 'colony'), object(2, 106, 100, 'colony')];
    const one = labelsFromCorrections(two, [{ x: 105, y: 100, cls: 'red' }]);
    expect(one.map((l) => l.kind)).toEqual(['removed', 'kept']);
  });

  it('a tap beyond the object is an added colony, and the object is removed', () => {
    const far = labelsFromCorrections(
      [object(1, 100, 100, 'colony')],
      [{ x: 120, y: 100, cls: 'red' }],
    );
    expect(far.map((l) => l.kind)).toEqual(['removed', 'added']);
  });
});
