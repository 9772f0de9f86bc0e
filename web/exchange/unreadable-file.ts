/**
 * The records this phone could not read, as a JSON file the person can keep or send to whoever
 * can repair them: each with its kind, id, the reason, and the record exactly as stored. Binary
 * fields (a photo's bytes) are described by size and type, since JSON cannot carry them.
 */
import type { UnreadableRecord } from '../storage/record-store.ts';

export function unreadableJson(records: readonly UnreadableRecord[], now = new Date()): string {
  return JSON.stringify(
    { format: 'rivalplate-unreadable', exportedAt: now.toISOString(), records },
    (_key, value: unknown) =>
      value instanceof Blob ? { binary: true, bytes: value.size, type: value.type } : value,
    2,
  );
}
