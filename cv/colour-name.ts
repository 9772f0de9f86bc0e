import { chromaHue } from './colour.ts';
import type { Lab } from './types.ts';

/**
 * A plain colour word for a colony colour, for labels and CSV columns when no palette names the
 * classes. Hue bands are CIE L*a*b* hue angles h_ab (sRGB red ≈ 40°, yellow ≈ 103°, green ≈ 136°,
 * cyan ≈ 196°, blue ≈ 306°, magenta ≈ 328°).
 */
export function colourName(lab: Lab): string {
  const [L] = lab;
  const { chroma, hue } = chromaHue(lab);
  if (chroma < 10) return L > 75 ? 'white' : L > 40 ? 'grey' : 'black';
  if (hue < 50 || hue >= 350) return L > 60 && chroma < 50 ? 'pink' : 'red';
  if (hue < 80) return 'orange';
  if (hue < 115) return chroma < 30 && L > 70 ? 'cream' : 'yellow';
  if (hue < 170) return 'green';
  if (hue < 240) return 'teal';
  if (hue < 315) return 'blue';
  return 'purple';
}

/** Two distinct names for two colours, telling same-word colours apart by lightness. */
export function distinctNames(a: Lab, b: Lab): [string, string] {
  const na = colourName(a);
  const nb = colourName(b);
  if (na !== nb) return [na, nb];
  return a[0] <= b[0] ? [`dark ${na}`, `pale ${nb}`] : [`pale ${na}`, `dark ${nb}`];
}
