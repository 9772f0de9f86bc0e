import type { Deletable } from './opencv-slice.ts';

/**
 * Owns every opencv object made inside one piece of work and frees them all when it ends,
 * on success and on error alike. opencv.js objects live on the WASM heap, which the JS garbage
 * collector never reclaims, so one forgotten `delete()` per plate leaks megabytes per plate.
 *
 *   const n = withMats((keep) => {
 *     const gray = keep(new cv.Mat());
 *     cv.cvtColor(src, gray, cv.COLOR_RGBA2GRAY);
 *     return cv.countNonZero(gray);
 *   });
 */
export type Keep = <T extends Deletable>(obj: T) => T;

export function withMats<R>(work: (keep: Keep) => R): R {
  const owned: Deletable[] = [];
  const keep: Keep = (obj) => {
    owned.push(obj);
    return obj;
  };
  try {
    return work(keep);
  } finally {
    for (let i = owned.length - 1; i >= 0; i--) {
      const obj = owned[i]!;
      if (!obj.isDeleted()) obj.delete();
    }
  }
}
