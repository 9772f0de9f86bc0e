/**
 * The scheduler's surroundings in a browser: timers, the online state and its event, and
 * Background Sync where the browser has it (Chromium), so a change made offline is sent by the
 * service worker's `sync` event even if the tab is closed before the network returns.
 */
import { BACKGROUND_SYNC_TAG, BACKGROUND_SYNCED } from './background-round.ts';
import type { SchedulerEnv } from './scheduler.ts';

/** Background Sync is not in TypeScript's DOM types: the part of it used here. */
interface WithBackgroundSync {
  sync?: { register(tag: string): Promise<void> };
}

export function browserEnv(win: Window = window): SchedulerEnv {
  return {
    setTimer(fn, ms) {
      const handle = win.setTimeout(fn, ms);
      return () => win.clearTimeout(handle);
    },
    isOnline: () => win.navigator.onLine,
    onOnline(fn) {
      win.addEventListener('online', fn);
      return () => win.removeEventListener('online', fn);
    },
    random: Math.random,
  };
}

/** Asks the service worker to sync when the network returns; a no-op where that is unsupported. */
export async function requestBackgroundSync(win: Window = window): Promise<boolean> {
  const container = win.navigator.serviceWorker;
  if (!container) return false;
  // Not `container.ready`: that waits for ever on a page without a service worker.
  const registration = (await container.getRegistration()) as
    | (ServiceWorkerRegistration & WithBackgroundSync)
    | undefined;
  if (!registration?.sync) return false;
  try {
    await registration.sync.register(BACKGROUND_SYNC_TAG);
    return true;
  } catch {
    // Refused (permission, or a browser that has the API but not for this origin): the online
    // event and the timer still bring the change to the server when the app is open.
    return false;
  }
}

/** Calls `fn` each time the service worker has run a background round for this app. */
export function onBackgroundSynced(fn: () => void, win: Window = window): void {
  win.navigator.serviceWorker?.addEventListener('message', (event: MessageEvent) => {
    if ((event.data as { type?: unknown } | null)?.type === BACKGROUND_SYNCED) fn();
  });
}
