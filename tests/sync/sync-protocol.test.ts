/** The shared sync messages: what the checks let through and how they name what is wrong. */
import { describe, expect, it } from 'vitest';
import { SchemaError } from '../../schema/check.ts';
import {
  checkChange,
  checkCursor,
  checkPullResponse,
  checkPushRequest,
  SYNC_ERRORS,
  SYNCED_KINDS,
} from '../../schema/sync-protocol.ts';
import { benchSession, changeOf, plate, tombstoneOf } from './marrowfield.ts';

const problem = (run: () => unknown): string => {
  try {
    run();
  } catch (e) {
    if (e instanceof SchemaError) return e.message;
    throw e;
  }
  return 'no problem';
};

describe('sync protocol checks', () => {
  it('syncs every record kind the schema marks as synced, and photos apart', () => {
    expect(SYNCED_KINDS).toEqual([
      'experiments',
      'assays',
      'samples',
      'plates',
      'analyses',
      'corrections',
    ]);
  });

  it('passes a bench session and a tombstone, dropping unknown body fields', () => {
    const changes = [...benchSession(2), tombstoneOf('plates', 'mf-plate-9', 2, 5, [])];
    const extra = { ...changes[4]!, body: { ...(changes[4]!.body as object), note: 'x' } };
    const parsed = checkPushRequest({ device: 'phone-a', changes: [...changes, extra] }, 'body');
    expect(parsed.changes.slice(0, 7)).toEqual(changes);
    expect(parsed.changes[7]!.body).toEqual(changes[4]!.body);
  });

  it('names the change, its record and the field', () => {
    const c = changeOf('plates', plate('mf-plate-3', { volumeUl: -5 }));
    expect(problem(() => checkChange(c, 'changes[2]'))).toBe(
      'changes[2] (plates mf-plate-3).body.volumeUl: must be greater than 0, got -5',
    );
    expect(
      problem(() => checkChange({ ...c, body: { ...plate('mf-plate-3'), revision: 4 } }, 'c')),
    ).toBe("c (plates mf-plate-3).body.revision: must equal the change's revision 1");
    expect(problem(() => checkChange(null, 'c'))).toBe('c: expected an object, got null');
  });

  it('reads a cursor only in the form a pull gave', () => {
    expect(checkCursor(undefined, 'since')).toEqual({ seq: 0, mark: null });
    expect(checkCursor('42', 'since')).toEqual({ seq: 42, mark: null });
    expect(checkCursor('42-0123456789abcdef', 'since')).toEqual({
      seq: 42,
      mark: '0123456789abcdef',
    });
    for (const bad of ['-1', '1.5', '', '1e3', '9'.repeat(16), '42-0123', '42-0123456789ABCDEF'])
      expect(problem(() => checkCursor(bad, 'since'))).toMatch(/^since: expected a cursor/);
  });

  it('checks what the server answers as strictly as what it is sent', () => {
    const head = {
      hash: 'f'.repeat(64),
      revision: 1,
      updatedAt: '2026-03-02T09:00:00.000Z',
      deleted: false,
      body: {},
      device: 'a',
    };
    expect(
      checkPullResponse(
        { records: [{ kind: 'plates', id: 'p', heads: [head] }], cursor: '3', more: false },
        'answer',
      ).records,
    ).toHaveLength(1);
    expect(
      problem(() =>
        checkPullResponse(
          { records: [{ kind: 'plates', id: 'p', heads: [] }], cursor: '3', more: false },
          'answer',
        ),
      ),
    ).toBe('answer.records[0].heads: expected 1 to 64 entries, got 0');
  });

  it('gives every error code a 4xx or 5xx status', () => {
    for (const status of Object.values(SYNC_ERRORS)) expect(status).toBeGreaterThanOrEqual(400);
  });
});
