import type { ColonyRecord, Experiment } from '../../schema/records.ts';
import { checkedReading } from '../review/checked-reading.ts';
import type { RecordStore } from '../storage/record-store.ts';
import type { ZipFile } from './zip.ts';

/**
 * The experiment's checked plates as `rivalplate learn` reads them (cli/corrected-file.ts), so a
 * lab can learn, compare or keep a model off the phone: a zip holding
 *
 *   corrected.jsonl        one line per checked plate:
 *                          {"file": "photos/003-plate.jpg", "colonies": [{"x": X, "y": Y, "cls": NAME}, ...]}
 *   photos/                each plate's photo as it was taken
 *
 * x, y are pixels of the upright photo at full resolution (where the app keeps every colony); cls
 * is the experiment's name for the colour; `file` is relative to corrected.jsonl. Each colony the
 * person left on the plate is one entry, a clump counted as several included (it is one object).
 * A plate whose photo is not on this phone (read on another one) is left out and named.
 */
export const CORRECTED_FILE = 'corrected.jsonl';

export interface LearningExport {
  files: ZipFile[];
  plates: number;
  /** Why each left-out checked plate was left out. */
  skipped: string[];
}

export async function checkedPlatesExport(
  store: RecordStore,
  experiment: Experiment,
): Promise<LearningExport> {
  const names = experiment.markerColours.map((m) => m.name);
  const lines: string[] = [];
  const photos: ZipFile[] = [];
  const skipped: string[] = [];
  for (const plate of await store.children('plates', experiment.id)) {
    const reading = await checkedReading(store, plate);
    if (!reading) continue;
    const photo = plate.photoId ? await store.get('photos', plate.photoId) : undefined;
    if (!photo) {
      skipped.push(`a checked plate at 1:${plate.dilutionFold}: its photo is not on this phone`);
      continue;
    }
    const file = `photos/${String(photos.length + 1).padStart(3, '0')}-${safeName(photo.name)}`;
    photos.push({ name: file, bytes: new Uint8Array(await photo.blob.arrayBuffer()) });
    lines.push(correctedLine(file, reading.corrected, names));
  }
  const files: ZipFile[] =
    lines.length > 0 ? [{ name: CORRECTED_FILE, text: `${lines.join('\n')}\n` }, ...photos] : [];
  return { files, plates: lines.length, skipped };
}

/** One line of corrected.jsonl. */
export function correctedLine(
  file: string,
  colonies: readonly ColonyRecord[],
  names: readonly string[],
): string {
  return JSON.stringify({
    file,
    colonies: colonies.map((c) => ({ x: c.x, y: c.y, cls: names[c.cls] })),
  });
}

/** A photo's name as a file name any system takes: no folders, no characters a shell or zip trips on. */
function safeName(name: string): string {
  return name.replace(/[^\w.-]+/g, '_').replace(/^\.+/, '') || 'photo.jpg';
}
