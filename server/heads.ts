/**
 * How a record's heads move when a revision arrives, kept apart from any SQL engine so every
 * engine applies the same rule. A revision replaces the heads it names; heads it does not name
 * stay, and then the record has more than one head: a conflict that keeps both edits.
 */
import { SYNC_LIMITS } from '../schema/sync-protocol.ts';
import { SyncRefusal } from './refusal.ts';

/**
 * `replaces` may name revisions that are no longer heads (already replaced) or that this server
 * never saw (a server restored from an older backup); both are ignored rather than refused, so a
 * phone's edit is never turned away for its history. A revision that would leave the record with
 * more heads than the protocol lets a pull carry is refused: every phone would reject the record,
 * and the edit stays on its phone until the versions are resolved.
 */
export function headsAfter(
  record: { kind: string; id: string },
  current: readonly string[],
  replaces: readonly string[],
  added: string,
): string[] {
  const heads = [...current.filter((h) => !replaces.includes(h) && h !== added), added];
  if (heads.length > SYNC_LIMITS.headsPerRecord)
    throw new SyncRefusal(
      'too-many-heads',
      `${record.kind} ${record.id} already has ${current.length} versions no edit has settled; ` +
        `resolve them on a phone before sending another (at most ${SYNC_LIMITS.headsPerRecord})`,
    );
  return heads;
}
