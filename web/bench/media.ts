import { type MarkerColour, UNNAMED_MARKERS } from '../../schema/records.ts';

/** A plating medium whose two marker colours most labs name the same way. */
export interface IndicatorMedium {
  id: string;
  label: string;
  colours: [MarkerColour, MarkerColour];
}

/**
 * The common indicator media and the colours their two marker states grow in; the names are
 * only the form's defaults, and the person may change them.
 */
export const INDICATOR_MEDIA: readonly IndicatorMedium[] = [
  {
    id: 'ta',
    label: 'Tetrazolium arabinose (TA)',
    colours: [
      { name: 'red', hex: '#b3362c' },
      { name: 'white', hex: '#efe3d3' },
    ],
  },
  {
    id: 'x-gal',
    label: 'X-gal',
    colours: [
      { name: 'blue', hex: '#3f6fb0' },
      { name: 'white', hex: '#efe6cf' },
    ],
  },
  {
    id: 'macconkey',
    label: 'MacConkey',
    colours: [
      { name: 'pink', hex: '#c84c78' },
      { name: 'pale', hex: '#eadcc2' },
    ],
  },
  { id: 'other', label: 'Another medium', colours: UNNAMED_MARKERS },
];

export function mediumById(id: string): IndicatorMedium {
  return INDICATOR_MEDIA.find((m) => m.id === id) ?? INDICATOR_MEDIA[INDICATOR_MEDIA.length - 1]!;
}

/**
 * The experiment's two colours from the form: the medium's look with the typed names (blank
 * names take the medium's). Refuses two equal names, which would make the columns ambiguous.
 */
export function markerColours(
  medium: IndicatorMedium,
  names: readonly [string, string],
): [MarkerColour, MarkerColour] | string {
  const [a, b] = names.map((n, i) => n.trim() || medium.colours[i]!.name) as [string, string];
  if (a.toLowerCase() === b.toLowerCase()) return 'Give the two colours different names.';
  return [
    { name: a, hex: medium.colours[0].hex },
    { name: b, hex: medium.colours[1].hex },
  ];
}

/**
 * The experiment's colours under new names (blank keeps a name), their look unchanged; or why
 * not. Only the names change: every count stays with its colour class.
 */
export function renamedColours(
  current: readonly [MarkerColour, MarkerColour],
  names: readonly [string, string],
): [MarkerColour, MarkerColour] | string {
  const [a, b] = names.map((n, i) => n.trim() || current[i]!.name) as [string, string];
  if (a.toLowerCase() === b.toLowerCase()) return 'Give the two colours different names.';
  return [
    { ...current[0], name: a },
    { ...current[1], name: b },
  ];
}
