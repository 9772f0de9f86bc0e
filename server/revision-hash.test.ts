import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { changeOf, plate } from '../tests/sync/marrowfield.ts';
import { canonicalJson, revisionHash } from './revision-hash.ts';

describe('canonicalJson', () => {
  it('sorts object keys at every depth and keeps array order', () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { f: 1, e: 2 }], c: null } })).toBe(
      '{"a":{"c":null,"d":[3,{"e":2,"f":1}]},"b":1}',
    );
    expect(canonicalJson({ a: undefined, b: 'x' })).toBe('{"b":"x"}');
  });
});

describe('revisionHash', () => {
  it('is SHA-256 (FIPS 180-4) of the canonical content, as node:crypto computes it', () => {
    const c = changeOf('plates', plate('mf-plate-1'));
    const { kind, id, revision, updatedAt, deleted, body } = c;
    const expected = createHash('sha256')
      .update(canonicalJson({ kind, id, revision, updatedAt, deleted, body }))
      .digest('hex');
    expect(revisionHash(c)).toBe(expected);
    expect(revisionHash(c)).toMatch(/^[0-9a-f]{64}$/);
  });

  it('names what a revision is, not where it came from', () => {
    const c = changeOf('plates', plate('mf-plate-1'));
    expect(revisionHash({ ...c, replaces: ['a'.repeat(64)] })).toBe(revisionHash(c));
    expect(revisionHash({ ...c, revision: 2 })).not.toBe(revisionHash(c));
    const other = changeOf('plates', plate('mf-plate-1', { reviewed: true }));
    expect(revisionHash(other)).not.toBe(revisionHash(c));
  });
});
