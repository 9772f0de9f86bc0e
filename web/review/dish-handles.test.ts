import { describe, expect, it } from 'vitest';
import { dragHandle, handleAt } from './dish-handles.ts';

const dish = { cx: 800, cy: 600, rx: 500, ry: 450, angleDeg: 0 };

describe('dish handles', () => {
  it('sit on the outline: the ends of its two axes, turned with it', () => {
    expect(handleAt(dish, 'rim')).toEqual({ x: 1300, y: 600 });
    expect(handleAt(dish, 'side')).toEqual({ x: 800, y: 1050 });
    const turned = handleAt({ ...dish, angleDeg: 90 }, 'rim');
    expect(turned.x).toBeCloseTo(800, 9);
    expect(turned.y).toBeCloseTo(1100, 9);
  });

  it('the rim handle turns and sizes the outline, keeping how oval it is', () => {
    // Dragged to 45° at 400 px from the centre: axes 400 and 360, turned 45°.
    const d = dragHandle(dish, 'rim', { x: 800 + 400 / Math.SQRT2, y: 600 + 400 / Math.SQRT2 });
    expect(d.rx).toBeCloseTo(400, 9);
    expect(d.ry).toBeCloseTo(360, 9);
    expect(d.angleDeg).toBeCloseTo(45, 9);
    // The handle follows the finger.
    const at = handleAt(d, 'rim');
    expect(at.x).toBeCloseTo(800 + 400 / Math.SQRT2, 9);
    expect(at.y).toBeCloseTo(600 + 400 / Math.SQRT2, 9);
  });

  it('the side handle sets the second axis from the drag across the first, and nothing else', () => {
    const turned = { ...dish, angleDeg: 30 };
    const a = (30 * Math.PI) / 180;
    // 380 px across the first axis and 100 px along it.
    const at = {
      x: 800 - 380 * Math.sin(a) + 100 * Math.cos(a),
      y: 600 + 380 * Math.cos(a) + 100 * Math.sin(a),
    };
    const d = dragHandle(turned, 'side', at);
    expect(d.ry).toBeCloseTo(380, 9);
    expect({ ...d, ry: 0 }).toEqual({ ...turned, ry: 0 });
  });

  it('never drags an axis below 20 px, and the centre handle only moves', () => {
    expect(dragHandle(dish, 'rim', { x: 801, y: 600 }).rx).toBe(20);
    expect(dragHandle(dish, 'side', { x: 800, y: 600 }).ry).toBe(20);
    expect(dragHandle(dish, 'centre', { x: 10, y: 20 })).toEqual({ ...dish, cx: 10, cy: 20 });
  });
});
