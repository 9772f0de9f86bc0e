import type { Lab } from './types.ts';

/**
 * sRGB (IEC 61966-2-1, D65) and CIE L*a*b*, one colour at a time.
 *
 * Images go through opencv's 8-bit COLOR_RGB2Lab; these scalar functions turn colony colours back
 * into hex for display (labToHex), measure colour differences (ΔE*ab) and are the exact reference
 * the opencv conversion is tested against. Input channels are 0..255; L* is 0..100.
 */

// D65 reference white, 2° observer (as in scikit-image's colorconv).
const WHITE: readonly [number, number, number] = [0.95047, 1, 1.08883];
// CIE 15 exact constants for the L* break point.
const EPSILON = 216 / 24389;
const KAPPA = 24389 / 27;

/** sRGB transfer function inverse: encoded 0..1 to linear light. */
export function srgbToLinear(c: number): number {
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

/** sRGB transfer function: linear light to encoded 0..1. */
export function linearToSrgb(l: number): number {
  return l <= 0.0031308 ? 12.92 * l : 1.055 * l ** (1 / 2.4) - 0.055;
}

function labF(t: number): number {
  return t > EPSILON ? Math.cbrt(t) : (KAPPA * t + 16) / 116;
}

function labFInverse(f: number): number {
  const t = f ** 3;
  return t > EPSILON ? t : (116 * f - 16) / KAPPA;
}

/** [r, g, b] in 0..255 to L*a*b*. */
export function rgbToLab(r: number, g: number, b: number): Lab {
  const R = srgbToLinear(r / 255);
  const G = srgbToLinear(g / 255);
  const B = srgbToLinear(b / 255);
  // sRGB primaries to XYZ (IEC 61966-2-1 matrix, as in scikit-image).
  const x = (0.412453 * R + 0.35758 * G + 0.180423 * B) / WHITE[0];
  const y = (0.212671 * R + 0.71516 * G + 0.072169 * B) / WHITE[1];
  const z = (0.019334 * R + 0.119193 * G + 0.950227 * B) / WHITE[2];
  const fx = labF(x);
  const fy = labF(y);
  const fz = labF(z);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

/** L*a*b* to [r, g, b] 0..255, clipped to the sRGB gamut. */
export function labToRgb([L, a, b]: Lab): [number, number, number] {
  const fy = (L + 16) / 116;
  const x = labFInverse(fy + a / 500) * WHITE[0];
  const y = labFInverse(fy) * WHITE[1];
  const z = labFInverse(fy - b / 200) * WHITE[2];
  const R = 3.240481 * x - 1.537151 * y - 0.498536 * z;
  const G = -0.969255 * x + 1.87599 * y + 0.041556 * z;
  const B = 0.055647 * x - 0.204041 * y + 1.057311 * z;
  const enc = (l: number) => Math.round(255 * Math.min(1, Math.max(0, linearToSrgb(l))));
  return [enc(R), enc(G), enc(B)];
}

export function labToHex(lab: Lab): string {
  return `#${labToRgb(lab)
    .map((c) => c.toString(16).padStart(2, '0'))
    .join('')}`;
}

/** Euclidean ΔE*ab (CIE 1976). */
export function deltaE76(p: Lab, q: Lab): number {
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

const DEG = Math.PI / 180;

function hueDeg(b: number, a: number): number {
  if (a === 0 && b === 0) return 0;
  const h = Math.atan2(b, a) / DEG;
  return h < 0 ? h + 360 : h;
}

/** Chroma C*ab and hue angle h_ab in degrees [0, 360). */
export function chromaHue([, a, b]: Lab): { chroma: number; hue: number } {
  return { chroma: Math.hypot(a, b), hue: hueDeg(b, a) };
}
