import { describe, expect, it } from 'vitest';
import { headsAfter } from './heads.ts';

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
    expect(headsAfter(current, replaces, added)).toEqual(expected);
  });
});
