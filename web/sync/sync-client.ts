/**
 * What the app calls to sync: hand it the app's record store, use the store it gives back (every
 * change then goes to the outbox), show `status()`, and call `connect` with the lab's server
 * address and token to turn sync on. Without a server the app works exactly as before.
 */
import type { RecordKind, RecordsByKind } from '../../schema/records.ts';
import { restoreRecord } from '../../schema/restore.ts';
import type { LabInfo } from '../../schema/sync-protocol.ts';
import type { RecordStore } from '../storage/record-store.ts';
import { labRound } from './lab-round.ts';
import { type CorrectionsMerge, mergeCorrections } from './merge-corrections.ts';
import { latestHead } from './plan-pulled.ts';
import { recordingStore } from './recording-store.ts';
import {
  createScheduler,
  DEFAULT_POLICY,
  type RoundVerdict,
  type SchedulePolicy,
  type SchedulerEnv,
} from './scheduler.ts';
import { describeFailure, isPassing, OFF, type SyncProblem, type SyncStatus } from './status.ts';
import { rescan } from './sync-round.ts';
import type { ConflictEntry, SyncSettings, SyncState } from './sync-state.ts';
import { createTransport, type Outcome, type SyncTransport } from './transport.ts';

export interface SyncClientOptions {
  /** The app's own store. */
  records: RecordStore;
  state: SyncState;
  env: SchedulerEnv;
  fetch?: typeof fetch;
  policy?: SchedulePolicy;
  now?: () => Date;
  /** Called when a change is queued while offline (Background Sync, browser-env.ts). */
  onQueuedOffline?: () => void;
}

export interface SyncClient {
  /** The app's store with every synced change queued for the server: use it for all writes. */
  records: RecordStore;
  /** This phone's id, as the server records it with each revision. */
  device: string;
  status(): SyncStatus;
  subscribe(listener: (status: SyncStatus) => void): () => void;
  /** Checks the server and token, then turns sync on; the problem when they do not work. */
  connect(settings: SyncSettings): Promise<SyncProblem | null>;
  /** Turns sync off; the outbox keeps what waits, for when it is turned on again. */
  disconnect(): Promise<void>;
  syncNow(): Promise<SyncStatus>;
  /** Reads the status again after a round run elsewhere (the service worker's background sync). */
  refresh(): Promise<SyncStatus>;
  conflict(kind: RecordKind, id: string): Promise<ConflictEntry | undefined>;
  /** Resolves a conflict with the chosen version (null: delete the record). */
  resolve<K extends RecordKind>(
    kind: K,
    id: string,
    chosen: RecordsByKind[K] | null,
  ): Promise<void>;
  /** A plate photo another phone uploaded, fetched from the lab server. */
  fetchPhoto(photoId: string): Promise<Outcome<Blob>>;
  /** Resolves a conflict of corrections by merging every head's taps. */
  mergeCorrections(id: string): Promise<CorrectionsMerge>;
  stop(): void;
}

