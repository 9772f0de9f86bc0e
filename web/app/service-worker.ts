import { Workbox } from 'workbox-window';

/**
 * Registers the precaching service worker. A new version installs in the background and waits;
 * `onUpdate` is told, and the new version takes over only when the person calls `apply` (it then
 * reloads the page once the new worker controls it).
 */
export function registerServiceWorker(onUpdate: (apply: () => void) => void): void {
  if (import.meta.env.DEV || !('serviceWorker' in navigator)) return;
  const wb = new Workbox('./sw.js', { scope: './' });
  wb.addEventListener('waiting', () =>
    onUpdate(() => {
      wb.addEventListener('controlling', () => window.location.reload());
      wb.messageSkipWaiting();
    }),
  );
  wb.register().catch((e: unknown) => console.warn('service worker not registered:', e));
}
