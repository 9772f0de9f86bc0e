/**
 * The sync state a person sees: whether sync is on, what waits on this phone, when the last sync
 * succeeded, the conflicts to resolve, and, when something is wrong, a message that says what
 * to do. Kept as plain data with the wording decided here, so every screen says the same.
 */
import type { RecordKind } from '../../schema/records.ts';
import type { SyncFailure } from './transport.ts';

export type SyncPhase =
  /** No server set: the app works on its own. */
  | 'off'
  | 'idle'
  | 'syncing'
  /** The browser reports no network; sync resumes when it comes back. */
  | 'offline'
  /** The last round failed for a passing reason; another is scheduled. */
  | 'retrying'
  /** The server refused in a way only a person can fix (token, app version); no retry by itself. */
  | 'refused';

export interface SyncProblem {
  code: SyncFailure['code'];
  message: string;
}

export interface SyncStatus {
  phase: SyncPhase;
  /** Local changes not yet confirmed by the server. */
  waiting: number;
  lastSuccessAt: string | null;
  nextAttemptAt: string | null;
  conflicts: { kind: RecordKind; id: string; heads: number }[];
  problem: SyncProblem | null;
  /** Server records that could not be read on this phone, by record and field. */
  unreadable: string[];
}

export const OFF: SyncStatus = {
  phase: 'off',
  waiting: 0,
  lastSuccessAt: null,
  nextAttemptAt: null,
  conflicts: [],
  problem: null,
  unreadable: [],
};

/** Failures that a later attempt may get past on its own; the rest wait for the person. */
const PASSING: ReadonlySet<SyncFailure['code']> = new Set([
  'unreachable',
  'server-fault',
  'storage-full',
  'bad-answer',
  // Met by the round itself, which pulls from the start and sends again what the server lacks.
  'cursor-unknown',
]);

export function isPassing(failure: SyncFailure): boolean {
  return PASSING.has(failure.code);
}

/** What to tell the person, in their terms, with the server's own words where they help. */
export function describeFailure(failure: SyncFailure): SyncProblem {
  const say = (message: string): SyncProblem => ({ code: failure.code, message });
  switch (failure.code) {
    case 'no-token':
    case 'bad-token':
      return say(
        'The server does not accept this token. Ask whoever runs the lab server for a new token and enter it in the sync settings. Your changes stay on this phone.',
      );
    case 'version-too-old':
      return say(
        'This app is older than the lab server accepts. Reload the app to update it; your changes stay on this phone.',
      );
    case 'storage-full':
      return say(
        'The lab server is out of space. Your changes stay on this phone and are sent once space is freed.',
      );
    case 'unreachable':
      return say(`The lab server cannot be reached; trying again later. (${failure.message})`);
    case 'cursor-unknown':
      return say(
        'The lab server was restored from a copy. This phone is sending it what the copy lacks; nothing on the phone is lost.',
      );
    case 'server-fault':
    case 'bad-answer':
      return say(`The lab server had a problem; trying again later. (${failure.message})`);
    case 'too-large':
    case 'invalid-request':
    case 'unsupported-type':
    case 'not-found':
    case 'wrong-offset':
    case 'upload-mismatch':
    case 'photos-off':
    case 'too-many-heads':
    case 'too-many-uploads':
      return say(`The lab server refused a change: ${failure.message}`);
  }
}

/**
 * The few words every screen's top bar shows while something about sharing needs attention or
 * is under way; null when sharing is off or all is shared.
 */
export function syncNote(s: SyncStatus): string | null {
  if (s.phase === 'off') return null;
  if (s.conflicts.length > 0) return `${s.conflicts.length} to settle`;
  if (s.phase === 'refused') return 'not shared: see the start screen';
  const waiting = s.waiting > 0 ? `${s.waiting} waiting` : null;
  if (s.phase === 'offline') return waiting ? `offline · ${waiting}` : 'offline';
  if (s.phase === 'syncing') return 'sharing…';
  return waiting;
}
