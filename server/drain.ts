/**
 * Reads and drops what is left of a request body. A server that answers 413 and closes while the
 * client is still sending makes the client's TCP stack see a reset, and the client never reads
 * the answer; reading the rest first lets the 413 arrive. Past `maxBytes` the body is left unread
 * (the connection then closes), so a client cannot keep the server reading for ever.
 */
import type { IncomingMessage } from 'node:http';

export function drainBody(raw: IncomingMessage, maxBytes: number): Promise<void> {
  const declared = Number(raw.headers['content-length'] ?? 0);
  if (raw.complete || raw.readableEnded || declared > maxBytes) return Promise.resolve();
  return new Promise((done) => {
    let seen = 0;
    const stop = () => {
      raw.off('data', onData);
      raw.off('end', stop);
      raw.off('error', stop);
      raw.off('close', stop);
      done();
    };
    const onData = (chunk: Buffer) => {
      seen += chunk.length;
      if (seen > maxBytes) stop();
    };
    raw.on('data', onData);
    raw.once('end', stop);
    raw.once('error', stop);
    raw.once('close', stop);
    raw.resume();
  });
}
