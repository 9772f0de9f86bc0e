import { describe, expect, it } from 'vitest';
import { SYNC_ERRORS, type SyncErrorCode } from '../../schema/sync-protocol.ts';
import { describeFailure, isPassing, OFF, type SyncStatus, syncNote } from './status.ts';

describe('sync status wording', () => {
  const codes = [
    ...(Object.keys(SYNC_ERRORS) as SyncErrorCode[]),
    'unreachable',
    'bad-answer',
  ] as const;

  it('has a message for every way sync can fail, keeping the server’s detail where it helps', () => {
    for (const code of codes) {
      const problem = describeFailure({ code, message: 'detail from the server' });
      expect(problem.code).toBe(code);
      expect(problem.message.length).toBeGreaterThan(20);
    }
    expect(
      describeFailure({ code: 'invalid-request', message: 'plates p1: bad' }).message,
    ).toContain('plates p1: bad');
  });

  it('retries by itself only where waiting can help; a bad token or an old app waits for the person', () => {
    const passing = codes.filter((code) => isPassing({ code, message: '' }));
    expect(passing.sort()).toEqual([
      'bad-answer',
      'cursor-unknown',
      'server-fault',
      'storage-full',
      'unreachable',
    ]);
  });
});

describe('the top bar note', () => {
  const base: SyncStatus = { ...OFF, phase: 'idle' };
  it('is silent when sharing is off or everything is shared', () => {
    expect(syncNote(OFF)).toBeNull();
    expect(syncNote(base)).toBeNull();
  });
  it('says what waits, what is offline, what needs settling, and a refusal', () => {
    expect(syncNote({ ...base, waiting: 3 })).toBe('3 waiting');
    expect(syncNote({ ...base, phase: 'offline', waiting: 2 })).toBe('offline · 2 waiting');
    expect(syncNote({ ...base, phase: 'offline' })).toBe('offline');
    expect(syncNote({ ...base, phase: 'syncing', waiting: 2 })).toBe('sharing…');
    expect(syncNote({ ...base, conflicts: [{ kind: 'plates', id: 'p', heads: 2 }] })).toBe(
      '1 to settle',
    );
    expect(syncNote({ ...base, phase: 'refused', waiting: 4 })).toBe(
      'not shared: see the start screen',
    );
  });
});
