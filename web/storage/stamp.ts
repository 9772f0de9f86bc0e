import { RECORD_FORMAT } from '../../schema/record-format.ts';
import type { Stamp } from '../../schema/records.ts';

/** A fresh stamp for a record made on this device. */
export function newStamp(now: Date = new Date()): Stamp {
  return {
    id: crypto.randomUUID(),
    revision: 1,
    updatedAt: now.toISOString(),
    format: RECORD_FORMAT,
  };
}

/** The same record after a change: one revision on, with the time of the change. */
export function revised<T extends Stamp>(
  record: T,
  change: Partial<Omit<T, keyof Stamp>>,
  now = new Date(),
): T {
  return { ...record, ...change, revision: record.revision + 1, updatedAt: now.toISOString() };
}
