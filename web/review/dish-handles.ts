import type { DishRecord } from '../../schema/records.ts';

/**
 * The dish outline's three handles: its centre moves it; the end of its first axis turns and
 * sizes it (both axes in proportion); the end of its second axis sets how oval it is, for a dish
 * photographed at a tilt. Image pixels throughout.
 */
export type DishHandle = 'centre' | 'rim' | 'side';

export const DISH_HANDLES: readonly DishHandle[] = ['centre', 'rim', 'side'];

/** The smallest axis a drag leaves, in pixels: a dish is never dragged down to nothing. */
const MIN_AXIS_PX = 20;

export function isDishHandle(name: string | null): name is DishHandle {
  return name !== null && (DISH_HANDLES as readonly string[]).includes(name);
}

export function handleAt(d: DishRecord, handle: DishHandle): { x: number; y: number } {
  const a = (d.angleDeg * Math.PI) / 180;
  if (handle === 'centre') return { x: d.cx, y: d.cy };
  if (handle === 'rim') return { x: d.cx + d.rx * Math.cos(a), y: d.cy + d.rx * Math.sin(a) };
  return { x: d.cx - d.ry * Math.sin(a), y: d.cy + d.ry * Math.cos(a) };
}

/** The dish after `handle` of `d0` is dragged to `at`. */
export function dragHandle(
  d0: DishRecord,
  handle: DishHandle,
  at: { x: number; y: number },
): DishRecord {
  const dx = at.x - d0.cx;
  const dy = at.y - d0.cy;
  if (handle === 'centre') return { ...d0, cx: at.x, cy: at.y };
  if (handle === 'rim') {
    const rx = Math.max(MIN_AXIS_PX, Math.hypot(dx, dy));
    const angleDeg = (Math.atan2(dy, dx) * 180) / Math.PI;
    return { ...d0, rx, ry: rx * (d0.ry / d0.rx), angleDeg };
  }
  // Only the part of the drag across the first axis counts: the outline keeps its turn.
  const a = (d0.angleDeg * Math.PI) / 180;
  const across = Math.abs(-dx * Math.sin(a) + dy * Math.cos(a));
  return { ...d0, ry: Math.max(MIN_AXIS_PX, across) };
}
