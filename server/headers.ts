/**
 * Headers on every answer. `nosniff` keeps a browser from reading a JSON answer or a photo as a
 * page or a script; answers about lab records and photos are never kept by a browser or proxy
 * cache, since they carry a lab's data and change with every push.
 */
import type { FastifyInstance } from 'fastify';

export function installHeaders(app: FastifyInstance): void {
  app.addHook('onSend', async (request, reply) => {
    reply.header('X-Content-Type-Options', 'nosniff');
    if (request.url.startsWith('/sync/')) reply.header('Cache-Control', 'no-store');
  });
}
