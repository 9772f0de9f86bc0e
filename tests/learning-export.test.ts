/**
 * The app's export of checked plates is what `rivalplate learn` reads: the zip is unpacked by a
 * reader written here from the ZIP specification (PKWARE APPNOTE.TXT §4.3.7, local file header),
 * its corrected.jsonl is parsed by the command line's own reader, and `rivalplate learn` learns a
 * model from the unpacked folder. The plate is a demo photo with its generator truth (fixtures/).
 */
import 'fake-indexeddb/auto';
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { capturedIo } from '../cli/captured-io.ts';
import { readCorrectedFile } from '../cli/corrected-file.ts';
import { main } from '../cli/main.ts';
import { parseModel } from '../cv/model-file.ts';
import { readTruth } from '../fixtures/plate-files.ts';
import type { Analysis, ColonyRecord, Photo, Plate } from '../schema/records.ts';
import { newExperiment } from '../web/bench/experiments.ts';
import { CORRECTED_FILE, checkedPlatesExport } from '../web/exchange/learning-export.ts';
import { zipStore } from '../web/exchange/zip.ts';
import { openIdbStore } from '../web/storage/idb-store.ts';
import { newStamp } from '../web/storage/stamp.ts';

const DEMO = resolve('fixtures/demo');
const NAMES = ['blue', 'cream'] as const;

/** The stored files of a zip made with method 0, read from their local headers. */
function unzipStored(zip: Uint8Array): Map<string, Uint8Array> {
  const view = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
  const files = new Map<string, Uint8Array>();
  let at = 0;
  while (view.getUint32(at, true) === 0x04034b50) {
    expect(view.getUint16(at + 8, true)).toBe(0); // stored
    const size = view.getUint32(at + 18, true);
    const nameLength = view.getUint16(at + 26, true);
    const extra = view.getUint16(at + 28, true);
    const name = new TextDecoder().decode(zip.slice(at + 30, at + 30 + nameLength));
    const start = at + 30 + nameLength + extra;
    files.set(name, zip.slice(start, start + size));
    at = start + size;
  }
  return files;
}

const dirs: string[] = [];
afterAll(() => Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true }))));

describe('the checked plates exported for rivalplate learn', () => {
  it('unzip into a folder that the command line reads and learns from', async () => {
    const store = await openIdbStore('learning-export-1');
    const experiment = newExperiment({
      name: 'Marrowfield pond',
      lines: ['L2'],
      referenceName: 'MF-anc',
      transferDilution: 100,
      defaultDilutionFold: 1e5,
      defaultVolumeUl: 100,
      markerColours: [
        { name: NAMES[0], hex: '#3f6fb0' },
        { name: NAMES[1], hex: '#efe6cf' },
      ],
    });
    const truth = await readTruth(join(DEMO, 'marrowfield-L2-day0.truth.json'));
    const jpeg = await readFile(join(DEMO, 'marrowfield-L2-day0.jpg'));
    const plate: Plate = {
      ...newStamp(),
      experimentId: experiment.id,
      assayId: 'a',
      sampleId: 's',
      dilutionFold: 1e5,
      volumeUl: 100,
      photoId: 'mf-photo',
      typedCounts: null,
      reviewed: true,
    };
    const photo: Photo = {
      ...newStamp(),
      id: 'mf-photo',
      plateId: plate.id,
      name: 'L2 day 0.jpg',
      blob: new Blob([jpeg], { type: 'image/jpeg' }),
      preview: null,
      width: 1600,
      height: 1200,
    };
    // The reading found the true colonies; the person switched the colour of the first.
    const colonies: ColonyRecord[] = truth.colonies.map((c, i) => ({
      id: `c${i}`,
      x: c.x,
      y: c.y,
      r: c.r,
      cls: c.cls,
      confidence: 0.9,
      count: 1,
      area: Math.PI * c.r ** 2,
      split: false,
      lab: null,
      deltaLab: null,
    }));
    const analysis: Analysis = {
      ...newStamp(),
      plateId: plate.id,
      photoId: photo.id,
      width: 1600,
      height: 1200,
      agarLab: [80, 0, 10],
      dish: null,
      colonies,
      classes: [
        { cls: 0, name: NAMES[0], hex: '#3f6fb0', deltaLab: [-20, 0, -20] },
        { cls: 1, name: NAMES[1], hex: '#efe6cf', deltaLab: [2, 0, 5] },
      ],
      flags: [],
      paletteUsed: false,
      ms: 1,
      learnedFrom: null,
      candidates: null,
    };
    const switched = colonies[0]!.cls === 0 ? 1 : 0;
    await store.putBatch({
      experiments: [experiment],
      plates: [plate],
      photos: [photo],
      analyses: [analysis],
      corrections: [
        {
          ...newStamp(),
          plateId: plate.id,
          analysisId: analysis.id,
          edits: [{ op: 'reclass', colonyId: 'c0', cls: switched }],
          undone: [],
        },
      ],
    });

    const exported = await checkedPlatesExport(store, experiment);
    expect(exported.plates).toBe(1);
    const dir = await mkdtemp(join(tmpdir(), 'rivalplate-export-'));
    dirs.push(dir);
    for (const [name, bytes] of unzipStored(zipStore(exported.files))) {
      await mkdir(dirname(join(dir, name)), { recursive: true });
      await writeFile(join(dir, name), bytes);
    }

    const { plates, names } = await readCorrectedFile(join(dir, CORRECTED_FILE));
    expect(names.toSorted()).toEqual([...NAMES].toSorted());
    expect(plates).toHaveLength(1);
    expect(plates[0]!.photo).toBe(join(dir, 'photos/001-L2_day_0.jpg'));
    expect(await readFile(plates[0]!.photo)).toEqual(jpeg);
    expect(plates[0]!.colonies).toEqual(
      truth.colonies.map((c, i) => ({
        x: c.x,
        y: c.y,
        cls: NAMES[i === 0 ? switched : c.cls],
      })),
    );

    const io = capturedIo(dir);
    const model = join(dir, 'model.json');
    const code = await main(['learn', join(dir, CORRECTED_FILE), '--out', model], io);
    expect(io.stderr()).toBe('');
    expect(code).toBe(0);
    expect(parseModel(await readFile(model, 'utf8')).plates).toBe(1);
  }, 120_000);
});
