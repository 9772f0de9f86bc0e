import { describe, expect, it } from 'vitest';
import { markerColours, mediumById, renamedColours } from './media.ts';

describe('the experiment names its two colours', () => {
  it('blank names take the medium defaults; typed ones are kept, trimmed', () => {
    const ta = mediumById('ta');
    expect(markerColours(ta, ['', ''])).toEqual(ta.colours);
    const named = markerColours(ta, [' Ara− ', 'Ara+']);
    expect(named).toEqual([
      { name: 'Ara−', hex: ta.colours[0].hex },
      { name: 'Ara+', hex: ta.colours[1].hex },
    ]);
  });

  it('two equal names are refused; an unknown medium falls back to neutral names', () => {
    expect(markerColours(mediumById('x-gal'), ['White', ''])).toBe(
      'Give the two colours different names.',
    );
    expect(mediumById('nonesuch').colours[0].name).toBe('colour 1');
  });
});

describe('renaming the colours later', () => {
  it('keeps their look and their order; blank keeps a name; equal names are refused', () => {
    const ta = mediumById('ta').colours;
    expect(renamedColours(ta, ['Ara-', ''])).toEqual([
      { name: 'Ara-', hex: ta[0].hex },
      { name: 'white', hex: ta[1].hex },
    ]);
    expect(renamedColours(ta, ['', 'RED'])).toBe('Give the two colours different names.');
  });
});
