import type { RecordKind } from '../../schema/records.ts';
import { restoreRecord } from '../../schema/restore.ts';
import type { SyncClient } from '../sync/sync-client.ts';

/** One phone's version of a record edited on two phones, as the person chooses between them. */
export interface ConflictChoice {
  hash: string;
  updatedAt: string;
  deleted: boolean;
  /** Made on this phone. */
  mine: boolean;
}

/** The versions of a conflicted record, oldest first. */
export async function conflictChoices(
  sync: SyncClient,
  kind: RecordKind,
  id: string,
): Promise<ConflictChoice[]> {
  const entry = await sync.conflict(kind, id);
  return (entry?.heads ?? [])
    .map((h) => ({
      hash: h.hash,
      updatedAt: h.updatedAt,
      deleted: h.deleted,
      mine: h.device === sync.device,
    }))
    .sort((a, b) => a.updatedAt.localeCompare(b.updatedAt));
}

/** Settles a conflict with one phone's version (a deletion included); a sentence for the person. */
export async function keepVersion(
  sync: SyncClient,
  kind: RecordKind,
  id: string,
  hash: string,
): Promise<string> {
  const entry = await sync.conflict(kind, id);
  const head = entry?.heads.find((h) => h.hash === hash);
  if (!head) return 'Already settled.';
  const when = new Date(head.updatedAt).toLocaleString();
  if (head.deleted) {
    await sync.resolve(kind, id, null);
    return `Kept the deletion made ${when}.`;
  }
  const r = restoreRecord(kind, head.body, `${kind} ${id} from the server`);
  if (!r.ok) throw new Error(r.error);
  await sync.resolve(kind, id, r.record);
  return `Kept the version saved ${when}.`;
}

/** Settles a conflict of colony corrections by keeping both phones' taps. */
export async function mergeTaps(sync: SyncClient, id: string): Promise<string> {
  const merged = await sync.mergeCorrections(id);
  if (!merged.ok) throw new Error(merged.message);
  return merged.disagreements.length
    ? `Taps merged; ${merged.disagreements.length} colonies were switched differently on the two phones (the later switch kept).`
    : 'Taps from both phones merged.';
}
