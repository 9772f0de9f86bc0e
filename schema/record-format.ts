/**
 * The format of a stored record, and the steps that bring an older record up to the current one.
 * A record carries its format in `format`; records written before formats existed carry none
 * and are format 1. Every record read back (IndexedDB, a backup file, the sync server) passes
 * through `upgradeRecord` before its checks, so a record from an older app is read, never lost,
 * and one from a newer app is refused by name instead of being half-understood.
 */
import { SchemaError } from './check.ts';
import type { RecordKind } from './records.ts';

export const RECORD_FORMAT = 3;

type Raw = Record<string, unknown>;

/** A time an older app wrote in another ISO form, in the one form `toISOString` writes. */
function canonicalTime(value: unknown): unknown {
  if (typeof value !== 'string') return value;
  const ms = Date.parse(value);
  return Number.isNaN(ms) ? value : new Date(ms).toISOString();
}

/**
 * Step n brings a record from format n to n + 1. Steps are only ever appended: a released step is
 * part of records in the field.
 */
const STEPS: ((kind: RecordKind, record: Raw) => Raw)[] = [
  // 1 → 2: times are compared as text to find the latest edit, so all take one form.
  (_kind, record) => ({ ...record, updatedAt: canonicalTime(record.updatedAt) }),
  // 2 → 3: experiments learn from their checked plates (on, nothing learned yet); readings from
  // before were made by the default analysis and kept no candidates to learn from; assays name
  // the day or batch they were run in, which older ones did not record.
  (kind, record) => {
    if (kind === 'experiments')
      return { ...record, learning: { enabled: true, model: null, since: null } };
    if (kind === 'analyses') return { ...record, learnedFrom: null, candidates: null };
    if (kind === 'assays') return { ...record, block: record.block ?? null };
    return record;
  },
];

/** The record at the current format; throws a SchemaError for one from a newer app. */
export function upgradeRecord(kind: RecordKind, raw: unknown): unknown {
  if (raw === null || typeof raw !== 'object' || Array.isArray(raw)) return raw;
  const from = (raw as Raw).format ?? 1;
  if (typeof from !== 'number' || !Number.isInteger(from) || from < 1)
    throw new SchemaError(
      'format',
      `expected a record format 1 to ${RECORD_FORMAT}, got ${String(from)}`,
    );
  if (from > RECORD_FORMAT)
    throw new SchemaError(
      'format',
      `written by a newer version of the app (record format ${from}, this one reads up to ${RECORD_FORMAT}): update the app`,
    );
  let record = raw as Raw;
  for (const step of STEPS.slice(from - 1)) record = step(kind, record);
  return { ...record, format: RECORD_FORMAT };
}
