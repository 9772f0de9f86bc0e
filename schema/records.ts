/**
 * Every record Rivalplate keeps, as stored in IndexedDB, written to a backup file and (later)
 * exchanged with the lab's sync server. Each record carries a client-made id, a revision that
 * grows by one on every change, and the time of its last change, so two copies of a record can
 * be reconciled without a central counter.
 */

/** Which of the analysis core's two colour classes a colony belongs to. */
export type ClassIndex = 0 | 1;

export interface Stamp {
  /** Made on the device that created the record (crypto.randomUUID). */
  id: string;
  /** 1 when created, +1 on every change. */
  revision: number;
  /** ISO 8601 time of the last change. */
  updatedAt: string;
  /** The record's format (record-format.ts); absent on records from before formats. */
  format?: number;
}

export interface PaletteColourRecord {
  name: string;
  hex: string;
  /** Colony colour minus local agar colour, CIE L*a*b*. */
  deltaLab: [number, number, number];
  spread: number;
}

export interface PaletteRecord {
  version: 1;
  colours: [PaletteColourRecord, PaletteColourRecord];
  /** Taught by tapping one colony of each colour, or learned from analysed plates. */
  source: 'taught' | 'learned';
}

/** One of the experiment's two marker colours as the lab names it, and how it usually looks. */
export interface MarkerColour {
  name: string;
  hex: string;
}

/** The names an experiment made before colours were named carries. */
export const UNNAMED_MARKERS: [MarkerColour, MarkerColour] = [
  { name: 'colour 1', hex: '#3f6fb0' },
  { name: 'colour 2', hex: '#efe6cf' },
];

export interface Experiment extends Stamp {
  name: string;
  /** Bundled example data, shown with a banner and never mixed into a lab's own exports. */
  demo: boolean;
  /** The evolved lines under test, e.g. ["L1", "L2"]. */
  lines: string[];
  referenceName: string;
  /** Fold dilution at each daily transfer of the evolution (e.g. 100). */
  transferDilution: number;
  /** Prefills for a new plate. */
  defaultDilutionFold: number;
  defaultVolumeUl: number;
  /**
   * The lab's names for colour class 0 and 1, used on every screen and in every export; the
   * hexes draw them until the palette is learned and put a learned palette in this order.
   */
  markerColours: [MarkerColour, MarkerColour];
  palette: PaletteRecord | null;
  learning: LearningRecord;
}

/**
 * What the experiment learned from its checked plates. The model is kept as the text of a model
 * file, byte for byte what `rivalplate learn` writes (a couple of kilobytes), so it travels in the
 * backup and with sync as it is, and the same file can be used with `rivalplate count --model`.
 * Its contents are checked where it is used (the analysis core's model-file reader), so a
 * damaged one is reported and the plate read with the default analysis.
 */
export interface LearningRecord {
  /** Each checked plate refits the model, and later plates are read with it. */
  enabled: boolean;
  /** The model file's text; null before a checked plate taught one, or after a reset. */
  model: string | null;
  /** The last reset (ISO 8601): readings from before it no longer teach. Null: never reset. */
  since: string | null;
}

/** Learning as an experiment from before learning starts: on, nothing learned yet. */
export const LEARNING_UNSET: LearningRecord = { enabled: true, model: null, since: null };

/** One competition culture: a test line against the marked reference. */
export interface Assay extends Stamp {
  experimentId: string;
  line: string;
  generation: number;
  replicate: number;
  group: string;
  /** The colour class of the test strain; the other class is the reference. */
  testClass: ClassIndex;
  /** Total fold dilution between the start and end samples (1 = same flask, no transfer). */
  foldDilutionSinceStart: number;
  days: number;
  /**
   * The day or batch the assay was run in, so the blocked analysis can take it into account
   * (fitness/blocks.ts); null when the lab did not record one. Added in record format 3.
   */
  block: string | null;
}

export type Timepoint = 'start' | 'end';

export interface Sample extends Stamp {
  experimentId: string;
  assayId: string;
  timepoint: Timepoint;
}

export interface TypedCounts {
  test: number;
  reference: number;
}

