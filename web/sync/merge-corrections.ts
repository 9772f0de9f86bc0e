/**
 * Merging two people's taps on the same plate: when two phones corrected one analysis offline,
 * both sets of corrections are kept. Each side's edit list is reduced to its net effect (colonies
 * added, removed, reclassified); the effects are joined; the result is written back as edits in a
 * fixed order. The merge is commutative and idempotent, so phones that merge the same conflict
 * get the same answer.
 */
import type { ClassIndex, ColonyRecord, Corrections, Edit } from '../../schema/records.ts';

/** Both sides reclassified a colony, differently: the later edit's class was kept. */
export interface Disagreement {
  colonyId: string;
  kept: ClassIndex;
  dropped: ClassIndex;
}

export type CorrectionsMerge =
  | { ok: true; edits: Edit[]; disagreements: Disagreement[] }
  | { ok: false; problem: 'different-analyses'; message: string };

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

/** True when `a` is the later of the two; ties broken by content, the same from either side. */
function isLater(a: Corrections, b: Corrections): boolean {
  if (a.updatedAt !== b.updatedAt) return a.updatedAt > b.updatedAt;
  if (a.revision !== b.revision) return a.revision > b.revision;
  return JSON.stringify(a.edits) > JSON.stringify(b.edits);
}

const byId = <T>(m: Map<string, T>) =>
  [...m.entries()].sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0));

export function mergeCorrections(a: Corrections, b: Corrections): CorrectionsMerge {
  if (a.analysisId !== b.analysisId)
    return {
      ok: false,
      problem: 'different-analyses',
      message: `the two corrections are of different analyses (${a.analysisId}, ${b.analysisId}): pick one`,
    };
  const [later, earlier] = isLater(a, b)
    ? [effectOf(a.edits), effectOf(b.edits)]
    : [effectOf(b.edits), effectOf(a.edits)];
  const removed = new Set([...later.removed, ...earlier.removed]);
  const added = new Map<string, ColonyRecord>();
  const disagreements: Disagreement[] = [];
  for (const side of [earlier, later])
    for (const [id, colony] of side.added) if (!removed.has(id)) added.set(id, colony);
  // Both phones hold the same added colony (one saw the other's add) in different classes.
  for (const [id, colony] of later.added) {
    const other = earlier.added.get(id);
    if (!removed.has(id) && other && other.cls !== colony.cls)
      disagreements.push({ colonyId: id, kept: colony.cls, dropped: other.cls });
  }
  const reclassed = new Map<string, ClassIndex>();
  for (const [id, cls] of earlier.reclassed) if (!removed.has(id)) reclassed.set(id, cls);
  for (const [id, cls] of later.reclassed) {
    if (removed.has(id)) continue;
    const other = reclassed.get(id);
    if (other !== undefined && other !== cls)
      disagreements.push({ colonyId: id, kept: cls, dropped: other });
    reclassed.set(id, cls);
  }
  const edits: Edit[] = [
    ...byId(added).map(([, colony]): Edit => ({ op: 'add', colony })),
    ...[...removed].sort().map((colonyId): Edit => ({ op: 'remove', colonyId })),
    ...byId(reclassed).map(([colonyId, cls]): Edit => ({ op: 'reclass', colonyId, cls })),
  ];
  disagreements.sort((x, y) => (x.colonyId < y.colonyId ? -1 : 1));
  return { ok: true, edits, disagreements };
}
