import type { Analysis } from '../../fitness/analysis.ts';

/** The replicate groups with at least one assay resting on photo counts nobody checked. */
export function uncheckedGroups(analysis: Analysis, unchecked: ReadonlySet<string>): Set<string> {
  return new Set(analysis.assays.filter((a) => unchecked.has(a.assay)).map((a) => a.group));
}
