/**
 * The app's side of the sync protocol over HTTP. Every answer is checked with the protocol's
 * own checks before use; every way a call can fail comes back as a SyncFailure value, never as a
 * thrown error, so the caller handles each case by name.
 */
import { type Check, SchemaError } from '../../schema/check.ts';
import {
  type Change,
  checkErrorBody,
  checkLabInfo,
  checkPhotoUploadState,
  checkPullResponse,
  checkPushResponse,
  type LabInfo,
  type PhotoUploadRequest,
  type PhotoUploadState,
  type PullResponse,
  type PushResponse,
  SYNC_BASE_PATH,
  type SyncErrorCode,
} from '../../schema/sync-protocol.ts';
import type { SyncSettings } from './sync-state.ts';

/** The server's refusals by their protocol code, plus the two ways a call fails on the way. */
export type SyncFailure =
  | { code: SyncErrorCode; message: string }
  | { code: 'unreachable'; message: string }
  | { code: 'bad-answer'; message: string };

export type Outcome<T> = { ok: true; value: T } | { ok: false; failure: SyncFailure };

export interface SyncTransport {
  lab(): Promise<Outcome<LabInfo>>;
  push(device: string, changes: Change[]): Promise<Outcome<PushResponse>>;
  pull(since: string): Promise<Outcome<PullResponse>>;
  beginPhoto(request: PhotoUploadRequest): Promise<Outcome<PhotoUploadState>>;
  photoState(photoId: string): Promise<Outcome<PhotoUploadState>>;
  sendChunk(
    photoId: string,
    offset: number,
    bytes: Uint8Array<ArrayBuffer>,
  ): Promise<Outcome<PhotoUploadState>>;
  /** A photo another phone uploaded, as its bytes. */
  photo(photoId: string): Promise<Outcome<Blob>>;
}

/** A phone on a poor network waits this long for an answer before counting the server unreachable. */
const DEFAULT_TIMEOUT_MS = 30_000;

function checked<T>(check: Check<T>, raw: unknown, what: string): Outcome<T> {
  try {
    return { ok: true, value: check(raw, what) };
  } catch (e) {
    if (e instanceof SchemaError)
      return {
        ok: false,
        failure: { code: 'bad-answer', message: `the server's answer made no sense: ${e.message}` },
      };
    throw e;
  }
}

export function createTransport(
  settings: SyncSettings,
  fetchFn: typeof fetch = fetch,
  timeoutMs = DEFAULT_TIMEOUT_MS,
): SyncTransport {
  const base = settings.serverUrl.replace(/\/+$/, '') + SYNC_BASE_PATH;

  /**
   * Sends one request. A refusal comes back parsed from the server's error body; a success is
   * handed to `read`. A connection that fails before or while the answer arrives is `unreachable`.
   */
  async function exchange<T>(
    path: string,
    read: (res: Response) => Promise<Outcome<T>>,
    init: { method?: string; json?: unknown; bytes?: Uint8Array<ArrayBuffer> } = {},
  ): Promise<Outcome<T>> {
    const headers: Record<string, string> = { authorization: `Bearer ${settings.token}` };
    let body: string | Uint8Array<ArrayBuffer> | undefined;
    if (init.json !== undefined) {
      headers['content-type'] = 'application/json';
      body = JSON.stringify(init.json);
    } else if (init.bytes) {
      headers['content-type'] = 'application/octet-stream';
      body = init.bytes;
    }
    let res: Response;
    let text: string;
    try {
      res = await fetchFn(base + path, {
        method: init.method ?? (body === undefined ? 'GET' : 'POST'),
        headers,
        body,
        signal: AbortSignal.timeout(timeoutMs),
      });
      if (res.ok) return await read(res);
      text = await res.text();
    } catch (e) {
      return {
        ok: false,
        failure: {
          code: 'unreachable',
          message: `cannot reach ${settings.serverUrl}: ${(e as Error).message}`,
        },
      };
    }
    const refusal = parseJson(text, res, checkErrorBody, 'error');
    return refusal.ok
      ? { ok: false, failure: { code: refusal.value.error, message: refusal.value.message } }
      : refusal;
  }

  /** Reads a JSON answer, or says the server is not answering as a sync server does. */
  function parseJson<T>(text: string, res: Response, check: Check<T>, what: string): Outcome<T> {
    let raw: unknown;
    try {
      raw = JSON.parse(text);
    } catch {
      // A proxy's error page, or a server that is not a Rivalplate sync server.
      return {
        ok: false,
        failure: {
          code: res.ok ? 'bad-answer' : 'unreachable',
          message: `${settings.serverUrl} answered ${res.status} without a sync answer`,
        },
      };
    }
    return checked(check, raw, what);
  }

  const call = <T>(
    path: string,
    check: Check<T>,
    init?: { method?: string; json?: unknown; bytes?: Uint8Array<ArrayBuffer> },
  ) => exchange(path, async (res) => parseJson(await res.text(), res, check, 'answer'), init);

  async function readPhoto(res: Response): Promise<Outcome<Blob>> {
    const type = res.headers.get('content-type') ?? '';
    if (!type.startsWith('image/'))
      return {
        ok: false,
        failure: {
          code: 'bad-answer',
          message: `the server sent ${type || 'no type'}, not a photo`,
        },
      };
    return { ok: true, value: await res.blob() };
  }

  return {
    lab: () => call('/lab', checkLabInfo),
    push: (device, changes) => call('/push', checkPushResponse, { json: { device, changes } }),
    pull: (since) => call(`/changes?since=${encodeURIComponent(since)}`, checkPullResponse),
    beginPhoto: (request) => call('/photos', checkPhotoUploadState, { json: request }),
    photoState: (photoId) =>
      call(`/photos/${encodeURIComponent(photoId)}/upload`, checkPhotoUploadState),
    sendChunk: (photoId, offset, bytes) =>
      call(`/photos/${encodeURIComponent(photoId)}?offset=${offset}`, checkPhotoUploadState, {
        method: 'PUT',
        bytes,
      }),
    photo: (photoId) => exchange(`/photos/${encodeURIComponent(photoId)}`, readPhoto),
  };
}
