import type { RecordKind } from '../../schema/records.ts';
import { restoreRecord } from '../../schema/restore.ts';
import type { SyncClient } from '../sync/sync-client.ts';

/**
 * Settles a record edited on two phones. Corrections merge both people's taps; any other record
 * keeps its most recent edit (a deletion included). Resolves to a sentence for the person.
 */
export async function settleConflict(
  sync: SyncClient,
  kind: RecordKind,
  id: string,
): Promise<string> {
  if (kind === 'corrections') {
    const merged = await sync.mergeCorrections(id);
    if (!merged.ok) throw new Error(merged.message);
    return merged.disagreements.length
      ? `Taps merged; ${merged.disagreements.length} colonies were switched differently on the two phones (the later switch kept).`
      : 'Taps from both phones merged.';
  }
  const entry = await sync.conflict(kind, id);
  if (!entry) return 'Already settled.';
  const latest = [...entry.heads].sort((a, b) => a.updatedAt.localeCompare(b.updatedAt)).at(-1)!;
  if (latest.deleted) {
    await sync.resolve(kind, id, null);
    return 'Kept the latest edit: the record was deleted.';
  }
  const r = restoreRecord(kind, latest.body, `${kind} ${id} from the server`);
  if (!r.ok) throw new Error(r.error);
  await sync.resolve(kind, id, r.record);
  return `Kept the latest edit (from ${new Date(latest.updatedAt).toLocaleString()}).`;
}
