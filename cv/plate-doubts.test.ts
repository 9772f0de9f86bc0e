import { describe, expect, it } from 'vitest';
import { plateDoubts } from './plate-doubts.ts';

const calm = { counted: 50, foregroundShare: 0.05, setAside: 2, threshold: 4 };
const contrasts = (n: number, faint: number) =>
  Array.from({ length: n }, (_, i) => (i < faint ? 5 : 20));

describe('doubts about a plate as a whole', () => {
  it('says nothing about a plate read plainly', () => {
    expect(plateDoubts({ ...calm, contrasts: contrasts(50, 5) })).toEqual([]);
  });

  it('flags a plate where nothing was counted but the agar shows structure', () => {
    const flags = plateDoubts({ ...calm, counted: 0, foregroundShare: 0.01, contrasts: [] });
    expect(flags).toEqual([{ kind: 'nothing-found', foregroundShare: 0.01 }]);
    // A bare plate: nothing differs from the agar, nothing to flag.
    expect(plateDoubts({ ...calm, counted: 0, foregroundShare: 0.0005, contrasts: [] })).toEqual(
      [],
    );
  });

  it('flags more objects set aside than counted', () => {
    const flags = plateDoubts({ ...calm, counted: 8, setAside: 30, contrasts: contrasts(8, 0) });
    expect(flags).toEqual([{ kind: 'many-rejected', setAside: 30, counted: 8 }]);
  });

  it('flags a count that leans on the threshold: 40 % of colonies within 1.5 × of it', () => {
    const flags = plateDoubts({ ...calm, contrasts: contrasts(50, 20) });
    expect(flags).toEqual([{ kind: 'unstable-count', share: 0.4 }]);
  });
});
