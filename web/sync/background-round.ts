/**
 * The round the service worker runs on a Background Sync `sync` event, so changes made offline
 * reach the lab's server when the network returns even if the app was closed meanwhile. It uses
 * the same stores and the same round as the app; the app is told when it has run.
 */
import type { RecordStore } from '../storage/record-store.ts';
import { labRound } from './lab-round.ts';
import { isPassing } from './status.ts';
import type { SyncState } from './sync-state.ts';
import { createTransport } from './transport.ts';

/** The tag the app registers and the service worker's `sync` event answers. */
export const BACKGROUND_SYNC_TAG = 'rivalplate-sync';
/** What the service worker posts to the app's windows after a background round. */
export const BACKGROUND_SYNCED = 'rivalplate-background-synced';

/** `off`: sync is not turned on; `refused`: the server refused the phone (the app says why). */
export type BackgroundOutcome = 'off' | 'done' | 'refused';

export async function backgroundRound(
  records: RecordStore,
  state: SyncState,
  fetchFn: typeof fetch = fetch,
  now: () => Date = () => new Date(),
): Promise<BackgroundOutcome> {
  const settings = await state.meta('settings');
  if (!settings) return 'off';
  const transport = createTransport(settings, fetchFn);
  const { result } = await labRound({ records, state, transport, now }, null);
  if (result.ok) return 'done';
  // Rejecting tells the browser to fire the event again later, with its own backoff: right for
  // a network that is not quite back or a busy server, pointless for a refused token.
  if (isPassing(result.failure)) throw new Error(result.failure.message);
  return 'refused';
}
