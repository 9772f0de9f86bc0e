import { steppedScale } from './banded-resize.ts';
import { AGAR_FRACTION } from './dish.ts';
import type { Dish } from './types.ts';

/**
 * The working frame: the part of the photo around the dish, resampled so a 90 mm dish spans
 * about TARGET_PX_PER_MM pixels per millimetre (within 1/64 of the scale). At 12 px/mm a 0.5 mm colony is 6 px across,
 * enough to find and measure it, and a 12 MP photo shrinks to about 1.3 MP of work.
 *
 * Two coordinate spaces meet here: ORIGINAL pixels of the upright photo and WORKING pixels of the
 * resampled crop. Every conversion goes through this module.
 */
export const TARGET_PX_PER_MM = 12;

export interface WorkingFrame {
  /** Crop in original pixels (integers). */
  roi: { x: number; y: number; width: number; height: number };
  /** Working pixels per original pixel (≤ 1: the pipeline never upsamples). */
  scale: number;
  width: number;
  height: number;
  /** Millimetres per working pixel. */
  mmPerPx: number;
}

export function frameForDish(
  dish: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry'>,
  imageWidth: number,
  imageHeight: number,
  dishDiameterMm: number,
): WorkingFrame {
  const half = Math.max(dish.rx, dish.ry) * 1.04;
  const x0 = clamp(Math.floor(dish.cx - half), 0, imageWidth - 1);
  const y0 = clamp(Math.floor(dish.cy - half), 0, imageHeight - 1);
  const x1 = clamp(Math.ceil(dish.cx + half), x0 + 1, imageWidth);
  const y1 = clamp(Math.ceil(dish.cy + half), y0 + 1, imageHeight);
  const dishPx = dish.rx + dish.ry; // mean diameter in original pixels
  // A stepped scale, so the working image can be made band by band without seams.
  const scale = steppedScale((TARGET_PX_PER_MM * dishDiameterMm) / dishPx);
  const width = Math.max(1, Math.round((x1 - x0) * scale));
  const height = Math.max(1, Math.round((y1 - y0) * scale));
  return {
    roi: { x: x0, y: y0, width: x1 - x0, height: y1 - y0 },
    scale,
    width,
    height,
    mmPerPx: dishDiameterMm / (dishPx * scale),
  };
}

/** A dish stand-in when none was found: the largest circle that fits the photo. */
export function inscribedDish(imageWidth: number, imageHeight: number): Dish {
  const r = (Math.min(imageWidth, imageHeight) / 2) * 0.98;
  return {
    cx: imageWidth / 2,
    cy: imageHeight / 2,
    rx: r,
    ry: r,
    angleDeg: 0,
    r,
    agarFraction: AGAR_FRACTION,
    source: 'detected',
  };
}

/** Original pixels per millimetre of the dish: how finely the photo itself resolves the plate. */
export function originalPxPerMm(f: WorkingFrame): number {
  return 1 / (f.mmPerPx * f.scale);
}

export function toOriginal(f: WorkingFrame, x: number, y: number): [number, number] {
  return [f.roi.x + x / f.scale, f.roi.y + y / f.scale];
}

export function toWorking(f: WorkingFrame, x: number, y: number): [number, number] {
  return [(x - f.roi.x) * f.scale, (y - f.roi.y) * f.scale];
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}
