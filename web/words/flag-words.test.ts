import { describe, expect, it } from 'vitest';
import {
  assayFlagLabels,
  plateFlagLabel,
  plateFlagSentence,
  resultFlagLabel,
} from './flag-words.ts';

describe('flag codes in words', () => {
  it('every known code has words; an unknown one loses its dashes', () => {
    expect(plateFlagLabel('clumps-estimated')).toBe('clumps estimated');
    expect(plateFlagLabel('low-confidence')).toBe('unsure colours');
    expect(resultFlagLabel('out-of-range')).toBe('plate outside the countable range');
    expect(plateFlagLabel('new-kind-of-remark')).toBe('new kind of remark');
  });

  it('sentences put numbers with nouns in the right number', () => {
    expect(plateFlagSentence({ kind: 'clumps-estimated', clumps: 1, colonies: 3 })).toBe(
      '1 clump that could not be split, counted from their shape as 3 colonies.',
    );
    expect(plateFlagSentence({ kind: 'glare', fraction: 0.124 })).toContain('12%');
    expect(plateFlagSentence({ kind: 'new-thing', count: 2 })).toBe('new thing: count 2');
    expect(plateFlagSentence({ kind: 'learned-differs', added: 1, dropped: 7 })).toBe(
      'What the experiment learned disagrees with the usual rules here (1 object added, 7 dropped): check the colonies.',
    );
  });

  it('an assay names each remark once, however many of its plates carry it', () => {
    expect(
      assayFlagLabels(
        [{ code: 'out-of-range' }],
        [{ kind: 'ink' }, { kind: 'ink' }, { kind: 'glare' }],
      ),
    ).toEqual(['plate outside the countable range', 'writing on the lid', 'lid glare']);
  });
});
