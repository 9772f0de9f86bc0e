import { poissonDraw, seededUniform } from '../../fitness/poisson.ts';
import type { Plate } from '../../schema/records.ts';
import { type NewAssay, newAssay } from '../bench/assays.ts';
import { newExperiment } from '../bench/experiments.ts';
import type { RecordBatch } from '../storage/record-store.ts';

/**
 * The demo: the invented "Marrowfield pond project". Six lines (L1–L6) evolved from one pond
 * isolate, each competed against the marked ancestor (blue colonies on pale cream agar; the
 * evolved lines grow cream-white) at three generations, two replicates each. Counts are drawn
 * from a seeded Poisson model of an invented fitness gain per line, so the demo is the same on
 * every device and every number in it is visibly demo data.
 */
const DEMO_NAME = 'Marrowfield pond project (demo)';

const LINES = ['L1', 'L2', 'L3', 'L4', 'L5', 'L6'];
const GENERATIONS = [500, 1000, 2000];
/** Invented asymptotic fitness gain per line, W = 1 + a·t/(t + 800). */
const GAIN = [0.32, 0.25, 0.4, 0.18, 0.29, 0.36];
const DILUTION = 100_000;
const TRANSFER = 100;
const END_VOLUME_UL = 50;

export interface DemoSeed {
  batch: RecordBatch;
  /** The bundled photos matched to the plates they show; their plates carry no typed counts. */
  photoPlates: { name: string; plate: Plate }[];
}

/** Generation at which the bundled photos were taken, replicate 1. */
const PHOTO_GENERATION = 2000;

/**
 * "marrowfield-L2-day0.jpg" shows line L2's start plate (day 0), "…-day1-….jpg" its end plate.
 * Names that do not follow the pattern are left out.
 */
function plateForPhoto(name: string, assays: readonly NewAssay[]): Plate | null {
  const m = /-(L\d+)-day([01])\b/.exec(name);
  if (!m) return null;
  const a = assays.find(
    (x) =>
      x.assay.line === m[1] && x.assay.generation === PHOTO_GENERATION && x.assay.replicate === 1,
  );
  return a ? a.plates[m[2] === '0' ? 0 : 1] : null;
}

export function demoSeed(photoNames: readonly string[]): DemoSeed {
  const experiment = newExperiment(
    {
      name: DEMO_NAME,
      lines: LINES,
      referenceName: 'marked ancestor (blue)',
      transferDilution: TRANSFER,
      defaultDilutionFold: DILUTION,
      defaultVolumeUl: 100,
      markerColours: [
        { name: 'blue', hex: '#3f6fb0' },
        { name: 'white', hex: '#efe6cf' },
      ],
    },
    true,
  );
  const uniform = seededUniform(20240611);
  const assays: NewAssay[] = [];
  LINES.forEach((line, li) => {
    for (const generation of GENERATIONS) {
      for (const replicate of [1, 2]) {
        const a = newAssay(experiment, {
          line,
          generation,
          replicate,
          group: `${line} g${generation}`,
          testClass: 1,
          foldDilutionSinceStart: TRANSFER,
          days: 1,
          // The invented lab ran replicate 1 of every line on one day and replicate 2 on the next.
          block: `day ${replicate}`,
          startDilutionFold: DILUTION,
          endDilutionFold: DILUTION,
          volumeUl: 100,
        });
        // Reference grows 100-fold a day and is diluted 100-fold: its density comes back; the
        // test line grows 100^W-fold, so its end density is the start density × 100^(W − 1).
        // The end plates take half the volume, as a lab would to keep the fitter line's plate
        // countable.
        const W = 1 + (GAIN[li]! * generation) / (generation + 800);
        a.plates[0].typedCounts = {
          test: poissonDraw(105, uniform),
          reference: poissonDraw(100, uniform),
        };
        a.plates[1].volumeUl = END_VOLUME_UL;
        a.plates[1].typedCounts = {
          test: poissonDraw(52.5 * TRANSFER ** (W - 1), uniform),
          reference: poissonDraw(50, uniform),
        };
        assays.push(a);
      }
    }
  });
  // A bundled photo takes the place of its plate's typed counts.
  const photoPlates = photoNames.flatMap((name) => {
    const plate = plateForPhoto(name, assays);
    return plate ? [{ name, plate }] : [];
  });
  for (const { plate } of photoPlates) plate.typedCounts = null;
  return {
    batch: {
      experiments: [experiment],
      assays: assays.map((a) => a.assay),
      samples: assays.flatMap((a) => a.samples),
      plates: assays.flatMap((a) => a.plates),
    },
    photoPlates,
  };
}
