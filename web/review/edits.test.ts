import { describe, expect, it } from 'vitest';
import type { ColonyRecord } from '../../schema/records.ts';
import { applyEdit, correctedColonies, countsByClass, editForTap, redo, undo } from './edits.ts';

function colony(id: string, x: number, y: number, cls: 0 | 1, count = 1): ColonyRecord {
  return {
    id,
    x,
    y,
    r: 10,
    cls,
    confidence: 0.9,
    count,
    area: 314,
    split: false,
    lab: null,
    deltaLab: null,
  };
}

const found = [colony('a', 100, 100, 0), colony('b', 200, 100, 1), colony('c', 300, 100, 1, 3)];

describe('corrections on top of the automatic count', () => {
  it('counts a clump for the colonies it stands for', () => {
    expect(countsByClass(found)).toEqual([1, 4]);
  });

  it('tap to add on empty agar, remove on a colony, switch a colony: counts follow', () => {
    let stack = { edits: [], undone: [] } as Parameters<typeof applyEdit>[0];
    const at = (x: number, y: number) => ({ x, y, cls: 0 as const, slack: 4, newId: `n${x}` });
    const step = (tool: 'add' | 'remove' | 'switch', x: number, y: number) => {
      const e = editForTap(correctedColonies(found, stack.edits), tool, at(x, y));
      if (e) stack = applyEdit(stack, e);
      return countsByClass(correctedColonies(found, stack.edits));
    };
    expect(step('add', 500, 500)).toEqual([2, 4]);
    expect(step('remove', 203, 98)).toEqual([2, 3]);
    expect(step('switch', 100, 100)).toEqual([1, 4]);
    // Removing or switching on empty agar does nothing.
    expect(step('remove', 900, 900)).toEqual([1, 4]);
    expect(stack.edits).toHaveLength(3);
    stack = undo(stack);
    expect(countsByClass(correctedColonies(found, stack.edits))).toEqual([2, 3]);
    stack = undo(undo(stack));
    expect(countsByClass(correctedColonies(found, stack.edits))).toEqual([1, 4]);
    stack = redo(stack);
    expect(countsByClass(correctedColonies(found, stack.edits))).toEqual([2, 4]);
    // A new edit after undo drops the redo steps.
    stack = applyEdit(stack, { op: 'remove', colonyId: 'a' });
    expect(stack.undone).toEqual([]);
    expect(countsByClass(correctedColonies(found, stack.edits))).toEqual([1, 4]);
  });

  it('undo and redo with nothing to undo or redo change nothing', () => {
    const empty = { edits: [], undone: [] };
    expect(undo(empty)).toBe(empty);
    expect(redo(empty)).toBe(empty);
  });

  it('an added colony takes the median radius of the plate', () => {
    const e = editForTap(found, 'add', { x: 1, y: 1, cls: 1, slack: 6, newId: 'z' });
    expect(e?.op === 'add' && e.colony.r).toBe(10);
    const onEmpty = editForTap([], 'add', { x: 1, y: 1, cls: 1, slack: 6, newId: 'z' });
    expect(onEmpty?.op === 'add' && onEmpty.colony.r).toBe(6);
  });

  it('a tap between two colonies picks the nearer one', () => {
    const close = [colony('p', 0, 0, 0), colony('q', 15, 0, 1)];
    const e = editForTap(close, 'remove', { x: 9, y: 0, cls: 0, slack: 2, newId: 'x' });
    expect(e).toEqual({ op: 'remove', colonyId: 'q' });
  });
});

describe('a colour tool never stacks a colony on one already there', () => {
  it('on a colony of its colour it does nothing; on the other colour it recolours; beside, it adds', () => {
    const on = editForTap(found, 'add', { x: 104, y: 100, cls: 0, slack: 4, newId: 'z' });
    expect(on).toBeNull();
    const other = editForTap(found, 'add', { x: 104, y: 100, cls: 1, slack: 4, newId: 'z' });
    expect(other).toEqual({ op: 'reclass', colonyId: 'a', cls: 1 });
    const beside = editForTap(found, 'add', { x: 130, y: 100, cls: 1, slack: 4, newId: 'z' });
    expect(beside?.op).toBe('add');
  });
});
