import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { RgbaImage } from './types.ts';

/**
 * Downscaling straight from the photo's pixels in JavaScript memory, a band of rows at a time,
 * so the full-size photo is never copied into the WASM heap (a 12 MP photo is 48 MB of RGBA;
 * the heap never gives memory back once it has grown or touched it).
 *
 * Scales are multiples of 1/SCALE_STEPS. With scale p/q, a band of q·m source rows becomes
 * exactly p·m rows of the result, and opencv's INTER_AREA (pixel-area averaging) then weighs
 * every band's pixels exactly as one resize of the whole region would: the bands leave no seams.
 * Only the last, shorter band may differ, by under one output row.
 */
export const SCALE_STEPS = 64;

/** Source rows per band: a multiple of SCALE_STEPS, a few MB of a wide photo. */
const BAND_ROWS = SCALE_STEPS * 4;

/** The nearest multiple of 1/SCALE_STEPS, at least one step and never above 1 (no upsampling). */
export function steppedScale(scale: number): number {
  return Math.min(SCALE_STEPS, Math.max(1, Math.round(scale * SCALE_STEPS))) / SCALE_STEPS;
}

export interface Region {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * The region of `image` resampled by `scale` (a steppedScale) to `width` × `height` RGBA pixels,
 * with INTER_AREA. The caller owns the returned Mat.
 */
export function resizeRegion(
  cv: OpenCv,
  image: RgbaImage,
  region: Region,
  scale: number,
  width: number,
  height: number,
): Mat {
  const outRowsPerBand = Math.round(scale * BAND_ROWS);
  const out = new cv.Mat(height, width, cv.CV_8UC4);
  try {
    withMats((keep) => {
      const band = keep(new cv.Mat(Math.min(BAND_ROWS, region.height), region.width, cv.CV_8UC4));
      const rowBytes = region.width * 4;
      for (let top = 0, outTop = 0; top < region.height && outTop < height; top += BAND_ROWS) {
        const rows = Math.min(BAND_ROWS, region.height - top);
        const outRows = rows === BAND_ROWS ? outRowsPerBand : height - outTop;
        // Taken afresh each band: a view of the heap is only valid until the heap next grows.
        const dst = band.data;
        for (let r = 0; r < rows; r++) {
          const from = ((region.y + top + r) * image.width + region.x) * 4;
          dst.set(image.data.subarray(from, from + rowBytes), r * rowBytes);
        }
        const src = keep(band.roi(new cv.Rect(0, 0, region.width, rows)));
        const target = keep(
          out.roi(new cv.Rect(0, outTop, width, Math.min(outRows, height - outTop))),
        );
        cv.resize(src, target, new cv.Size(target.cols, target.rows), 0, 0, cv.INTER_AREA);
        outTop += target.rows;
      }
    });
    return out;
  } catch (e) {
    out.delete();
    throw e;
  }
}
