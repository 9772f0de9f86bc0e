import { describe, expect, it } from 'vitest';
import { unreadableJson } from './unreadable-file.ts';

describe('the file of unreadable records', () => {
  it('keeps each record as stored, with its reason, and describes binary fields', () => {
    const raw = {
      id: 'ph-1',
      plateId: 'p-1',
      blob: new Blob([new Uint8Array(5)], { type: 'image/jpeg' }),
    };
    const text = unreadableJson(
      [
        {
          kind: 'photos',
          id: 'ph-1',
          reason: 'stored photos record ph-1: name: expected text',
          raw,
        },
      ],
      new Date('2026-03-02T09:00:00.000Z'),
    );
    expect(JSON.parse(text)).toEqual({
      format: 'rivalplate-unreadable',
      exportedAt: '2026-03-02T09:00:00.000Z',
      records: [
        {
          kind: 'photos',
          id: 'ph-1',
          reason: 'stored photos record ph-1: name: expected text',
          raw: { id: 'ph-1', plateId: 'p-1', blob: { binary: true, bytes: 5, type: 'image/jpeg' } },
        },
      ],
    });
  });
});
