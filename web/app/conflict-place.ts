import type { Assay, RecordKind } from '../../schema/records.ts';
import { loadPlate } from '../bench/plate-data.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { hrefOf } from './route.ts';

/** Where a record edited on two phones sits, in the bench's own words, and the screen showing it. */
export interface ConflictPlace {
  label: string;
  href: string | null;
}

const NOT_HERE: ConflictPlace = { label: 'not on this phone yet', href: null };

const assayLabel = (a: Assay) => `${a.line} g${a.generation} r${a.replicate}`;

async function platePlace(store: RecordStore, plateId: string): Promise<ConflictPlace> {
  const d = await loadPlate(store, plateId);
  if (!d) return NOT_HERE;
  return {
    label: `${assayLabel(d.assay)} · ${d.sample.timepoint} · 1:${d.plate.dilutionFold.toLocaleString('en')}`,
    href: hrefOf({ screen: 'plate', experimentId: d.experiment.id, plateId }),
  };
}

/** The plate, assay or experiment a conflicted record belongs to, read from this phone's store. */
export async function conflictPlace(
  store: RecordStore,
  kind: RecordKind,
  id: string,
): Promise<ConflictPlace> {
  switch (kind) {
    case 'experiments': {
      const e = await store.get('experiments', id);
      return e
        ? { label: e.name, href: hrefOf({ screen: 'experiment', id, tab: 'assays' }) }
        : NOT_HERE;
    }
    case 'assays': {
      const a = await store.get('assays', id);
      return a
        ? {
            label: assayLabel(a),
            href: hrefOf({ screen: 'experiment', id: a.experimentId, tab: 'assays' }),
          }
        : NOT_HERE;
    }
    case 'samples': {
      const s = await store.get('samples', id);
      const a = s && (await store.get('assays', s.assayId));
      return s && a
        ? {
            label: `${assayLabel(a)} · ${s.timepoint}`,
            href: hrefOf({ screen: 'experiment', id: a.experimentId, tab: 'assays' }),
          }
        : NOT_HERE;
    }
    case 'plates':
      return platePlace(store, id);
    case 'photos':
    case 'analyses':
    case 'corrections': {
      const r = await store.get(kind, id);
      return r ? platePlace(store, r.plateId) : NOT_HERE;
    }
  }
}
