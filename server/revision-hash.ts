/**
 * The server's name for a revision: SHA-256 of the revision's content in a canonical JSON form
 * (object keys sorted at every depth), so the same revision pushed twice, even with its keys in
 * another order, gets the same name and is recognised as a repeat.
 */
import { createHash } from 'node:crypto';
import type { Change } from '../schema/sync-protocol.ts';

/** JSON with object keys sorted; arrays keep their order, since order is meaningful in them. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/**
 * What a revision is made of. `replaces` and the pushing device are left out: they say where the
 * revision came from, not what it is.
 */
export function revisionHash(change: Change): string {
  const { kind, id, revision, updatedAt, deleted, body } = change;
  const content = canonicalJson({ kind, id, revision, updatedAt, deleted, body });
  return createHash('sha256').update(content).digest('hex');
}
