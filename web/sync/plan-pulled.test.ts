import { describe, expect, it } from 'vitest';
import type { Revision } from '../../schema/sync-protocol.ts';
import { at } from '../../tests/sync/marrowfield.ts';
import { latestHead, planPulled } from './plan-pulled.ts';

const head = (hash: string, minutes: number): Revision => ({
  hash: hash.repeat(64),
  revision: 2,
  updatedAt: at(minutes),
  deleted: false,
  body: {},
  device: 'phone-b',
});
const pulled = (...heads: Revision[]) => ({ kind: 'plates' as const, id: 'mf-plate-1', heads });

describe('planPulled: what a phone does with a record a pull brought', () => {
  const a = head('a', 10);
  const b = head('b', 12);
  const cases: [string, Revision[], boolean, string[], string, number?][] = [
    ['a record new to the phone', [a], false, [], 'take'],
    ['a newer revision of a record the phone has', [b], false, [a.hash], 'take'],
    ['the phone’s own push coming back', [a], false, [a.hash], 'skip'],
    ['a newer revision while a local edit waits', [b], true, [a.hash], 'keep-local'],
    ['two heads', [a, b], false, [a.hash], 'conflict'],
    ['two heads while a local edit waits', [a, b], true, [a.hash], 'conflict'],
    [
      'a phone that was in a conflict, now resolved elsewhere',
      [b],
      false,
      [a.hash, b.hash],
      'take',
    ],
    [
      'an older revision than the server had confirmed: sent again',
      [b],
      false,
      ['c'.repeat(64)],
      'resend',
      3,
    ],
    [
      'the same, while a local edit waits: the edit goes as it is',
      [b],
      true,
      ['c'.repeat(64)],
      'keep-local',
      3,
    ],
  ];
  it.each(cases)('%s', (_name, heads, waiting, bases, action, knownRevision = 1) => {
    expect(planPulled(pulled(...heads), { waiting, bases, knownRevision }).action).toBe(action);
  });

  it('shows the latest head of a conflict, the same on every phone whatever the order', () => {
    const tie = { ...head('c', 12) };
    expect(latestHead([a, b]).hash).toBe(b.hash);
    expect(latestHead([b, a]).hash).toBe(b.hash);
    expect(latestHead([b, tie]).hash).toBe(latestHead([tie, b]).hash);
  });
});
