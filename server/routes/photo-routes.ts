/**
 * Photo uploads, when the lab has them on: announce the photo with its size and SHA-256, send it
 * in chunks at the offset the server reports, and the server checks the hash when the last byte
 * lands. An interrupted upload resumes from what the server holds; a chunk is stored whole or
 * not at all.
 */
import { Readable } from 'node:stream';
import type { FastifyInstance } from 'fastify';
import {
  checkChunkQuery,
  checkPhotoPath,
  checkPhotoUploadRequest,
  type PhotoUploadRequest,
  type PhotoUploadState,
  SYNC_LIMITS,
} from '../../schema/sync-protocol.ts';
import { SyncRefusal } from '../refusal.ts';
import type { Lab, SyncStore, Upload } from '../storage/sync-store.ts';

const stateOf = (u: Upload): PhotoUploadState => ({
  photoId: u.photoId,
  bytes: u.bytes,
  received: u.received,
  complete: u.complete,
});

function requirePhotos(lab: Lab): void {
  if (!lab.photosEnabled)
    throw new SyncRefusal('photos-off', `lab "${lab.name}" keeps photos on the phones only`);
}

export function photoRoutes(scope: FastifyInstance, store: SyncStore): void {
  scope.addContentTypeParser(
    'application/octet-stream',
    { parseAs: 'buffer', bodyLimit: SYNC_LIMITS.chunkBytes },
    (_request, body, done) => done(null, body),
  );

  async function existing(lab: Lab, photoId: string): Promise<Upload> {
    const upload = await store.upload(lab.id, photoId);
    if (!upload) throw new SyncRefusal('not-found', `no upload was started for photo ${photoId}`);
    return upload;
  }

  scope.post<{ Body: PhotoUploadRequest }>(
    '/photos',
    { schema: { body: checkPhotoUploadRequest } },
    async (request) => {
      const { lab, body } = request;
      requirePhotos(lab);
      if (body.bytes > lab.photoMaxBytes)
        throw new SyncRefusal(
          'too-large',
          `photo ${body.photoId} is ${body.bytes} bytes; lab "${lab.name}" takes photos up to ${lab.photoMaxBytes} bytes`,
        );
      return stateOf(await store.beginUpload(lab.id, body));
    },
  );

  scope.get<{ Params: { photoId: string } }>(
    '/photos/:photoId/upload',
    { schema: { params: checkPhotoPath } },
    async (request) => stateOf(await existing(request.lab, request.params.photoId)),
  );

  scope.put<{ Params: { photoId: string }; Querystring: { offset: number }; Body: Buffer }>(
    '/photos/:photoId',
    {
      schema: { params: checkPhotoPath, querystring: checkChunkQuery },
      bodyLimit: SYNC_LIMITS.chunkBytes,
    },
    async (request) => {
      const { lab, params, query, body } = request;
      requirePhotos(lab);
      if (!Buffer.isBuffer(body) || body.length === 0)
        throw new SyncRefusal(
          'invalid-request',
          'a chunk is a non-empty application/octet-stream body',
        );
      const upload = await store.appendChunk(lab.id, params.photoId, query.offset, body);
      if (upload.mismatch)
        throw new SyncRefusal(
          'upload-mismatch',
          `the bytes of photo ${params.photoId} do not match its SHA-256; the upload starts over`,
        );
      return stateOf(upload);
    },
  );

  scope.get<{ Params: { photoId: string } }>(
    '/photos/:photoId',
    { schema: { params: checkPhotoPath } },
    async (request, reply) => {
      const upload = await existing(request.lab, request.params.photoId);
      if (!upload.complete)
        throw new SyncRefusal('not-found', `photo ${upload.photoId} is not fully uploaded yet`);
      return reply
        .type(upload.type)
        .header('content-length', upload.bytes)
        .send(Readable.from(store.photoChunks(request.lab.id, upload.photoId)));
    },
  );
}
