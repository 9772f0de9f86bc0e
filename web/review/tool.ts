import type { ClassIndex, ColonyRecord } from '../../schema/records.ts';

/** What a tap on the review picture does: the tool the person holds. Looking changes nothing. */
export type Tool =
  | { kind: 'look' }
  | { kind: 'add'; cls: ClassIndex }
  | { kind: 'remove' }
  | { kind: 'switch' }
  /** Teaching the palette: the first colony tapped, waiting for one of the other colour. */
  | { kind: 'teach'; first: ColonyRecord | null };

export const LOOK: Tool = { kind: 'look' };

export function sameTool(a: Tool, b: Tool): boolean {
  if (a.kind !== b.kind) return false;
  if (a.kind === 'add' && b.kind === 'add') return a.cls === b.cls;
  return true;
}

/** The hint under the tools; `names` are the experiment's two colours, in class order. */
export function toolHint(tool: Tool, names: readonly [string, string]): string {
  switch (tool.kind) {
    case 'look':
      return 'Pinch to zoom, drag to move. Pick a tool to change the count.';
    case 'add':
      return `Tap empty agar to add a ${names[tool.cls]} colony, or a colony to make it ${names[tool.cls]}.`;
    case 'remove':
      return 'Tap a colony to remove it.';
    case 'switch':
      return 'Tap a colony to switch its colour.';
    case 'teach':
      return tool.first
        ? `Now tap one ${names[1]} colony.`
        : `Tap one ${names[0]} colony, then one ${names[1]}.`;
  }
}
