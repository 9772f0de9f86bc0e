import type { Analysis, MarkerColour } from '../../schema/records.ts';

function rgb(hex: string): [number, number, number] {
  const n = Number.parseInt(hex.replace('#', '').slice(0, 6), 16) || 0;
  return [n >> 16, (n >> 8) & 255, n & 255];
}

function distance(a: string, b: string): number {
  const [p, q] = [rgb(a), rgb(b)];
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

/**
 * Whether two measured colours match the experiment's two named colours better the other way
 * round. The analysis numbers its two colours in no fixed order; the experiment's names are
 * bound to class 0 and 1, so a reading or a learned palette is put in the names' order first.
 */
export function fitsSwapped(
  measured: readonly [string, string],
  named: readonly [MarkerColour, MarkerColour],
): boolean {
  const straight = distance(measured[0], named[0].hex) + distance(measured[1], named[1].hex);
  const swapped = distance(measured[0], named[1].hex) + distance(measured[1], named[0].hex);
  return swapped < straight;
}

/** The same reading with its two colour classes exchanged. */
export function swapClasses(a: Analysis): Analysis {
  return {
    ...a,
    colonies: a.colonies.map((c) => ({ ...c, cls: c.cls === 0 ? 1 : 0 })),
    classes: [
      { ...a.classes[1], cls: 0 },
      { ...a.classes[0], cls: 1 },
    ],
  };
}

/** A reading made without a palette, its classes in the order of the experiment's names. */
export function inNamedOrder(a: Analysis, named: readonly [MarkerColour, MarkerColour]): Analysis {
  return fitsSwapped([a.classes[0].hex, a.classes[1].hex], named) ? swapClasses(a) : a;
}

/** A learned pair of colours, in the order of the experiment's names. */
export function pairInNamedOrder<T extends { hex: string }>(
  pair: readonly [T, T],
  named: readonly [MarkerColour, MarkerColour],
): [T, T] {
  return fitsSwapped([pair[0].hex, pair[1].hex], named) ? [pair[1], pair[0]] : [pair[0], pair[1]];
}
