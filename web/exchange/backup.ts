import { KINDS, RECORD_KINDS } from '../../schema/kinds.ts';
import type { RecordKind, RecordsByKind } from '../../schema/records.ts';
import { BACKUP_FORMAT, BACKUP_VERSION, restoreRecord } from '../../schema/restore.ts';
import { experimentsRecordIds } from '../bench/delete.ts';
import type { RecordBatch, RecordStore } from '../storage/record-store.ts';

/** How a Blob field is written in the JSON file. */
interface EncodedBlob {
  type: string;
  base64: string;
}

const BLOB_FIELDS: Partial<Record<RecordKind, string[]>> = { photos: ['blob', 'preview'] };

async function encode(blob: Blob): Promise<EncodedBlob> {
  const bytes = new Uint8Array(await blob.arrayBuffer());
  let binary = '';
  // Chunks keep String.fromCharCode's argument list short on large photos.
  for (let i = 0; i < bytes.length; i += 0x8000)
    binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return { type: blob.type, base64: btoa(binary) };
}

function decode(value: unknown): unknown {
  const v = value as Partial<EncodedBlob> | null;
  if (!v || typeof v.base64 !== 'string' || typeof v.type !== 'string') return value;
  const binary = atob(v.base64);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  return new Blob([bytes], { type: v.type });
}

/**
 * Every exported record on this device, photos included, as one JSON text. The demo experiment
 * stays out: it comes with the app, and a lab's backup should hold only the lab's own work.
 */
export async function backupJson(store: RecordStore): Promise<string> {
  const demo = await experimentsRecordIds(
    store,
    (await store.all('experiments')).filter((e) => e.demo).map((e) => e.id),
  );
  const records: Record<string, unknown[]> = {};
  for (const kind of RECORD_KINDS) {
    if (!KINDS[kind].exported) continue;
    const skip = new Set(demo[kind] ?? []);
    const list = (await store.all(kind)).filter((r) => !skip.has(r.id)) as unknown as Record<
      string,
      unknown
    >[];
    records[kind] = await Promise.all(
      list.map(async (r) => {
        const out = { ...r };
        for (const f of BLOB_FIELDS[kind] ?? []) if (r[f]) out[f] = await encode(r[f] as Blob);
        return out;
      }),
    );
  }
  return JSON.stringify({
    format: BACKUP_FORMAT,
    version: BACKUP_VERSION,
    exportedAt: new Date().toISOString(),
    records,
  });
}

export interface BackupRead {
  batch: RecordBatch;
  count: number;
}

/**
 * Reads a backup file through the schema's restore gate. Every problem is listed, naming the
 * file, the record and the field; a file with any problem is refused whole, so a backup is never
 * half-restored. Throws an Error whose message lists the problems.
 */
export function readBackup(text: string, fileName: string): BackupRead {
  let doc: { format?: unknown; version?: unknown; records?: unknown };
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new Error(`${fileName}: not a JSON file (${e instanceof Error ? e.message : String(e)})`);
  }
  if (doc?.format !== BACKUP_FORMAT)
    throw new Error(`${fileName}: not a Rivalplate backup (no "format": "${BACKUP_FORMAT}")`);
  if (doc.version !== BACKUP_VERSION)
    throw new Error(
      `${fileName}: backup version ${String(doc.version)}; this app reads version ${BACKUP_VERSION}`,
    );
  const records = (doc.records ?? {}) as Record<string, unknown>;
  const problems: string[] = [];
  const batch: RecordBatch = {};
  let count = 0;
  for (const kind of RECORD_KINDS) {
    const raw = records[kind];
    if (raw === undefined) continue;
    if (!Array.isArray(raw)) {
      problems.push(`${fileName}, ${kind}: expected a list`);
      continue;
    }
    const restored: RecordsByKind[typeof kind][] = [];
    raw.forEach((item, i) => {
      const withBlobs = { ...(item as Record<string, unknown>) };
      for (const f of BLOB_FIELDS[kind] ?? []) withBlobs[f] = decode(withBlobs[f]);
      const r = restoreRecord(kind, withBlobs, `${fileName}, ${kind}[${i}]`);
      if (r.ok) restored.push(r.record);
      else problems.push(r.error);
    });
    (batch as Record<string, unknown[]>)[kind] = restored;
    count += restored.length;
  }
  if (problems.length) throw new Error(problems.join('\n'));
  return { batch, count };
}

/** Keeps, for each record, whichever copy has the higher revision: restoring never rolls work back. */
export async function newerOnly(store: RecordStore, batch: RecordBatch): Promise<RecordBatch> {
  const out: RecordBatch = {};
  for (const kind of RECORD_KINDS) {
    const list = batch[kind];
    if (!list) continue;
    const kept = [];
    for (const r of list) {
      const existing = await store.get(kind, r.id);
      if (!existing || existing.revision < r.revision) kept.push(r);
    }
    (out as Record<string, unknown[]>)[kind] = kept;
  }
  return out;
}
