import { describe, expect, it } from 'vitest';
import type { ColonyRecord } from '../../schema/records.ts';
import { currentUnsure, editForAnswer, unsureQueue } from './unsure.ts';

const colony = (id: string, confidence: number, measured = true): ColonyRecord => ({
  id,
  x: 0,
  y: 0,
  r: 5,
  cls: 0,
  confidence,
  count: 1,
  area: 78,
  split: false,
  lab: measured ? [50, 0, 0] : null,
  deltaLab: measured ? [1, 1, 1] : null,
});

describe('stepping through the colonies the analysis was unsure of', () => {
  it('takes the unsure measured colonies, least sure first; hand-added ones never', () => {
    const q = unsureQueue([
      colony('a', 0.9),
      colony('b', 0.6),
      colony('c', 0.4),
      colony('d', 0.1, false),
    ]);
    expect(q).toEqual(['c', 'b']);
  });

  it('one answer, one edit: the other colour switches, the same colour changes nothing', () => {
    const c = colony('b', 0.6);
    expect(editForAnswer(c, 1)).toEqual({ op: 'reclass', colonyId: 'b', cls: 1 });
    expect(editForAnswer(c, 0)).toBeNull();
    expect(editForAnswer(c, 'not-a-colony')).toEqual({ op: 'remove', colonyId: 'b' });
  });
});

describe('the step-through passes over colonies removed meanwhile', () => {
  it('shows the next one still on the plate, and ends after the last', () => {
    const colonies = [colony('a', 0.5), colony('c', 0.2)];
    const walk = { queue: ['a', 'b', 'c'], at: 1 };
    expect(currentUnsure(walk, colonies)).toMatchObject({ colony: { id: 'c' }, index: 2 });
    expect(currentUnsure({ ...walk, at: 3 }, colonies)).toBeNull();
  });
});