export interface Plate extends Stamp {
  experimentId: string;
  assayId: string;
  sampleId: string;
  dilutionFold: number;
  volumeUl: number;
  /** The photo in the photo store, or null for a plate counted by eye and typed in. */
  photoId: string | null;
  typedCounts: TypedCounts | null;
  /** The person has looked over the automatic count (it then enters the accuracy figure). */
  reviewed: boolean;
}

/** Binary data as a Blob has it; named here by shape because this realm has no DOM types. */
export interface BinaryData {
  readonly size: number;
  readonly type: string;
  arrayBuffer(): Promise<ArrayBuffer>;
}

/**
 * The original photo, kept whole for re-analysis, and a screen-sized preview made from it by the
 * analysis (null until the photo has been analysed once).
 */
export interface Photo extends Stamp {
  plateId: string;
  name: string;
  blob: BinaryData;
  preview: BinaryData | null;
  /** Upright size of the original in pixels; null until the photo has been read once. */
  width: number | null;
  height: number | null;
}

export interface ColonyRecord {
  id: string;
  /** Original upright photo pixels. */
  x: number;
  y: number;
  r: number;
  cls: ClassIndex;
  confidence: number;
  /** Colonies this detection stands for (more than 1 for an unsplit clump). */
  count: number;
  /** Area in original pixels². */
  area: number;
  /** Came out of splitting a touching group. */
  split: boolean;
  /** Colony colour and its difference from the nearby agar, CIE L*a*b*; null when added by hand. */
  lab: [number, number, number] | null;
  deltaLab: [number, number, number] | null;
  /** Seen through lid glare: its colour is mixed with the reflection and teaches no palette. */
  glareLit?: boolean;
}

export interface DishRecord {
  cx: number;
  cy: number;
  rx: number;
  ry: number;
  angleDeg: number;
}

export interface ClassRecord {
  cls: ClassIndex;
  name: string;
  hex: string;
  deltaLab: [number, number, number];
}

/** An image-quality remark of the analysis: its kind and the numbers that go with it. */
/**
 * A remark of the plate analysis, stored as its code and numbers and worded at the screen (so a
 * lab's records do not carry one version's English). `detail` holds the sentence older versions
 * stored instead, and is null in records written now.
 */
export interface FlagRecord {
  kind: string;
  values: Record<string, number | string>;
  detail: string | null;
}

/** What the automatic analysis found on a photo, before any correction. */
export interface Analysis extends Stamp {
  plateId: string;
  photoId: string;
  /** Upright size of the photo analysed; all coordinates are in its pixels. */
  width: number;
  height: number;
  agarLab: [number, number, number];
  dish: DishRecord | null;
  colonies: ColonyRecord[];
  classes: [ClassRecord, ClassRecord];
  flags: FlagRecord[];
  /** Classified against the experiment's palette rather than this plate alone. */
  paletteUsed: boolean;
  ms: number;
  /** Checked plates the experiment's model had learned from when it read this plate; null: the default analysis. */
  learnedFrom: number | null;
  /**
   * Every object the analysis considered, kept or not, with what it measured: a checked plate
   * teaches the model from these and its final colonies, without the photo. Null on readings
   * from before learning.
   */
  candidates: CandidateRecord[] | null;
}

/**
 * One object the analysis considered (the analysis core's candidate features), in original photo
 * pixels; colour relative to the local agar in CIE L*a*b*, sizes in mm.
 */
export interface CandidateRecord {
  x: number;
  y: number;
  r: number;
  dL: number;
  da: number;
  db: number;
  dE: number;
  radiusMm: number;
  elongation: number;
  ridgeVariation: number;
  wallMm: number;
  /** The default rules kept it as a colony. */
  colony: boolean;
  /** Objects the default rules kept on the plate. */
  plateColonies: number;
}

export type Edit =
  | { op: 'add'; colony: ColonyRecord }
  | { op: 'remove'; colonyId: string }
  | { op: 'reclass'; colonyId: string; cls: ClassIndex };

/** What the person changed on top of one analysis, in order, with the undone steps for redo. */
export interface Corrections extends Stamp {
  plateId: string;
  analysisId: string;
  edits: Edit[];
  undone: Edit[];
}

export interface RecordsByKind {
  experiments: Experiment;
  assays: Assay;
  samples: Sample;
  plates: Plate;
  photos: Photo;
  analyses: Analysis;
  corrections: Corrections;
}

export type RecordKind = keyof RecordsByKind;
