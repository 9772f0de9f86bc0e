import type { ClassIndex, Experiment } from '../../schema/records.ts';
import { classLooks } from '../bench/colours.ts';

/**
 * Which colour class the evolved line is, from a CSV's `test_marker` values (the marker the test
 * strain carried: in a reciprocal design, one half of the assays with each). A marker named like
 * one of the experiment's colours takes that colour; the others take the remaining colours in
 * the order they first appear, the first the default colour of a new assay (colour 2). The
 * sentences say how each unmatched marker was taken, for the person to check.
 */
export function markerClasses(
  markers: readonly string[],
  experiment: Experiment,
  fileName: string,
): { classes: Map<string, ClassIndex>; notes: string[] } {
  const distinct = [...new Set(markers)];
  if (distinct.length > 2)
    throw new Error(
      `${fileName}: test_marker has ${distinct.length} different values (${distinct.join(', ')}); the plates have two colours`,
    );
  const looks = classLooks(experiment);
  const classes = new Map<string, ClassIndex>();
  for (const m of distinct) {
    const i = looks.findIndex((l) => l.name.toLowerCase() === m.toLowerCase());
    if (i >= 0) classes.set(m, i as ClassIndex);
  }
  const free = ([1, 0] as const).filter((c) => ![...classes.values()].includes(c));
  const notes: string[] = [];
  for (const m of distinct.filter((x) => !classes.has(x))) {
    const cls = free.shift()!;
    classes.set(m, cls);
    notes.push(`test_marker "${m}" was taken as ${looks[cls].name}.`);
  }
  return { classes, notes };
}
