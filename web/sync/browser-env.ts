/**
 * The scheduler's surroundings in a browser: timers, the online state and its event, and
 * Background Sync where the browser has it (Chromium), so a change made offline is sent by the
 * service worker's `sync` event even if the tab is closed before the network returns.
 */
import type { SchedulerEnv } from './scheduler.ts';

/** The tag the app's service worker listens for in its `sync` event. */
export const BACKGROUND_SYNC_TAG = 'rivalplate-sync';

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
