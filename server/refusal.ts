import { SYNC_ERRORS, type SyncErrorBody, type SyncErrorCode } from '../schema/sync-protocol.ts';

/**
 * A request the server turns down, with the protocol's error code. Thrown anywhere below a
 * handler (storage included) and turned into the HTTP answer in one place, the error handler.
 */
export class SyncRefusal extends Error {
  constructor(
    readonly code: SyncErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'SyncRefusal';
  }

  get status(): number {
    return SYNC_ERRORS[this.code];
  }

  body(): SyncErrorBody {
    return { error: this.code, message: this.message };
  }
}

/**
 * A request's path as a refusal quotes it: without the query, and cut short, so an answer never
 * echoes kilobytes of whatever a client put in its address.
 */
export function quotedPath(url: string): string {
  const path = url.split('?')[0] ?? '';
  return path.length > 64 ? `${path.slice(0, 64)}…` : path;
}
