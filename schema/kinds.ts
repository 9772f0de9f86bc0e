/**
 * The table of record kinds: how each is checked, and whether it goes into a backup file and to
 * the sync server. Photos are exported (a backup without them could not be re-analysed) but not
 * synced as records: the server will take them as separate uploads.
 */
import {
  blob,
  bool,
  type Check,
  codeValues,
  count,
  idText,
  isoTime,
  list,
  nameText,
  nullable,
  num,
  object,
  oneOf,
  pair,
  positive,
  SchemaError,
  str,
  TEXT_BYTES,
  textOf,
  triple,
} from './check.ts';
import { RECORD_FORMAT } from './record-format.ts';
import type {
  Analysis,
  Assay,
  BinaryData,
  CandidateRecord,
  ColonyRecord,
  Corrections,
  Edit,
  Experiment,
  Photo,
  Plate,
  RecordKind,
  RecordsByKind,
  Sample,
  Stamp,
} from './records.ts';
import { UNNAMED_MARKERS } from './records.ts';

const stamp = {
  id: idText,
  revision: (v: unknown, f: string) => {
    const n = count(v, f);
    if (n < 1) throw new SchemaError(f, `must be 1 or more, got ${n}`);
    return n;
  },
  updatedAt: isoTime,
  // Absent on records written before formats (and sent so by older phones); never another value.
  format: (v: unknown, f: string) => {
    if (v === undefined) return undefined;
    if (v !== RECORD_FORMAT)
      throw new SchemaError(f, `expected record format ${RECORD_FORMAT}, got ${String(v)}`);
    return v;
  },
} satisfies { [K in keyof Stamp]-?: Check<Stamp[K]> };

const classIndex = oneOf(0, 1);

const colony = object<ColonyRecord>({
  id: idText,
  x: num,
  y: num,
  r: positive,
  cls: classIndex,
  confidence: num,
  count: (v, f) => {
    const n = count(v, f);
    if (n < 1) throw new SchemaError(f, `must be 1 or more, got ${n}`);
    return n;
  },
  area: num,
  split: bool,
  lab: nullable(triple),
  deltaLab: nullable(triple),
  // Absent on records from before it was kept: those colonies were not read through glare.
  glareLit: (v, f) => (v === undefined ? undefined : bool(v, f)),
});

const edit: Check<Edit> = (v, f) => {
  const op = oneOf('add', 'remove', 'reclass')((v as { op?: unknown } | null)?.op, `${f}.op`);
  if (op === 'add') return object<Edit & { op: 'add' }>({ op: oneOf('add'), colony })(v, f);
  if (op === 'remove')
    return object<Edit & { op: 'remove' }>({ op: oneOf('remove'), colonyId: idText })(v, f);
  return object<Edit & { op: 'reclass' }>({
    op: oneOf('reclass'),
    colonyId: idText,
    cls: classIndex,
  })(v, f);
};

const experiment = object<Experiment>({
  ...stamp,
  name: nameText,
  demo: bool,
  lines: list(nameText),
  referenceName: nameText,
  transferDilution: positive,
  defaultDilutionFold: positive,
  defaultVolumeUl: positive,
  // Records made before the colours were named read back with neutral names.
  markerColours: (v, f) =>
    v === undefined
      ? [{ ...UNNAMED_MARKERS[0] }, { ...UNNAMED_MARKERS[1] }]
      : pair(object({ name: nameText, hex: str }))(v, f),
  palette: nullable(
    object({
      version: oneOf(1),
      colours: pair(object({ name: nameText, hex: nameText, deltaLab: triple, spread: num })),
      source: oneOf('taught', 'learned'),
    }),
  ),
  // The model's text is bounded here; what it says is checked where it is used (records.ts).
  learning: object({ enabled: bool, model: nullable(str), since: nullable(isoTime) }),
});

const candidate = object<CandidateRecord>({
  x: num,
  y: num,
  r: num,
  dL: num,
  da: num,
  db: num,
  dE: num,
  radiusMm: num,
  elongation: num,
  ridgeVariation: num,
  wallMm: num,
  colony: bool,
  plateColonies: count,
});

const assay = object<Assay>({
  ...stamp,
  experimentId: idText,
  line: nameText,
  generation: num,
  replicate: count,
  group: textOf(TEXT_BYTES.name),
  testClass: classIndex,
  foldDilutionSinceStart: positive,
  days: positive,
  block: nullable(nameText),
});

const sample = object<Sample>({
  ...stamp,
  experimentId: idText,
  assayId: idText,
  timepoint: oneOf('start', 'end'),
});

const plate = object<Plate>({
  ...stamp,
  experimentId: idText,
  assayId: idText,
  sampleId: idText,
  dilutionFold: positive,
  volumeUl: positive,
  photoId: nullable(idText),
  typedCounts: nullable(object({ test: count, reference: count })),
  reviewed: bool,
});

const photo = object<Photo>({
  ...stamp,
  plateId: idText,
  name: textOf(TEXT_BYTES.name),
  blob: blob<BinaryData>,
  preview: nullable(blob<BinaryData>),
  width: nullable(positive),
  height: nullable(positive),
});

const analysis = object<Analysis>({
  ...stamp,
  plateId: idText,
  photoId: idText,
  width: positive,
  height: positive,
  agarLab: triple,
  dish: nullable(object({ cx: num, cy: num, rx: positive, ry: positive, angleDeg: num })),
  colonies: list(colony),
  classes: pair(object({ cls: classIndex, name: nameText, hex: nameText, deltaLab: triple })),
  flags: list(object({ kind: nameText, values: codeValues, detail: nullable(str) })),
  paletteUsed: bool,
  ms: num,
  learnedFrom: nullable(count),
  candidates: nullable(list(candidate)),
});

const corrections = object<Corrections>({
  ...stamp,
  plateId: idText,
  analysisId: idText,
  edits: list(edit),
  undone: list(edit),
});

export interface KindInfo<T> {
  check: Check<T>;
  /** Written into a backup file. */
  exported: boolean;
  /** Sent to the lab's sync server as a record. */
  synced: boolean;
  /** Field holding the parent record's id, used for look-ups by parent. */
  parent: keyof T | null;
}

export const KINDS: { [K in RecordKind]: KindInfo<RecordsByKind[K]> } = {
  experiments: { check: experiment, exported: true, synced: true, parent: null },
  assays: { check: assay, exported: true, synced: true, parent: 'experimentId' },
  samples: { check: sample, exported: true, synced: true, parent: 'assayId' },
  plates: { check: plate, exported: true, synced: true, parent: 'experimentId' },
  photos: { check: photo, exported: true, synced: false, parent: 'plateId' },
  analyses: { check: analysis, exported: true, synced: true, parent: 'plateId' },
  corrections: { check: corrections, exported: true, synced: true, parent: 'plateId' },
};

export const RECORD_KINDS = Object.keys(KINDS) as RecordKind[];
