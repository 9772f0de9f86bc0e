/**
 * Every sync request carries a lab's bearer token; the lab it belongs to is the only one the
 * request may read or write. Checked on arrival, before the body is read, so a stranger's upload
 * costs the server nothing.
 */
import type { FastifyInstance } from 'fastify';
import { SyncRefusal } from './refusal.ts';
import type { Lab, SyncStore } from './storage/sync-store.ts';
import { bearerToken, tokenHash } from './tokens.ts';

declare module 'fastify' {
  interface FastifyRequest {
    /** The lab of the request's token; set by the auth hook on every sync route. */
    lab: Lab;
  }
}

export function requireLabToken(scope: FastifyInstance, store: SyncStore): void {
  scope.decorateRequest('lab', null as unknown as Lab);
  scope.addHook('onRequest', async (request) => {
    const token = bearerToken(request.headers.authorization);
    if (!token)
      throw new SyncRefusal('no-token', 'send the lab token as "Authorization: Bearer <token>"');
    const lab = await store.labForToken(tokenHash(token));
    if (!lab)
      throw new SyncRefusal(
        'bad-token',
        'this token is not known to the server: ask for a new one',
      );
    request.lab = lab;
  });
}
