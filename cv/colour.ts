import type { Lab } from './types.ts';

/**
 * sRGB (IEC 61966-2-1, D65) to CIE L*a*b* and the CIEDE2000 colour difference.
 *
 * opencv's 8-bit COLOR_RGB2Lab quantises L*, a*, b* to bytes; these scalar functions are the
 * exact reference used for per-colony colours (a few hundred values per plate), for palettes and
 * for tests. Input channels are 0..255; L* is 0..100.
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

/**
 * CIEDE2000 colour difference, kL = kC = kH = 1.
 * Sharma, Wu & Dalal (2005), "The CIEDE2000 color-difference formula: implementation notes,
 * supplementary test data, and mathematical observations", Color Res. Appl. 30:21–30.
 */
export function deltaE2000(p: Lab, q: Lab): number {
  const [L1, a1, b1] = p;
  const [L2, a2, b2] = q;
  const Cbar = (Math.hypot(a1, b1) + Math.hypot(a2, b2)) / 2;
  const G = 0.5 * (1 - Math.sqrt(Cbar ** 7 / (Cbar ** 7 + 25 ** 7)));
  const a1p = (1 + G) * a1;
  const a2p = (1 + G) * a2;
  const C1p = Math.hypot(a1p, b1);
  const C2p = Math.hypot(a2p, b2);
  const h1p = hueDeg(b1, a1p);
  const h2p = hueDeg(b2, a2p);

  const dLp = L2 - L1;
  const dCp = C2p - C1p;
  let dhp = 0;
  if (C1p * C2p !== 0) {
    dhp = h2p - h1p;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
  }
  const dHp = 2 * Math.sqrt(C1p * C2p) * Math.sin((dhp / 2) * DEG);

  const Lbp = (L1 + L2) / 2;
  const Cbp = (C1p + C2p) / 2;
  let hbp = h1p + h2p;
  if (C1p * C2p !== 0) {
    if (Math.abs(h1p - h2p) <= 180) hbp /= 2;
    else hbp = h1p + h2p < 360 ? (hbp + 360) / 2 : (hbp - 360) / 2;
  }
  const T =
    1 -
    0.17 * Math.cos((hbp - 30) * DEG) +
    0.24 * Math.cos(2 * hbp * DEG) +
    0.32 * Math.cos((3 * hbp + 6) * DEG) -
    0.2 * Math.cos((4 * hbp - 63) * DEG);
  const dTheta = 30 * Math.exp(-(((hbp - 275) / 25) ** 2));
  const Rc = 2 * Math.sqrt(Cbp ** 7 / (Cbp ** 7 + 25 ** 7));
  const Sl = 1 + (0.015 * (Lbp - 50) ** 2) / Math.sqrt(20 + (Lbp - 50) ** 2);
  const Sc = 1 + 0.045 * Cbp;
  const Sh = 1 + 0.015 * Cbp * T;
  const Rt = -Math.sin(2 * dTheta * DEG) * Rc;
  return Math.sqrt(
    (dLp / Sl) ** 2 + (dCp / Sc) ** 2 + (dHp / Sh) ** 2 + Rt * (dCp / Sc) * (dHp / Sh),
  );
}

/** Chroma C*ab and hue angle h_ab in degrees [0, 360). */
export function chromaHue([, a, b]: Lab): { chroma: number; hue: number } {
  return { chroma: Math.hypot(a, b), hue: hueDeg(b, a) };
}
