import { describe, expect, it } from 'vitest';
import { SYNC_LIMITS } from '../schema/sync-protocol.ts';
import { headsAfter } from './heads.ts';
import { SyncRefusal } from './refusal.ts';

const record = { kind: 'plates', id: 'p1' };

describe('headsAfter: how a record’s heads move when a revision arrives', () => {
  const cases: [string, string[], string[], string, string[]][] = [
    ['a new record', [], [], 'a', ['a']],
    ['an edit of the only head', ['a'], ['a'], 'b', ['b']],
    ['an edit of an older revision: a conflict', ['b'], ['a'], 'c', ['b', 'c']],
    ['a second new record with the same id: a conflict', ['a'], [], 'b', ['a', 'b']],
    ['a resolution replacing both heads', ['b', 'c'], ['b', 'c'], 'd', ['d']],
    ['a resolution replacing one of two heads', ['b', 'c'], ['b'], 'd', ['c', 'd']],
    ['a replaced hash this server never saw is ignored', ['a'], ['zz', 'a'], 'b', ['b']],
    ['the same revision again is not doubled', ['a', 'b'], [], 'b', ['a', 'b']],
  ];
  it.each(cases)('%s', (_name, current, replaces, added, expected) => {
    expect(headsAfter(record, current, replaces, added)).toEqual(expected);
  });

  it('refuses one head past the cap the pull check allows, and takes a resolution of them all', () => {
    const full = Array.from({ length: SYNC_LIMITS.headsPerRecord }, (_, i) => `h${i}`);
    expect(() => headsAfter(record, full, [], 'extra')).toThrow(SyncRefusal);
    expect(() => headsAfter(record, full, [], 'extra')).toThrow(/plates p1 already has 64/);
    expect(headsAfter(record, full.slice(1), [], 'last')).toHaveLength(64);
    expect(headsAfter(record, full, full, 'settled')).toEqual(['settled']);
  });
});
