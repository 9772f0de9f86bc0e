import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  dismissWriteFailure,
  saving,
  subscribeWriteFailure,
  writeFailure,
} from './write-failure.ts';

describe('saving: a write started from a tap', () => {
  it('awaits the write and, when it fails, says what was not saved and why', async () => {
    let told = 0;
    const stop = subscribeWriteFailure(() => {
      told += 1;
    });
    expect(await saving('the plate marked reviewed', async () => {})).toBe(true);
    expect(writeFailure()).toBeNull();
    const quota = new Error('the browser refused more storage (QuotaExceededError)');
    expect(await saving('the plate marked reviewed', () => Promise.reject(quota))).toBe(false);
    expect(writeFailure()).toEqual({
      what: 'the plate marked reviewed',
      reason: 'the browser refused more storage (QuotaExceededError)',
    });
    dismissWriteFailure();
    expect(writeFailure()).toBeNull();
    expect(told).toBe(2);
    stop();
  });

  it('is the only way a screen writes: no write in web/ui is started and left unawaited', () => {
    const ui = resolve(import.meta.dirname, '../ui');
    const fired = readdirSync(ui)
      .filter((f) => f.endsWith('.tsx'))
      .flatMap((f) =>
        readFileSync(join(ui, f), 'utf8')
          .split('\n')
          .flatMap((line, i) => (/void\s+store\./.test(line) ? [`${f}:${i + 1}`] : [])),
      );
    expect(fired).toEqual([]);
  });
});
