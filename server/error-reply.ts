/**
 * The one place where anything that went wrong becomes an HTTP answer in the protocol's error
 * shape. Fastify's own refusals (bad JSON, body too large, wrong content type) are named in
 * plain words, so a person reading the app's sync status can tell what to fix.
 */
import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import { SYNC_LIMITS, type SyncErrorBody } from '../schema/sync-protocol.ts';
import { drainBody } from './drain.ts';
import { SyncRefusal } from './refusal.ts';

function refusalFor(error: FastifyError): SyncRefusal {
  if (error instanceof SyncRefusal) return error;
  switch (error.code) {
    case 'FST_ERR_VALIDATION':
      return new SyncRefusal('invalid-request', error.message);
    case 'FST_ERR_CTP_BODY_TOO_LARGE':
      return new SyncRefusal('too-large', 'the request body is larger than this request allows');
    case 'FST_ERR_CTP_INVALID_MEDIA_TYPE':
      return new SyncRefusal(
        'unsupported-type',
        'send JSON (application/json), or a photo chunk as application/octet-stream',
      );
    case 'FST_ERR_CTP_EMPTY_JSON_BODY':
      return new SyncRefusal(
        'invalid-request',
        'the request body is empty; a JSON object was expected',
      );
  }
  if (error instanceof SyntaxError || error.code === 'FST_ERR_CTP_INVALID_JSON_BODY')
    return new SyncRefusal(
      'invalid-request',
      `the request body is not valid JSON: ${error.message}`,
    );
  if ((error.statusCode ?? 500) < 500) return new SyncRefusal('invalid-request', error.message);
  return new SyncRefusal('server-fault', 'the server failed on this request; it has been logged');
}

export function installErrorReply(app: FastifyInstance): void {
  app.setErrorHandler<FastifyError>(async (error, request, reply) => {
    const refusal = refusalFor(error);
    if (refusal.code === 'server-fault') request.log.error(error);
    // A body refused for its size is read to its end (up to twice the largest allowed), so the
    // client gets the 413 instead of a reset connection.
    if (refusal.code === 'too-large') await drainBody(request.raw, 2 * SYNC_LIMITS.pushBytes);
    const body: SyncErrorBody = refusal.body();
    return reply.code(refusal.status).send(body);
  });
}

/**
 * Fastify answers a few malformed requests before any route or error handler sees them (an
 * address with bad percent-encoding); this gives those answers the protocol's shape too.
 */
export function frameworkErrors(
  error: FastifyError,
  _request: FastifyRequest,
  reply: FastifyReply,
): void {
  const refusal =
    error.code === 'FST_ERR_BAD_URL'
      ? new SyncRefusal(
          'invalid-request',
          'the address is not valid: a %-escape in it is malformed or is not UTF-8',
        )
      : refusalFor(error);
  const body: SyncErrorBody = refusal.body();
  reply.code(refusal.status).send(body);
}
