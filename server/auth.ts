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
    // Asked of the store on every request, never remembered: a token revoked from the command
    // line is refused from the next request on, by a server that was running all along.
    const access = await store.tokenAccess(tokenHash(token));
    if (!access)
      throw new SyncRefusal(
        'bad-token',
        'this token is not known to the server: ask for a new one',
      );
    if (access.revokedAt !== null)
      throw new SyncRefusal(
        'bad-token',
        `this token was revoked on ${access.revokedAt.slice(0, 10)}: ask the lab for a new one`,
      );
    request.lab = access.lab;
  });
}
