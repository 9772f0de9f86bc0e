import type { Keep } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';

/**
 * Grey-level dilation (a max filter) by a disc `size` pixels across. opencv.js dilates with an
 * elliptical kernel pixel by pixel, so its cost grows with the disc's area: a 17-pixel disc took
 * 100 ms of a 12 MP photo's analysis. From OCTAGON_FROM pixels on, the disc of radius R is
 * replaced by the regular octagon whose sides touch it (reaching R along the axes and diagonals,
 * 1.08 R at its corners): the Minkowski sum of a square of half-side (√2 − 1)·R and a diamond of
 * radius the rest (Serra 1982, Image Analysis and Mathematical Morphology, cited from memory).
 * Dilating by a sum is dilating by each in turn; a square is separable and a diamond is repeated
 * 3×3 crosses, together about 18 ms. Smaller discs stay exact: they are cheap, and they set the
 * seeds of the smallest colonies, where an octagon's corners would be a pixel off.
 */
const OCTAGON_FROM = 17;
export function dilateByDisc(cv: OpenCv, keep: Keep, img: Mat, size: number): void {
  if (size < OCTAGON_FROM) {
    const disc = keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(size, size)));
    cv.dilate(img, img, disc);
    return;
  }
  const radius = (size - 1) / 2;
  const half = Math.round((Math.SQRT2 - 1) * radius);
  const square = keep(
    cv.getStructuringElement(cv.MORPH_RECT, new cv.Size(2 * half + 1, 2 * half + 1)),
  );
  cv.dilate(img, img, square);
  const cross = keep(cv.getStructuringElement(cv.MORPH_CROSS, new cv.Size(3, 3)));
  for (let i = half; i < radius; i++) cv.dilate(img, img, cross);
}
