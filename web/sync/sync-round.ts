/**
 * One sync round: pull what changed since the cursor, push the outbox in batches, then pull again
 * what the push and other phones changed, bringing it into the app's records. A round stops at the first failure and leaves everything as
 * it was for the next round: the outbox keeps what the server did not confirm, the cursor stays
 * at the last page applied.
 */
import { restoreRecord } from '../../schema/restore.ts';
import {
  type Change,
  type PulledRecord,
  type Revision,
  SYNC_LIMITS,
  SYNCED_KINDS,
} from '../../schema/sync-protocol.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { planPulled } from './plan-pulled.ts';
import { type KnownEntry, type SyncState, upsertEntry } from './sync-state.ts';
import type { SyncFailure, SyncTransport } from './transport.ts';

export interface RoundCounts {
  pushed: number;
  pulled: number;
  /** Changes the server refused for their content, set aside in the outbox with its reason. */
  refused: number;
  /** Server records that failed the restore gate: kept on the server, not brought in. */
  unreadable: string[];
}

export type RoundResult = ({ ok: true } | { ok: false; failure: SyncFailure }) & RoundCounts;

export interface RoundDeps {
  /** The app's own store, written directly: what a pull brings is not a local change. */
  records: RecordStore;
  state: SyncState;
  transport: SyncTransport;
  now: () => Date;
}

async function bringIn(deps: RoundDeps, pulled: PulledRecord, counts: RoundCounts): Promise<void> {
  const { records, state } = deps;
  const { kind, id } = pulled;
  const known = await state.known(kind, id);
  const plan = planPulled(pulled, {
    waiting: await state.isWaiting(kind, id),
    bases: known?.hashes ?? [],
    knownRevision: known?.revision ?? 0,
  });
  if (plan.action === 'skip' || plan.action === 'keep-local') return;
  if (plan.action === 'resend') return resend(deps, pulled, plan.head, known!);

  const head = plan.action === 'take' ? plan.head : plan.latest;
  if (plan.action === 'conflict') {
    await state.putConflict({ kind, id, heads: plan.heads, seenAt: deps.now().toISOString() });
    // The phone's own version stays on screen until the person chooses; a phone that never had
    // the record shows the latest head meanwhile.
    if ((await records.get(kind, id)) !== undefined || head.deleted) return;
  }
  // Checked again just before writing: a tap made while this round ran must not be overwritten.
  if (await state.isWaiting(kind, id)) return;
  if (head.deleted) {
    await records.remove({ [kind]: [id] });
  } else {
    const restored = restoreRecord(kind, head.body, `the server's ${kind} record ${id}`);
    if (!restored.ok) {
      counts.unreadable.push(restored.error);
      return;
    }
    await records.put(kind, restored.record);
  }
  // Written after the record, so a crash between the two is found by a rescan, never as a
  // record the phone believes it deleted.
  await state.setKnown({
    kind,
    id,
    hashes: plan.action === 'take' ? [head.hash] : (known?.hashes ?? [head.hash]),
    revision: head.revision,
    deleted: head.deleted,
  });
  if (plan.action === 'take') await state.dropConflict(kind, id);
  counts.pulled += 1;
}

/**
 * Queues the phone's version of a record again, on top of the older head the server now has: the
 * phone's record as it is, or its deletion at the revision the server had confirmed.
 */
async function resend(
  deps: RoundDeps,
  pulled: PulledRecord,
  head: Revision,
  known: KnownEntry,
): Promise<void> {
  const { records, state } = deps;
  const { kind, id } = pulled;
  const at = deps.now().toISOString();
  const local = await records.get(kind, id);
  await state.setKnown({
    kind,
    id,
    hashes: [head.hash],
    revision: head.revision,
    deleted: head.deleted,
  });
  await state.queue(
    local
      ? upsertEntry(kind, local, at)
      : {
          kind,
          id,
          revision: known.revision,
          updatedAt: at,
          deleted: true,
          body: null,
          queuedAt: at,
        },
  );
}

/**
 * After a pull from the start of a restored database has run to its end: what the phone knows the
 * server held but the pull did not bring is gone from the server. Forgetting it lets `rescan`
 * queue those records again (and the photo uploads start again), as new to the server.
 */
async function forgetLost(deps: RoundDeps, seen: ReadonlySet<string>): Promise<void> {
  for (const known of await deps.state.allKnown())
    if (!seen.has(`${known.kind}/${known.id}`)) await deps.state.dropKnown(known.kind, known.id);
  await rescan(deps.records, deps.state, deps.now());
}

/**
 * Pulls everything changed since the cursor and brings it in. A cursor the server does not know
 * (its database was restored from a copy, or replaced) starts the pull over from the beginning;
 * once that has run to the end, what the server lost is queued to be pushed again.
 */
