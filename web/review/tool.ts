import type { ClassIndex, ColonyRecord } from '../../schema/records.ts';

/** What a tap on the review picture does: the tool the person holds. */
export type Tool =
  | { kind: 'add'; cls: ClassIndex }
  | { kind: 'remove' }
  | { kind: 'switch' }
  /** Teaching the palette: the first colony tapped, waiting for one of the other colour. */
  | { kind: 'teach'; first: ColonyRecord | null };

export function sameTool(a: Tool, b: Tool): boolean {
  if (a.kind !== b.kind) return false;
  if (a.kind === 'add' && b.kind === 'add') return a.cls === b.cls;
  return true;
}

export function toolHint(tool: Tool): string {
  switch (tool.kind) {
    case 'add':
      return 'Tap empty agar to add a colony of the chosen colour.';
    case 'remove':
      return 'Tap a colony to remove it.';
    case 'switch':
      return 'Tap a colony to switch its colour.';
    case 'teach':
      return tool.first ? 'Now a colony of the other colour.' : 'Tap one colony of either colour.';
  }
}