export async function createSyncClient(options: SyncClientOptions): Promise<SyncClient> {
  const { state, env } = options;
  const inner = options.records;
  const now = options.now ?? (() => new Date());
  const listeners = new Set<(s: SyncStatus) => void>();
  let current: SyncStatus = OFF;
  let transport: SyncTransport | null = null;
  let lab: LabInfo | null = null;

  // Status updates run one after another, so a later one never lands before an earlier one.
  let publishing: Promise<SyncStatus> = Promise.resolve(current);
  function publish(change: Partial<SyncStatus>): Promise<SyncStatus> {
    publishing = publishing.then(() => refresh(change));
    return publishing;
  }

  async function refresh(change: Partial<SyncStatus>): Promise<SyncStatus> {
    const conflicts = (await state.conflicts()).map((c) => ({
      kind: c.kind,
      id: c.id,
      heads: c.heads.length,
    }));
    current = {
      ...current,
      ...change,
      waiting: await state.waiting(),
      lastSuccessAt: await state.meta('lastSuccessAt'),
      conflicts,
    };
    for (const l of listeners) l(current);
    return current;
  }

  async function round(): Promise<RoundVerdict> {
    if (!transport) return 'stop';
    await publish({ phase: 'syncing' });
    const done = await labRound({ records: inner, state, transport, now }, lab);
    // Started while the server was out of reach: its photo setting is learnt now.
    lab = done.lab;
    const { result } = done;
    const unreadable = result.unreadable;
    if (result.ok) {
      const refused = await state.refused();
      await publish({
        phase: 'idle',
        problem: refused.length
          ? {
              code: 'invalid-request',
              message: `The lab server refused ${refused.length} change(s): ${refused[0]!.refusal}`,
            }
          : null,
        unreadable,
      });
      return 'done';
    }
    const passing = isPassing(result.failure);
    const offline = result.failure.code === 'unreachable' && !env.isOnline();
    await publish({
      phase: offline ? 'offline' : passing ? 'retrying' : 'refused',
      problem: describeFailure(result.failure),
      unreadable,
    });
    return passing ? 'retry' : 'stop';
  }

  const scheduler = createScheduler(round, env, options.policy ?? DEFAULT_POLICY, (inMs) => {
    const nextAttemptAt = inMs === null ? null : new Date(now().getTime() + inMs).toISOString();
    if (current.phase !== 'off')
      void publish({ nextAttemptAt, ...(env.isOnline() ? {} : { phase: 'offline' }) });
  });

  const records = recordingStore(
    inner,
    state,
    async () => {
      if (transport) {
        if (!env.isOnline()) options.onQueuedOffline?.();
        scheduler.soon();
      }
      await publish({});
    },
    now,
  );

  async function turnOn(settings: SyncSettings, info: LabInfo): Promise<void> {
    transport = createTransport(settings, options.fetch);
    lab = info;
    await publish({ phase: 'idle', problem: null });
    scheduler.start();
  }

  // Changes made while sync was off, or whose queueing a closed tab cut short.
  await rescan(inner, state, now());
  const saved = await state.meta('settings');
  if (saved) {
    const info = await createTransport(saved, options.fetch).lab();
    if (info.ok) await turnOn(saved, info.value);
    else {
      // Kept on: a passing failure retries by itself, and a refusal still answers `syncNow`.
      transport = createTransport(saved, options.fetch);
      await publish({
        phase: isPassing(info.failure) ? 'retrying' : 'refused',
        problem: describeFailure(info.failure),
      });
      scheduler.start();
    }
  } else await publish({});

  const findConflict = (kind: RecordKind, id: string) =>
    state.conflicts().then((all) => all.find((c) => c.kind === kind && c.id === id));

  async function resolveWith<K extends RecordKind>(
    kind: K,
    id: string,
    chosen: RecordsByKind[K] | null,
    conflict: ConflictEntry,
  ): Promise<void> {
    const local = await inner.get(kind, id);
    const revision = Math.max(local?.revision ?? 0, ...conflict.heads.map((h) => h.revision)) + 1;
    const updatedAt = now().toISOString();
    // The resolution replaces every head, which is what ends the conflict on the server.
    await state.setKnown({
      kind,
      id,
      hashes: conflict.heads.map((h) => h.hash),
      revision: revision - 1,
      deleted: false,
    });
    if (chosen) await records.put(kind, { ...chosen, id, revision, updatedAt });
    else {
      await inner.remove({ [kind]: [id] });
      await state.queue({
        kind,
        id,
        revision,
        updatedAt,
        deleted: true,
        body: null,
        queuedAt: updatedAt,
      });
    }
    await state.dropConflict(kind, id);
    await publish({});
    if (transport) void scheduler.now();
  }

  return {
    records,
    device: await state.meta('device'),
    status: () => current,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    async connect(settings) {
      const info = await createTransport(settings, options.fetch).lab();
      if (!info.ok) return describeFailure(info.failure);
      await state.setMeta('settings', settings);
      await turnOn(settings, info.value);
      return null;
    },
    async disconnect() {
      scheduler.stop();
      transport = null;
      lab = null;
      await state.setMeta('settings', null);
      current = OFF;
      await publish({ phase: 'off', problem: null, nextAttemptAt: null });
    },
    async syncNow() {
      await scheduler.now();
      return publishing;
    },
    refresh: () => publish({}),
    conflict: findConflict,
    async resolve(kind, id, chosen) {
      const conflict = await findConflict(kind, id);
      if (!conflict) return;
      await resolveWith(kind, id, chosen, conflict);
    },
    async fetchPhoto(photoId) {
      if (!transport)
        return {
          ok: false,
          failure: { code: 'unreachable', message: 'this phone is not sharing with a lab server' },
        };
      const got = await transport.photo(photoId);
      // The server has it already: it is never sent back.
      if (got.ok)
        await state.setKnown({
          kind: 'photos',
          id: photoId,
          hashes: [],
          revision: 1,
          deleted: false,
        });
      return got;
    },
    async mergeCorrections(id) {
      const conflict = await findConflict('corrections', id);
      const restored = (conflict?.heads ?? [])
        .filter((h) => !h.deleted)
        .map((h) => restoreRecord('corrections', h.body, `the server's corrections ${id}`));
      // A version this phone cannot read is not merged away: the person chooses instead.
      const unreadable = restored.find((r) => !r.ok);
      if (unreadable && !unreadable.ok)
        return { ok: false, problem: 'unreadable', message: unreadable.error };
      const versions = restored.flatMap((r) => (r.ok ? [r.record] : []));
      if (!conflict || versions.length === 0)
        return {
          ok: false,
          problem: 'no-conflict',
          message: `corrections ${id} have no conflict to merge`,
        };
      const merged = mergeCorrections(...versions);
      if (!merged.ok) return merged;
      const base =
        versions.find((v) => v.updatedAt === latestHead(conflict.heads).updatedAt) ?? versions[0]!;
      await resolveWith('corrections', id, { ...base, edits: merged.edits, undone: [] }, conflict);
      return merged;
    },
    stop: () => scheduler.stop(),
  };
}