async function pullAll(
  deps: RoundDeps,
  counts: RoundCounts,
): Promise<SyncFailure | 'reconciled' | null> {
  const { state, transport } = deps;
  if (await state.meta('reconcile')) await state.setMeta('cursor', '0');
  const seen = new Set<string>();
  for (;;) {
    const answer = await transport.pull(await state.meta('cursor'));
    if (!answer.ok) {
      if (answer.failure.code !== 'cursor-unknown' || (await state.meta('reconcile')))
        return answer.failure;
      await state.setMeta('reconcile', true);
      await state.setMeta('cursor', '0');
      continue;
    }
    for (const record of answer.value.records) {
      seen.add(`${record.kind}/${record.id}`);
      await bringIn(deps, record, counts);
    }
    await state.setMeta('cursor', answer.value.cursor);
    if (!answer.value.more) break;
  }
  if (!(await state.meta('reconcile'))) return null;
  await forgetLost(deps, seen);
  await state.setMeta('reconcile', false);
  return 'reconciled';
}

/** Refusals that are about the changes sent, not about the phone or the server. */
const ABOUT_THE_CHANGE: ReadonlySet<SyncFailure['code']> = new Set([
  'invalid-request',
  'too-large',
  'too-many-heads',
]);

/**
 * Pushes one batch. When the server refuses the batch for what is in it, each change is sent
 * alone, and the ones refused alone are set aside with the server's reason, so one record the
 * server will not take never holds up the rest.
 */
async function pushBatch(
  deps: RoundDeps,
  device: string,
  changes: Change[],
  counts: RoundCounts,
): Promise<SyncFailure | null> {
  const answer = await deps.transport.push(device, changes);
  if (answer.ok) {
    await deps.state.settle([...answer.value.accepted, ...answer.value.conflicts], changes);
    counts.pushed += changes.length;
    return null;
  }
  if (!ABOUT_THE_CHANGE.has(answer.failure.code)) return answer.failure;
  if (changes.length === 1) {
    const c = changes[0]!;
    await deps.state.refuse(c.kind, c.id, c.revision, answer.failure.message);
    counts.refused += 1;
    return null;
  }
  for (const change of changes) {
    const failure = await pushBatch(deps, device, [change], counts);
    if (failure) return failure;
  }
  return null;
}

export async function syncRound(deps: RoundDeps): Promise<RoundResult> {
  const { state } = deps;
  const counts: RoundCounts = { pushed: 0, pulled: 0, refused: 0, unreadable: [] };
  const device = await state.meta('device');

  // Bounded by what waited at the start: a person tapping on during the round adds to the next.
  const waiting = async () => Math.ceil((await state.waiting()) / SYNC_LIMITS.changesPerPush);
  let batches = await waiting();

  // A pull before the push: a restored server is found before anything is pushed on top of
  // revisions it no longer has. Usually it brings nothing, or what other phones sent.
  const before = await pullAll(deps, counts);
  if (before === 'reconciled') batches = await waiting();
  else if (before) return { ok: false, failure: before, ...counts };

  for (let i = 0; i < batches; i++) {
    const changes = await state.pending(SYNC_LIMITS.changesPerPush);
    if (changes.length === 0) break;
    const failure = await pushBatch(deps, device, changes, counts);
    if (failure) return { ok: false, failure, ...counts };
  }

  const after = await pullAll(deps, counts);
  if (after && after !== 'reconciled') return { ok: false, failure: after, ...counts };
  await state.setMeta('lastSuccessAt', deps.now().toISOString());
  return { ok: true, ...counts };
}

/**
 * Queues every synced record whose revision the server has not seen: the safety net for a
 * change written to the app's store whose outbox entry was lost (the tab closed between the two
 * writes). Also finds records deleted on the phone whose tombstone never reached the outbox.
 */
export async function rescan(records: RecordStore, state: SyncState, now: Date): Promise<number> {
  let queued = 0;
  const present = new Set<string>();
  for (const kind of SYNCED_KINDS) {
    for (const record of await records.all(kind)) {
      present.add(`${kind}/${record.id}`);
      const known = await state.known(kind, record.id);
      if ((known && known.revision >= record.revision) || (await state.isWaiting(kind, record.id)))
        continue;
      await state.queue(upsertEntry(kind, record, now.toISOString()));
      queued += 1;
    }
  }
  for (const known of await state.allKnown()) {
    const key = `${known.kind}/${known.id}`;
    // Photos are known by their uploads, not as records: they have no tombstones.
    if (known.deleted || present.has(key) || !SYNCED_KINDS.includes(known.kind)) continue;
    if (await state.isWaiting(known.kind, known.id)) continue;
    await state.queue({
      kind: known.kind,
      id: known.id,
      revision: known.revision + 1,
      updatedAt: now.toISOString(),
      deleted: true,
      body: null,
      queuedAt: now.toISOString(),
    });
    queued += 1;
  }
  return queued;
}
