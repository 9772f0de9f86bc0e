/**
 * Merging people's taps on the same plate: when phones corrected one analysis offline, every
 * phone's corrections are kept. Each version's edit list is reduced to its net effect (colonies
 * added, removed, reclassified); the effects are joined from the earliest version to the latest;
 * the result is written back as edits in a fixed order. The versions are put in one order by their
 * content before anything else, so the merge of any number of them is the same whatever order
 * they come in, and merging a result again with any of them changes nothing.
 */
import type { ClassIndex, ColonyRecord, Corrections, Edit } from '../../schema/records.ts';

/** Two versions reclassified a colony, differently: the later edit's class was kept. */
export interface Disagreement {
  colonyId: string;
  kept: ClassIndex;
  dropped: ClassIndex;
}

export type CorrectionsMerge =
  | { ok: true; edits: Edit[]; disagreements: Disagreement[] }
  | { ok: false; problem: 'different-analyses' | 'no-conflict' | 'unreadable'; message: string };

interface Effect {
  added: Map<string, ColonyRecord>;
  removed: Set<string>;
  reclassed: Map<string, ClassIndex>;
}

/** The net effect of an edit list applied in order. */
function effectOf(edits: readonly Edit[]): Effect {
  const e: Effect = { added: new Map(), removed: new Set(), reclassed: new Map() };
  for (const edit of edits) {
    if (edit.op === 'add') {
      e.added.set(edit.colony.id, edit.colony);
      e.removed.delete(edit.colony.id);
    } else if (edit.op === 'remove') {
      // A colony added and then removed on the same phone leaves no trace.
      if (!e.added.delete(edit.colonyId)) e.removed.add(edit.colonyId);
      e.reclassed.delete(edit.colonyId);
    } else {
      const added = e.added.get(edit.colonyId);
      if (added) e.added.set(edit.colonyId, { ...added, cls: edit.cls });
      else e.reclassed.set(edit.colonyId, edit.cls);
    }
  }
  return e;
}

/** Earlier first; ties broken by content, so every phone puts the same versions in one order. */
function byTime(a: Corrections, b: Corrections): number {
  if (a.updatedAt !== b.updatedAt) return a.updatedAt < b.updatedAt ? -1 : 1;
  if (a.revision !== b.revision) return a.revision - b.revision;
  const [x, y] = [JSON.stringify(a.edits), JSON.stringify(b.edits)];
  return x < y ? -1 : x > y ? 1 : 0;
}

const byId = <T>(m: Map<string, T>) =>
  [...m.entries()].sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0));

/** Merges the corrections of one analysis made on any number of phones (at least one). */
export function mergeCorrections(...versions: Corrections[]): CorrectionsMerge {
  const analyses = [...new Set(versions.map((v) => v.analysisId))];
  if (analyses.length > 1)
    return {
      ok: false,
      problem: 'different-analyses',
      message: `the corrections are of different analyses (${analyses.sort().join(', ')}): pick one`,
    };
  const effects = [...versions].sort(byTime).map((v) => effectOf(v.edits));
  const removed = new Set(effects.flatMap((e) => [...e.removed]));
  const added = new Map<string, ColonyRecord>();
  const reclassed = new Map<string, ClassIndex>();
  // Every class any version gave a colony: more than one is a clash, shown to the person.
  const classes = new Map<string, Set<ClassIndex>>();
  const saw = (id: string, cls: ClassIndex) =>
    classes.set(id, (classes.get(id) ?? new Set<ClassIndex>()).add(cls));
  for (const e of effects) {
    for (const [id, colony] of e.added)
      if (!removed.has(id)) {
        added.set(id, colony);
        saw(id, colony.cls);
      }
    for (const [id, cls] of e.reclassed)
      if (!removed.has(id)) {
        reclassed.set(id, cls);
        saw(id, cls);
      }
  }
  // The edits apply reclassifications after additions, so a reclassification is what stays.
  const disagreements: Disagreement[] = [...classes.entries()]
    .filter(([, seen]) => seen.size > 1)
    .map(([colonyId]) => {
      const kept = reclassed.get(colonyId) ?? added.get(colonyId)!.cls;
      return { colonyId, kept, dropped: (1 - kept) as ClassIndex };
    })
    .sort((x, y) => (x.colonyId < y.colonyId ? -1 : 1));
  const edits: Edit[] = [
    ...byId(added).map(([, colony]): Edit => ({ op: 'add', colony })),
    ...[...removed].sort().map((colonyId): Edit => ({ op: 'remove', colonyId })),
    ...byId(reclassed).map(([colonyId, cls]): Edit => ({ op: 'reclass', colonyId, cls })),
  ];
  return { ok: true, edits, disagreements };
}
