/**
 * Records of the Marrowfield pond project (an invented study: evolved lines L1–L6 of a pond
 * isolate competed against a marked ancestor), made deterministically for the sync tests.
 */

import { RECORD_FORMAT } from '../../schema/record-format.ts';
import type {
  Analysis,
  Assay,
  ColonyRecord,
  Corrections,
  Experiment,
  Plate,
  RecordKind,
  RecordsByKind,
  Sample,
} from '../../schema/records.ts';
import type { Change } from '../../schema/sync-protocol.ts';

const T0 = Date.parse('2026-03-02T09:00:00.000Z');
/** A time `minutes` after the project's first bench session. */
export const at = (minutes: number): string => new Date(T0 + minutes * 60_000).toISOString();

export function experiment(id = 'mf-exp'): Experiment {
  return {
    id,
    revision: 1,
    updatedAt: at(0),
    format: RECORD_FORMAT,
    name: 'Marrowfield pond: lines L1–L6 against the marked ancestor',
    demo: true,
    lines: ['L1', 'L2', 'L3', 'L4', 'L5', 'L6'],
    referenceName: 'MF-anc (white)',
    transferDilution: 100,
    defaultDilutionFold: 1e5,
    defaultVolumeUl: 100,
    markerColours: [
      { name: 'blue', hex: '#3f6fb0' },
      { name: 'white', hex: '#efe6cf' },
    ],
    palette: null,
    learning: { enabled: true, model: null, since: null },
  };
}

export function assay(id: string, line = 'L1', replicate = 1): Assay {
  return {
    id,
    revision: 1,
    updatedAt: at(1),
    format: RECORD_FORMAT,
    experimentId: 'mf-exp',
    line,
    generation: 500,
    replicate,
    group: line,
    testClass: 0,
    foldDilutionSinceStart: 100,
    days: 1,
    block: null,
  };
}

export function sample(id: string, assayId: string, timepoint: 'start' | 'end' = 'start'): Sample {
  return {
    id,
    revision: 1,
    updatedAt: at(2),
    format: RECORD_FORMAT,
    experimentId: 'mf-exp',
    assayId,
    timepoint,
  };
}

export function plate(id: string, extra: Partial<Plate> = {}): Plate {
  return {
    id,
    revision: 1,
    updatedAt: at(3),
    format: RECORD_FORMAT,
    experimentId: 'mf-exp',
    assayId: 'mf-L1-r1',
    sampleId: 'mf-L1-r1-start',
    dilutionFold: 1e5,
    volumeUl: 100,
    photoId: null,
    typedCounts: { test: 112, reference: 97 },
    reviewed: false,
    ...extra,
  };
}

export function corrections(id: string, edits: Corrections['edits'] = []): Corrections {
  return {
    id,
    revision: 1,
    updatedAt: at(4),
    format: RECORD_FORMAT,
    plateId: 'mf-plate-1',
    analysisId: 'mf-an-1',
    edits,
    undone: [],
  };
}

/** A colony of the analysis, on a grid so ids and places are reproducible. */
export function colony(i: number, cls: 0 | 1 = (i % 2) as 0 | 1): ColonyRecord {
  return {
    id: `c${i}`,
    x: 400 + (i % 40) * 30,
    y: 400 + Math.floor(i / 40) * 30,
    r: 9,
    cls,
    confidence: 0.9,
    count: 1,
    area: 254,
    split: false,
    lab: [62, cls ? 18 : -4, 30],
    deltaLab: [-20, cls ? 16 : -6, 12],
  };
}

/** What the analysis found on a dense plate: `colonies` colonies of both colours. */
export function analysis(id: string, plateId: string, colonies: number): Analysis {
  return {
    id,
    revision: 1,
    updatedAt: at(5),
    format: RECORD_FORMAT,
    plateId,
    photoId: `${plateId}-photo`,
    width: 3000,
    height: 4000,
    agarLab: [82, 2, 20],
    dish: { cx: 1500, cy: 2000, rx: 1300, ry: 1300, angleDeg: 0 },
    colonies: Array.from({ length: colonies }, (_, i) => colony(i)),
    classes: [
      { cls: 0, name: 'white', hex: '#f0ede4', deltaLab: [-20, -6, 12] },
      { cls: 1, name: 'red', hex: '#c04a3a', deltaLab: [-20, 16, 12] },
    ],
    flags: [],
    paletteUsed: false,
    ms: 1800,
    learnedFrom: null,
    candidates: null,
  };
}

/** The record one revision on, changed as given, `minutes` into the session. */
export function revised<T extends { revision: number; updatedAt: string }>(
  record: T,
  change: Partial<T>,
  minutes: number,
): T {
  return { ...record, ...change, revision: record.revision + 1, updatedAt: at(minutes) };
}

export function changeOf<K extends RecordKind>(
  kind: K,
  body: RecordsByKind[K],
  replaces: string[] = [],
): Change {
  return {
    kind,
    id: body.id,
    revision: body.revision,
    updatedAt: body.updatedAt,
    deleted: false,
    body,
    replaces,
  };
}

export function tombstoneOf(
  kind: RecordKind,
  id: string,
  revision: number,
  minutes: number,
  replaces: string[],
): Change {
  return { kind, id, revision, updatedAt: at(minutes), deleted: true, body: null, replaces };
}

/** An experiment with one assay, its two samples and `plates` plates: a bench session's work. */
export function benchSession(plates: number, prefix = 'mf-plate'): Change[] {
  return [
    changeOf('experiments', experiment()),
    changeOf('assays', assay('mf-L1-r1')),
    changeOf('samples', sample('mf-L1-r1-start', 'mf-L1-r1', 'start')),
    changeOf('samples', sample('mf-L1-r1-end', 'mf-L1-r1', 'end')),
    ...Array.from({ length: plates }, (_, i) => changeOf('plates', plate(`${prefix}-${i + 1}`))),
  ];
}
