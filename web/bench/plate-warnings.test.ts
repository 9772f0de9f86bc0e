import { describe, expect, it } from 'vitest';
import { plateWarnings } from './plate-warnings.ts';

describe('a plate with a warning is not checked with one tap', () => {
  it('a clean plate with colonies needs no second tap', () => {
    expect(plateWarnings([], 120)).toEqual([]);
    // Remarks on single colonies are marked where they are, not a reason for a second tap.
    expect(
      plateWarnings(
        [
          { kind: 'ink', values: { pieces: 3 }, detail: null },
          { kind: 'low-confidence', values: { colonies: 2 }, detail: null },
        ],
        90,
      ),
    ).toEqual([]);
  });

  it('an empty plate, or a whole-plate remark, is named for the second tap', () => {
    expect(plateWarnings([], 0)).toEqual(['no colonies found']);
    expect(
      plateWarnings([{ kind: 'glare', values: { fraction: 0.12 }, detail: null }], 80),
    ).toEqual(['lid glare']);
  });

  it('learning that disagrees with the default rules is a whole-plate warning, named in words', () => {
    const flag = { kind: 'learned-differs', values: { added: 9, dropped: 4 }, detail: null };
    expect(plateWarnings([flag], 80)).toEqual(['learning disagrees']);
  });
});
