import type { ClassIndex, ColonyRecord, Corrections, Edit } from '../../schema/records.ts';

/** The colonies after the person's edits, in the order the analysis found them, additions last. */
export function correctedColonies(
  found: readonly ColonyRecord[],
  edits: readonly Edit[],
): ColonyRecord[] {
  const byId = new Map(found.map((c) => [c.id, c]));
  for (const e of edits) {
    if (e.op === 'add') byId.set(e.colony.id, e.colony);
    else if (e.op === 'remove') byId.delete(e.colonyId);
    else {
      const c = byId.get(e.colonyId);
      if (c) byId.set(c.id, { ...c, cls: e.cls });
    }
  }
  return [...byId.values()];
}

/** Colonies per class; an unsplit clump counts for the colonies it stands for. */
export function countsByClass(colonies: readonly ColonyRecord[]): [number, number] {
  const n: [number, number] = [0, 0];
  for (const c of colonies) n[c.cls] += c.count;
  return n;
}

export type EditStack = Pick<Corrections, 'edits' | 'undone'>;

export function applyEdit(stack: EditStack, edit: Edit): EditStack {
  return { edits: [...stack.edits, edit], undone: [] };
}

export function undo(stack: EditStack): EditStack {
  const last = stack.edits.at(-1);
  if (!last) return stack;
  return { edits: stack.edits.slice(0, -1), undone: [...stack.undone, last] };
}

export function redo(stack: EditStack): EditStack {
  const next = stack.undone.at(-1);
  if (!next) return stack;
  return { edits: [...stack.edits, next], undone: stack.undone.slice(0, -1) };
}

/** The colony under a tap, if any: the nearest whose outline (plus `slack` pixels) holds the point. */
export function colonyAt(
  colonies: readonly ColonyRecord[],
  x: number,
  y: number,
  slack: number,
): ColonyRecord | null {
  let best: ColonyRecord | null = null;
  let bestD = Number.POSITIVE_INFINITY;
  for (const c of colonies) {
    const d = Math.hypot(c.x - x, c.y - y);
    if (d <= c.r + slack && d < bestD) {
      best = c;
      bestD = d;
    }
  }
  return best;
}

/** What a tap does depends on the tool the person holds. */
export type TapTool = 'add' | 'remove' | 'switch';

/**
 * The edit a tap at (x, y) makes, or null when it does nothing. A colour tool adds a colony of
 * its colour on empty agar and gives a colony of the other colour its colour; on a colony of its
 * own colour it does nothing: a second colony is never stacked on one already there (a clump the
 * analysis missed is fixed by adding beside it). Remove and switch act on the colony under the
 * tap, and do nothing on empty agar. New colonies take the typical radius.
 */
export function editForTap(
  colonies: readonly ColonyRecord[],
  tool: TapTool,
  at: { x: number; y: number; cls: ClassIndex; slack: number; newId: string },
): Edit | null {
  const hit = colonyAt(colonies, at.x, at.y, at.slack);
  if (tool === 'add') {
    if (hit) return hit.cls === at.cls ? null : { op: 'reclass', colonyId: hit.id, cls: at.cls };
    const r = typicalRadius(colonies) ?? at.slack;
    return {
      op: 'add',
      colony: {
        id: at.newId,
        x: at.x,
        y: at.y,
        r,
        cls: at.cls,
        confidence: 1,
        count: 1,
        area: Math.PI * r ** 2,
        split: false,
        lab: null,
        deltaLab: null,
      },
    };
  }
  if (!hit) return null;
  if (tool === 'remove') return { op: 'remove', colonyId: hit.id };
  return { op: 'reclass', colonyId: hit.id, cls: hit.cls === 0 ? 1 : 0 };
}

/** Median colony radius, or null on an empty plate. */
function typicalRadius(colonies: readonly ColonyRecord[]): number | null {
  if (colonies.length === 0) return null;
  const r = colonies.map((c) => c.r).sort((a, b) => a - b);
  return r[Math.floor(r.length / 2)]!;
}
