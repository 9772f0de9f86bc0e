import type { AssayInput } from '../../fitness/competition.ts';
import type { Assay } from '../../schema/records.ts';
import { classLooks } from '../bench/colours.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { plateCount } from '../bench/plate-counts.ts';
import { storedFlagSentence } from '../words/flag-words.ts';

function assayLabel(a: Assay): string {
  return `${a.line} g${a.generation} r${a.replicate}`;
}

export interface FitnessInputs {
  inputs: AssayInput[];
  /** Assays left out because a plate has no count yet, with the reason and that plate. */
  waiting: { assay: string; reason: string; plateId: string | null }[];
  /** Assays whose counts include a photo count nobody has marked checked. */
  unchecked: Set<string>;
  /** Of those, the ones left out because only checked counts were asked for. */
  hidden: string[];
  /** Image-quality flags of the photographed plates that feed each assay, by assay label. */
  imageFlags: Map<string, { plate: string; kind: string; detail: string }[]>;
}

/**
 * The fitness engine's input for every assay whose start and end samples each have at least one
 * counted plate. Plates without a count are skipped with the reason, never counted as zero. An
 * assay resting on a photo count nobody checked is marked, and left out with `checkedOnly`.
 */
export function fitnessInputs(data: ExperimentData, checkedOnly = false): FitnessInputs {
  const inputs: AssayInput[] = [];
  const waiting: FitnessInputs['waiting'] = [];
  const unchecked = new Set<string>();
  const hidden: string[] = [];
  const imageFlags: FitnessInputs['imageFlags'] = new Map();
  const seen = new Map<string, number>();
  const looks = classLooks(data.experiment);
  for (const assay of data.assays) {
    // Two assays of one line, generation and replicate (e.g. both markers of a reciprocal
    // design) get "#2", "#3" so every assay keeps its own row in the results.
    const base = assayLabel(assay);
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    const label = n === 1 ? base : `${base} #${n}`;
    let firstUncounted: string | null = null;
    let uncheckedPhoto = false;
    const platesOf = (timepoint: 'start' | 'end') => {
      const sampleIds = new Set(
        data.samples
          .filter((s) => s.assayId === assay.id && s.timepoint === timepoint)
          .map((s) => s.id),
      );
      return data.plates
        .filter((p) => sampleIds.has(p.sampleId))
        .sort((a, b) => a.dilutionFold - b.dilutionFold)
        .flatMap((p, i) => {
          const analysis = data.analyses.get(p.id);
          const c = plateCount(p, assay, analysis, data.corrections.get(p.id));
          if (!c) {
            firstUncounted ??= p.id;
            return [];
          }
          if (c.source === 'photo' && !p.reviewed) uncheckedPhoto = true;
          const plateLabel = `${label} ${timepoint} plate ${i + 1} (1:${p.dilutionFold})`;
          if (c.source === 'photo' && analysis?.flags.length) {
            const list = imageFlags.get(label) ?? [];
            list.push(
              ...analysis.flags.map((f) => ({
                plate: plateLabel,
                kind: f.kind,
                detail: storedFlagSentence(f),
              })),
            );
            imageFlags.set(label, list);
          }
          return [
            {
              label: plateLabel,
              dilutionFold: p.dilutionFold,
              volumeMl: p.volumeUl / 1000,
              testColonies: c.test,
              referenceColonies: c.reference,
            },
          ];
        });
    };
    const start = platesOf('start');
    const end = platesOf('end');
    if (start.length === 0 || end.length === 0) {
      waiting.push({
        assay: label,
        reason: `no counted ${start.length === 0 ? 'start' : 'end'} plate yet`,
        plateId: firstUncounted,
      });
      continue;
    }
    if (uncheckedPhoto) {
      unchecked.add(label);
      if (checkedOnly) {
        hidden.push(label);
        continue;
      }
    }
    inputs.push({
      assay: label,
      group: assay.group,
      line: assay.line,
      generation: assay.generation,
      replicate: String(assay.replicate),
      days: assay.days,
      foldDilutionSinceStart: assay.foldDilutionSinceStart,
      // The colour the evolved line carried: with both colours among a line's assays (a
      // reciprocal design), the engine averages the two halves.
      testMarker: looks[assay.testClass].name,
      ...(assay.block ? { block: assay.block } : {}),
      start,
      end,
    });
  }
  return { inputs, waiting, unchecked, hidden, imageFlags };
}
