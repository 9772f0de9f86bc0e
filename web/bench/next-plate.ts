import type { Assay, Plate, Sample } from '../../schema/records.ts';
import type { ExperimentData } from './experiment-data.ts';

export interface PlatePlace {
  plate: Plate;
  sample: Sample;
  assay: Assay;
}

/** A plate still waiting for the person: no typed count, and no photo count marked checked. */
function waiting(p: Plate): boolean {
  return !p.typedCounts && !p.reviewed;
}

/** Every plate of the experiment in bench order: assays as listed, start before end, weakest dilution first. */
function benchOrder(data: ExperimentData): PlatePlace[] {
  return data.assays.flatMap((assay) =>
    data.samples
      .filter((s) => s.assayId === assay.id)
      .sort((a, b) => (a.timepoint === b.timepoint ? 0 : a.timepoint === 'start' ? -1 : 1))
      .flatMap((sample) =>
        data.plates
          .filter((p) => p.sampleId === sample.id)
          .sort((a, b) => a.dilutionFold - b.dilutionFold)
          .map((plate) => ({ plate, sample, assay })),
      ),
  );
}

/**
 * The plate the experiment needs next after `plateId`: the next waiting plate of the same assay,
 * then of the assays after it, then of those before it. Null when every other plate is done.
 */
export function nextPlateNeeded(data: ExperimentData, plateId: string): PlatePlace | null {
  const all = benchOrder(data);
  const at = all.findIndex((x) => x.plate.id === plateId);
  const after = [...all.slice(at + 1), ...all.slice(0, Math.max(at, 0))];
  return after.find((x) => x.plate.id !== plateId && waiting(x.plate)) ?? null;
}

/** "L2 · generation 500 · replicate 1", the assay part of a plate's place. */
export function assayPlace(a: Assay): string {
  return `${a.line} · generation ${a.generation} · replicate ${a.replicate}`;
}

/** "start plate · 1:100,000 · 100 µL", the plate part of its place. */
export function platePlace(sample: Sample, plate: Plate): string {
  return `${sample.timepoint} plate · 1:${plate.dilutionFold.toLocaleString('en')} · ${plate.volumeUl} µL`;
}
