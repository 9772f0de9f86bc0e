import { describe, expect, it } from 'vitest';
import { learningSentence, readByWords, refitSentence, rereadLabel } from './learning-words.ts';

describe('the words for learning', () => {
  it('name what read a plate, with the plates in the right number', () => {
    expect(readByWords(null)).toBe('the default analysis');
    expect(readByWords(1)).toBe('learned from 1 checked plate');
    expect(readByWords(6)).toBe('learned from 6 checked plates');
    expect(rereadLabel(1)).toBe('Re-read with what 1 checked plate taught');
    expect(rereadLabel(null)).toBe('Re-read with the default analysis');
  });

  it('say why nothing was learned, and when learning is off or its model unreadable', () => {
    expect(refitSentence({ ok: false, reason: 'every object measured was a colony' })).toBe(
      'Nothing learned from the checked plates yet: every object measured was a colony.',
    );
    const off = { enabled: false, model: null, since: null };
    expect(learningSentence(off, null)).toMatch(/^Learning is off/);
    const on = { enabled: true, model: 'x', since: null };
    expect(
      learningSentence(on, { ok: false, error: 'damaged model: "sd" holds a value ≤ 0' }),
    ).toBe(
      'The learned model cannot be read (damaged model: "sd" holds a value ≤ 0). Plates are read with the default analysis; reset learning to start again.',
    );
  });
});
