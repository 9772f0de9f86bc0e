/**
 * Bearer tokens for a lab. A token is shown once when made; the server keeps only its SHA-256,
 * so a copy of the database does not give access to any lab.
 */
import { createHash, randomBytes } from 'node:crypto';

const PREFIX = 'rpt_';

/** 32 random bytes (256 bits), base64url, with a prefix that makes a leaked token recognisable. */
export function newToken(): string {
  return PREFIX + randomBytes(32).toString('base64url');
}

export function tokenHash(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** The token in an `Authorization: Bearer ...` header (RFC 6750), or null when there is none. */
export function bearerToken(header: string | undefined): string | null {
  const m = /^Bearer\s+(\S+)\s*$/i.exec(header ?? '');
  return m ? m[1]! : null;
}

/** Hex characters of the hash that name a token to its operator; 32 bits tell a lab's apart. */
const ID_LENGTH = 8;

/** A token's public id: the start of its hash, so tokens made before ids existed have one too. */
export function tokenId(hash: string): string {
  return hash.slice(0, ID_LENGTH);
}

/** True for text shaped like a token id (what `list-tokens` prints). */
export function isTokenId(text: string): boolean {
  return new RegExp(`^[0-9a-f]{${ID_LENGTH}}$`).test(text);
}
