import { describe, expect, it } from 'vitest';
import { codeValues } from '../../schema/check.ts';
import {
  assayFlagLabels,
  plateFlagLabel,
  plateFlagSentence,
  resultFlagLabel,
  storedFlagSentence,
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
    expect(plateFlagSentence({ kind: 'coarse-photo', pxPerMm: 4.46 })).toContain(
      '4.5 pixels per mm',
    );
    expect(plateFlagSentence({ kind: 'new-thing', count: 2 })).toBe('new thing: count 2');
    expect(plateFlagSentence({ kind: 'learned-differs', added: 1, dropped: 7 })).toBe(
      'What the experiment learned disagrees with the usual rules here (1 object added, 7 dropped): check the colonies.',
    );
    expect(plateFlagSentence({ kind: 'learned-recolours', recoloured: 28, colonies: 80 })).toBe(
      "Sorted by this plate's own two colours: the experiment's learned colours would sort 28 colonies of 80 otherwise. Check the colours.",
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

describe('remarks stored as codes with their numbers', () => {
  it('are worded at the screen; a sentence an older version stored is shown as it was', () => {
    expect(storedFlagSentence({ kind: 'ink', values: { pieces: 1 }, detail: null })).toBe(
      'Writing on the lid left out in 1 piece: check for colonies under it.',
    );
    expect(storedFlagSentence({ kind: 'ink', values: {}, detail: 'Old words.' })).toBe(
      'Old words.',
    );
  });

  it('the stored form is checked: numbers finite, at most 8, old records read with none', () => {
    expect(codeValues(undefined, 'flags[0].values')).toEqual({});
    expect(codeValues({ fraction: 0.12, reason: 'one' }, 'v')).toEqual({
      fraction: 0.12,
      reason: 'one',
    });
    expect(() => codeValues({ share: Number.NaN }, 'flags[0].values')).toThrow(
      /flags\[0\]\.values\.share/,
    );
    expect(() => codeValues([1], 'v')).toThrow(/object of numbers/);
  });
});
