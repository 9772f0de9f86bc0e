import type { Assay, Experiment, Plate, Sample, Timepoint } from '../../schema/records.ts';
import { newStamp } from '../storage/stamp.ts';

/** What the assay form edits: the assay's own fields, and the dilutions of its two plates. */
export type AssayDraft = Pick<
  Assay,
  'line' | 'generation' | 'replicate' | 'group' | 'testClass' | 'foldDilutionSinceStart' | 'days'
> & {
  /** The day or batch the assay is run in; blank when the lab does not record one. */
  block: string;
  startDilutionFold: number;
  endDilutionFold: number;
  volumeUl: number;
};

export interface NewAssay {
  assay: Assay;
  samples: [Sample, Sample];
  plates: [Plate, Plate];
}

/** An assay with its start and end samples, one plate each, ready to photograph. */
export function newAssay(experiment: Experiment, draft: AssayDraft): NewAssay {
  const assay: Assay = {
    ...newStamp(),
    experimentId: experiment.id,
    line: draft.line,
    generation: draft.generation,
    replicate: draft.replicate,
    group: groupOf(draft),
    testClass: draft.testClass,
    foldDilutionSinceStart: draft.foldDilutionSinceStart,
    days: draft.days,
    block: draft.block.trim() || null,
  };
  const sample = (timepoint: Timepoint): Sample => ({
    ...newStamp(),
    experimentId: experiment.id,
    assayId: assay.id,
    timepoint,
  });
  const start = sample('start');
  const end = sample('end');
  return {
    assay,
    samples: [start, end],
    plates: [
      newPlate(start, draft.startDilutionFold, draft.volumeUl),
      newPlate(end, draft.endDilutionFold, draft.volumeUl),
    ],
  };
}

export function newPlate(sample: Sample, dilutionFold: number, volumeUl: number): Plate {
  return {
    ...newStamp(),
    experimentId: sample.experimentId,
    assayId: sample.assayId,
    sampleId: sample.id,
    dilutionFold,
    volumeUl,
    photoId: null,
    typedCounts: null,
    reviewed: false,
  };
}

/** A group holds the replicates of one line at one generation unless the person names another. */
export function defaultGroup(line: string, generation: number): string {
  return `${line} g${generation}`;
}

function groupOf(d: Pick<AssayDraft, 'group' | 'line' | 'generation'>): string {
  return d.group.trim() || defaultGroup(d.line, d.generation);
}

/** The next replicate number of the draft's group: numbers restart at 1 in every group. */
export function nextReplicate(
  assays: readonly Assay[],
  d: Pick<AssayDraft, 'group' | 'line' | 'generation'>,
): number {
  const group = groupOf(d);
  const own = assays.filter((a) => a.group === group);
  return own.length ? Math.max(...own.map((a) => a.replicate)) + 1 : 1;
}

/**
 * Why the draft cannot join its group, or null: replicates summarised together must be of one
 * generation, or the group's mean would mix two points of the trajectory.
 */
export function groupProblem(assays: readonly Assay[], d: AssayDraft): string | null {
  const group = groupOf(d);
  const other = assays.find((a) => a.group === group && a.generation !== d.generation);
  return other
    ? `Group "${group}" holds generation ${other.generation}; a group is one generation. Give this assay another group.`
    : null;
}

/**
 * The form's prefill for the next assay: the next replicate of the last assay's group with the
 * same settings, so a run of replicates is one tap each. The first assay takes the experiment's
 * defaults; the end sample starts one transfer dilution further than the start.
 */
export function nextAssayDraft(
  experiment: Experiment,
  assays: readonly Assay[],
  plates: readonly Plate[],
  samples: readonly Sample[],
): AssayDraft {
  const last = [...assays].sort((a, b) => a.updatedAt.localeCompare(b.updatedAt)).at(-1);
  const line = last?.line ?? experiment.lines[0] ?? 'L1';
  const generation = last?.generation ?? 0;
  // A group the person named carries over; the default one follows the line and generation.
  const group = last && last.group !== defaultGroup(last.line, last.generation) ? last.group : '';
  const firstPlate = (timepoint: Timepoint) => {
    const s = samples.find((x) => x.assayId === last?.id && x.timepoint === timepoint);
    return plates.find((p) => p.sampleId === s?.id);
  };
  return {
    line,
    generation,
    replicate: nextReplicate(assays, { group, line, generation }),
    group,
    testClass: last?.testClass ?? 1,
    foldDilutionSinceStart: last?.foldDilutionSinceStart ?? experiment.transferDilution,
    days: last?.days ?? 1,
    // Replicates are usually run on one day: the last assay's block carries over.
    block: last?.block ?? '',
    startDilutionFold: firstPlate('start')?.dilutionFold ?? experiment.defaultDilutionFold,
    endDilutionFold:
      firstPlate('end')?.dilutionFold ??
      experiment.defaultDilutionFold * experiment.transferDilution,
    volumeUl: firstPlate('start')?.volumeUl ?? experiment.defaultVolumeUl,
  };
}

/** Another plate of the same sample: one ten-fold step further than the sample's last plate. */
export function nextPlateOf(
  sample: Sample,
  plates: readonly Plate[],
  experiment: Experiment,
): Plate {
  const own = plates.filter((p) => p.sampleId === sample.id);
  const last = own.reduce<Plate | undefined>(
    (m, p) => (!m || p.dilutionFold > m.dilutionFold ? p : m),
    undefined,
  );
  return newPlate(
    sample,
    last ? last.dilutionFold * 10 : experiment.defaultDilutionFold,
    last?.volumeUl ?? experiment.defaultVolumeUl,
  );
}
