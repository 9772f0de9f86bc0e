/**
 * Sync rounds run one at a time across the app's tabs and its service worker: two at once would
 * push the same outbox entries twice and race each other on the pull cursor. Web Locks (in
 * Chromium, Firefox and Safari 15.4+) hold them apart; without them, a tab's own scheduler
 * still never overlaps its rounds, and a repeated push changes nothing on the server.
 */
const LOCK = 'rivalplate-sync-round';

export function oneRoundAtATime<T>(round: () => Promise<T>): Promise<T> {
  const locks = (globalThis as { navigator?: { locks?: LockManager } }).navigator?.locks;
  return locks ? locks.request(LOCK, round) : round();
}
