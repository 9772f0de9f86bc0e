/** The record side of the protocol: the lab's settings, pushes and pulls. */
import type { FastifyInstance } from 'fastify';
import {
  type Cursor,
  checkPullQuery,
  checkPushRequest,
  type LabInfo,
  type PushRequest,
  SYNC_LIMITS,
  SYNC_PROTOCOL,
} from '../../schema/sync-protocol.ts';
import { revisionHash } from '../revision-hash.ts';
import type { SyncStore } from '../storage/sync-store.ts';

export function recordRoutes(scope: FastifyInstance, store: SyncStore): void {
  scope.get('/lab', async (request): Promise<LabInfo> => {
    const { name, photosEnabled, photoMaxBytes } = request.lab;
    return {
      lab: name,
      protocol: SYNC_PROTOCOL,
      photos: { enabled: photosEnabled, maxBytes: photosEnabled ? photoMaxBytes : 0 },
    };
  });

  scope.post<{ Body: PushRequest }>(
    '/push',
    { schema: { body: checkPushRequest }, bodyLimit: SYNC_LIMITS.pushBytes },
    async (request) => {
      const { device, changes } = request.body;
      request.log.info({ lab: request.lab.name, changes: changes.length }, 'push started');
      const hashed = changes.map((change) => ({ change, hash: revisionHash(change) }));
      return store.push(request.lab.id, device, hashed);
    },
  );

  scope.get<{ Querystring: { since: Cursor; limit: number } }>(
    '/changes',
    { schema: { querystring: checkPullQuery } },
    async (request) =>
      store.pull(request.lab.id, request.query.since, request.query.limit, SYNC_LIMITS.pullBytes),
  );
}
