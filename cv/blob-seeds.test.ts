import { describe, expect, it } from 'vitest';
import { type Blob, contrastBlobs } from './blob-seeds.ts';
import { frameForDish } from './frame.ts';
import { type Keep, withMats } from './mat-scope.ts';
import { loadOpenCv, type Mat, type OpenCv } from './opencv.ts';
import { type Split, splitTouching } from './split.ts';

const SIZE = 200;
const PX_PER_MM = 12;
/** A strong colony and a faint one touching it, with no neck between them in the outline. */
const STRONG = { x: 80, y: 100, r: 14, contrast: 30 };
const FAINT = { x: 98, y: 100, r: 6, contrast: 12 };

/**
 * ΔE of colonies over noise of ±0.5 (a fixed linear congruential sequence). A colony is a dome,
 * and its ΔE follows its thickness (Beer–Lambert), so each is a hemisphere's profile; where two
 * overlap, the stronger shows.
 */
function deltaEPlane(cv: OpenCv, discs: (typeof STRONG)[]): Mat {
  const m = new cv.Mat(SIZE, SIZE, cv.CV_32F);
  const v = m.data32F;
  let seed = 7;
  for (let y = 0; y < SIZE; y++)
    for (let x = 0; x < SIZE; x++) {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      let e = seed / 2 ** 31 - 0.5;
      for (const d of discs) {
        const q = 1 - ((x - d.x) ** 2 + (y - d.y) ** 2) / d.r ** 2;
        if (q > 0) e = Math.max(e, d.contrast * Math.sqrt(q));
      }
      v[y * SIZE + x] = e;
    }
  cv.GaussianBlur(m, m, new cv.Size(0, 0), 2);
  return m;
}

function nearest(blobs: Blob[], p: { x: number; y: number; r: number }): Blob | undefined {
  return blobs.find((b) => Math.hypot(b.x - p.x, b.y - p.y) < Math.max(2, 0.3 * p.r));
}

describe('contrast blobs', () => {
  // Reference: a disc of radius r gives the scale-normalised Laplacian of Gaussian its maximum at
  // its centre at σ = r/√2 (Lindeberg 1998, "Feature detection with automatic scale selection",
  // §5). Scales are an octave apart, so the radius found is within a factor 2 of the disc's.
  it("finds a faint colony on a strong one's flank, and the strong one at about its size", async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const dE = keep(deltaEPlane(cv, [STRONG, FAINT]));
      const fg = keep(new cv.Mat());
      cv.threshold(dE, fg, 4, 255, cv.THRESH_BINARY);
      fg.convertTo(fg, cv.CV_8U);
      const agar = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC1, [255, 0, 0, 0]));
      const blobs = contrastBlobs(cv, dE, agar, fg, 1 / PX_PER_MM);
      for (const disc of [STRONG, FAINT])
        expect(nearest(blobs, disc), `a blob at (${disc.x}, ${disc.y})`).toBeDefined();
      // The size is checked on the strong colony: of the faint one, only the part outside the
      // strong one's edge shows.
      const strong = nearest(blobs, STRONG)!;
      expect(strong.r).toBeGreaterThanOrEqual(STRONG.r / 2);
      expect(strong.r).toBeLessThanOrEqual(STRONG.r * 2);
    });
  });

  it('finds nothing along a band of even width (a pen stroke), nor where no agar is bare', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const dE = keep(new cv.Mat(SIZE, SIZE, cv.CV_32F, [0, 0, 0, 0]));
      for (let y = 97; y <= 103; y++) dE.data32F.fill(20, y * SIZE + 20, y * SIZE + 181);
      cv.GaussianBlur(dE, dE, new cv.Size(0, 0), 1);
      const fg = keep(new cv.Mat());
      cv.threshold(dE, fg, 4, 255, cv.THRESH_BINARY);
      fg.convertTo(fg, cv.CV_8U);
      const agar = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC1, [255, 0, 0, 0]));
      const blobs = contrastBlobs(cv, dE, agar, fg, 1 / PX_PER_MM);
      expect(blobs.filter((b) => b.x > 40 && b.x < 160)).toEqual([]);
      expect(contrastBlobs(cv, dE, fg, fg, 1 / PX_PER_MM)).toEqual([]);
    });
  });

  // The watershed is seeded at the distance map's peaks; the faint colony sits on the strong
  // one's flank with no neck between them, so it gets no peak of its own and, without the
  // contrast blob's seed, the background floods it (its label is 0: checked by hand with no
  // seeding).
  it('gives the faint colony its own region when its blob seeds the split', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const dE = keep(deltaEPlane(cv, [STRONG, FAINT]));
      const split = seededSplit(cv, keep, dE);
      expect(label(split, FAINT)).not.toBe(0);
      expect(label(split, FAINT)).not.toBe(label(split, STRONG));
    });
  });

  // A small faint colony: only its middle clears ΔE 4, a piece of foreground whose distance map
  // stays below the seed floor (0.3 of the typical radius, the strong colony's 14 px). Without its
  // blob's seed the background floods it (label 0: checked by hand with the seedless rule taken
  // out).
  it('seeds a small faint colony whose outline is too thin for a distance-map seed', async () => {
    const { cv } = await loadOpenCv();
    withMats((keep) => {
      const small = { x: 150, y: 150, r: 5, contrast: 6 };
      const dE = keep(deltaEPlane(cv, [STRONG, small]));
      const split = seededSplit(cv, keep, dE);
      const d = split.distance.data32F[small.y * SIZE + small.x]!;
      expect(d).toBeGreaterThan(0);
      expect(d).toBeLessThan(0.3 * STRONG.r);
      expect(label(split, small)).not.toBe(0);
    });
  });
});

function label(s: Split, p: { x: number; y: number }): number {
  return s.regions.data32S[p.y * SIZE + p.x]!;
}

/** The foreground above ΔE 4, split with the contrast blobs as extra seeds. */
function seededSplit(cv: OpenCv, keep: Keep, dE: Mat): Split {
  const fg = keep(new cv.Mat());
  cv.threshold(dE, fg, 4, 255, cv.THRESH_BINARY);
  fg.convertTo(fg, cv.CV_8U);
  // The photo the watershed floods: darker where ΔE is higher, grey.
  const rgb = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC3, [0, 0, 0, 0]));
  dE.data32F.forEach((e, i) => {
    rgb.data.fill(Math.max(0, 220 - 4 * e), 3 * i, 3 * i + 3);
  });
  const agar = keep(new cv.Mat(SIZE, SIZE, cv.CV_8UC1, [255, 0, 0, 0]));
  const frame = frameForDish({ cx: 100, cy: 100, rx: 95, ry: 95 }, SIZE, SIZE, 16);
  const blobs = contrastBlobs(cv, dE, agar, fg, 1 / PX_PER_MM);
  return splitTouching(cv, keep, rgb, fg, frame, { blobs, deltaE: dE });
}
