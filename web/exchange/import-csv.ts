import { readCompetitionCsv } from '../../fitness/competition-csv.ts';
import { FitnessError } from '../../fitness/errors.ts';
import type { Experiment, Plate } from '../../schema/records.ts';
import { type NewAssay, newAssay, newPlate } from '../bench/assays.ts';
import type { RecordBatch } from '../storage/record-store.ts';
import { revised } from '../storage/stamp.ts';
import { markerClasses } from './test-markers.ts';

/**
 * Turns a tidy competition CSV into new assays of `experiment`, every plate with its typed
 * counts. Problems come back as a list naming file and row; nothing is imported then.
 */
export function assaysFromCsv(
  text: string,
  fileName: string,
  experiment: Experiment,
): { batch: RecordBatch; assays: number; notes: string[] } {
  let table: ReturnType<typeof readCompetitionCsv>;
  try {
    table = readCompetitionCsv(text);
  } catch (e) {
    if (e instanceof FitnessError)
      throw new Error(
        e.message
          .split('\n')
          .map((m) => `${fileName}, ${m}`)
          .join('\n'),
      );
    throw e;
  }
  const markers = markerClasses(
    table.assays.flatMap((a) => (a.testMarker ? [a.testMarker] : [])),
    experiment,
    fileName,
  );
  const made: NewAssay[] = [];
  const extra: Plate[] = [];
  table.assays.forEach((a, i) => {
    const first = (k: 'start' | 'end') => a[k][0]!;
    const replicate = Number.parseInt(a.replicate, 10);
    const n = newAssay(experiment, {
      line: a.line,
      generation: a.generation,
      replicate: Number.isFinite(replicate) && replicate >= 0 ? replicate : i + 1,
      group: a.group,
      testClass: a.testMarker ? markers.classes.get(a.testMarker)! : 1,
      foldDilutionSinceStart: a.foldDilutionSinceStart,
      days: a.days,
      block: a.block ?? '',
      startDilutionFold: first('start').dilutionFold,
      endDilutionFold: first('end').dilutionFold,
      volumeUl: first('start').volumeMl * 1000,
    });
    n.plates[0].typedCounts = {
      test: first('start').testColonies,
      reference: first('start').referenceColonies,
    };
    n.plates[1] = { ...n.plates[1], volumeUl: first('end').volumeMl * 1000 };
    n.plates[1].typedCounts = {
      test: first('end').testColonies,
      reference: first('end').referenceColonies,
    };
    for (const [k, sample] of [
      ['start', n.samples[0]],
      ['end', n.samples[1]],
    ] as const) {
      for (const p of a[k].slice(1)) {
        extra.push({
          ...newPlate(sample, p.dilutionFold, p.volumeMl * 1000),
          typedCounts: { test: p.testColonies, reference: p.referenceColonies },
        });
      }
    }
    made.push(n);
  });
  const lines = [...new Set([...experiment.lines, ...made.map((m) => m.assay.line)])];
  return {
    batch: {
      experiments: lines.length > experiment.lines.length ? [revised(experiment, { lines })] : [],
      assays: made.map((m) => m.assay),
      samples: made.flatMap((m) => m.samples),
      plates: [...made.flatMap((m) => m.plates), ...extra],
    },
    assays: made.length,
    notes: markers.notes,
  };
}
