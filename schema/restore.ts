/**
 * The one gate every record passes on its way back into the program: from IndexedDB, from a
 * backup file, from the sync server. It checks the record against its kind and says exactly
 * which field of which record was wrong.
 */
import { SchemaError } from './check.ts';
import { KINDS } from './kinds.ts';
import { upgradeRecord } from './record-format.ts';
import type { RecordKind, RecordsByKind } from './records.ts';

export type Restored<T> = { ok: true; record: T } | { ok: false; error: string };

/**
 * `where` names the source for the message, e.g. "backup.json, assays[3]".
 * A record of an older format is upgraded first (record-format.ts). The returned record holds
 * only the known fields; unknown ones are dropped.
 */
export function restoreRecord<K extends RecordKind>(
  kind: K,
  raw: unknown,
  where: string,
): Restored<RecordsByKind[K]> {
  try {
    return { ok: true, record: KINDS[kind].check(upgradeRecord(kind, raw), '') };
  } catch (e) {
    if (e instanceof SchemaError) return { ok: false, error: `${where}: ${e.message}` };
    throw e;
  }
}

/** Format marker and version of a backup file; a file from a newer version is refused by name. */
export const BACKUP_FORMAT = 'rivalplate-backup';
export const BACKUP_VERSION = 1;
