import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { bearerToken, newToken, tokenHash } from './tokens.ts';

describe('lab tokens', () => {
  it('are 256 random bits, different each time, kept as their SHA-256', () => {
    const a = newToken();
    const b = newToken();
    expect(a).not.toBe(b);
    expect(Buffer.from(a.slice(4), 'base64url')).toHaveLength(32);
    expect(tokenHash(a)).toBe(createHash('sha256').update(a).digest('hex'));
  });

  it('are read from an Authorization header as RFC 6750 section 2.1 writes it', () => {
    expect(bearerToken('Bearer rpt_abc')).toBe('rpt_abc');
    expect(bearerToken('bearer rpt_abc')).toBe('rpt_abc');
    expect(bearerToken('Basic eDp5')).toBeNull();
    expect(bearerToken('Bearer')).toBeNull();
    expect(bearerToken('Bearer a b')).toBeNull();
    expect(bearerToken(undefined)).toBeNull();
  });
});
