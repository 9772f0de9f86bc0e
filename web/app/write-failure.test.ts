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
});
