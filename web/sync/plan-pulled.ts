/**
 * What to do with one record a pull brought, decided from what the phone knows of it. Pure, so
 * the rules can be read and tested in one place; sync-round.ts carries the decision out.
 */
import type { PulledRecord, Revision } from '../../schema/sync-protocol.ts';

export type PulledPlan =
  /** The phone has this revision already (usually its own push coming back). */
  | { action: 'skip' }
  /** A local change waits for the next push; the server will sort out which is newer. */
  | { action: 'keep-local' }
  /** Take the server's revision (write it, or delete the record for a tombstone). */
  | { action: 'take'; head: Revision }
  /**
   * The server offers an older revision than one it had confirmed to this phone: it lost the
   * later one (its database was put back from a copy). The phone's version is sent again, on
   * top of the server's, instead of being overwritten by it.
   */
  | { action: 'resend'; head: Revision }
  /** Two or more heads: keep them all for the person; `latest` is the one to show meanwhile. */
  | { action: 'conflict'; heads: Revision[]; latest: Revision };

/** The most recent head by its edit time; the hash breaks ties so every phone picks the same. */
export function latestHead(heads: readonly Revision[]): Revision {
  return heads.reduce((a, b) =>
    b.updatedAt > a.updatedAt || (b.updatedAt === a.updatedAt && b.hash > a.hash) ? b : a,
  );
}

export function planPulled(
  pulled: PulledRecord,
  /** `knownRevision`: the revision the server last confirmed to this phone (0 if none). */
  local: { waiting: boolean; bases: readonly string[]; knownRevision: number },
): PulledPlan {
  if (pulled.heads.length > 1)
    return { action: 'conflict', heads: pulled.heads, latest: latestHead(pulled.heads) };
  const head = pulled.heads[0]!;
  if (local.bases.length === 1 && local.bases[0] === head.hash) return { action: 'skip' };
  if (local.waiting) return { action: 'keep-local' };
  // Revisions only grow along a record's history, so an older head means history was lost.
  if (local.knownRevision > head.revision) return { action: 'resend', head };
  return { action: 'take', head };
}
