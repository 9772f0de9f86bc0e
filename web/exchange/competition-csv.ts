import type { AnalysedAssay, Analysis } from '../../fitness/analysis.ts';
import type { AssayInput } from '../../fitness/competition.ts';
import { REQUIRED_COLUMNS } from '../../fitness/competition-csv.ts';
import { toCsv } from '../../fitness/csv-write.ts';

/** The fitness engine's tidy CSV (README "Fitness from a CSV"): one row per counted plate. */
const PLATE_COLUMNS = [...REQUIRED_COLUMNS, 'days', 'test_marker', 'block'] as const;

export function platesCsv(inputs: readonly AssayInput[]): string {
  const rows = inputs.flatMap((a) =>
    (['start', 'end'] as const).flatMap((sample) =>
      a[sample].map((p) => [
        a.assay,
        a.group,
        a.line,
        a.generation,
        a.replicate,
        sample,
        p.dilutionFold,
        // Volumes are kept in µL in the file, as pipettes are set.
        Math.round(p.volumeMl * 1000 * 1e6) / 1e6,
        p.testColonies,
        p.referenceColonies,
        sample === 'end' ? a.foldDilutionSinceStart : null,
        a.days,
        a.testMarker ?? null,
        a.block ?? null,
      ]),
    ),
  );
  return toCsv(PLATE_COLUMNS, rows);
}

const RESULT_COLUMNS = [
  'assay',
  'group',
  'line',
  'generation',
  'replicate',
  'W',
  'W_ci_low',
  'W_ci_high',
  'r',
  'r_per_day',
  'm_test',
  'm_ref',
  'flags',
] as const;

/** One row per computed assay, unrounded (rounding is for display only). */
export function resultsCsv(analysis: Analysis): string {
  const row = (a: AnalysedAssay) => [
    a.assay,
    a.group,
    a.line,
    a.generation,
    a.replicate,
    a.W,
    a.W_ci?.[0] ?? null,
    a.W_ci?.[1] ?? null,
    a.r,
    a.rPerDay,
    a.mTest,
    a.mRef,
    a.flags.map((f) => f.code).join(' '),
  ];
  return toCsv(RESULT_COLUMNS, analysis.assays.map(row));
}
