import { type AgarModel, labDistance } from './agar.ts';
import { openWithDisc } from './disc-opening.ts';
import type { WorkingFrame } from './frame.ts';
import { boxPairFor, oddAtLeast } from './kernel-size.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { Rect } from './opencv-slice.ts';

/**
 * Colony foreground: pixels that differ from the local agar by more than the noise allows.
 *
 * The threshold adapts to each photo: it is a multiple of the median ΔE over the counting area
 * (most of the agar is bare, so the median measures noise plus residual lighting), never below
 * MIN_CONTRAST ΔE. Pale colonies only a few ΔE lighter than the agar pass; sensor noise and JPEG
 * ringing do not. Then: an opening removes single-pixel noise, holes (the highlight on a domed
 * colony) are filled, ring-shaped objects (air bubbles: a dark rim round an agar-coloured
 * centre) are dropped whole, and pale colonies are cut loose from dark ones they touch.
 *
 * Output: an 8-bit 0/255 mask in working pixels; `bubbles` counts the rings dropped.
 */
const MIN_CONTRAST = 3;
const NOISE_MULTIPLE = 4;
/** Largest colony seen only by its rim, as a diameter in mm (see fillColonyHoles). */
const RING_COLONY_MAX_MM = 4;

export interface Foreground {
  mask: Mat;
  threshold: number;
  /** The lower threshold a large, round, faint disc must clear (see addFaintDiscs). */
  faintThreshold: number;
  /**
   * With a wider search (reach < 1): the objects only it found (0/255), apart from `mask`: they
   * are the learned model's to judge and never the default rules' (see findWiderObjects); null
   * otherwise.
   */
  widerOnly: Mat | null;
}

export function segmentForeground(
  cv: OpenCv,
  keep: Keep,
  agar: AgarModel,
  frame: WorkingFrame,
  reach = 1,
): Foreground {
  const noise = medianWithin(agar.deltaE, agar.countMask);
  const threshold = Math.max(MIN_CONTRAST, NOISE_MULTIPLE * noise);
  const mask = keep(new cv.Mat());
  const widerOnly =
    reach < 1 ? keep(cv.Mat.zeros(agar.deltaE.rows, agar.deltaE.cols, cv.CV_8UC1)) : null;
  withMats((k) => thresholdMask(cv, k, mask, agar, frame, threshold));
  const faintThreshold = withMats((k) => {
    const contrast = k(faintContrast(cv, k, agar, frame));
    const level = Math.max(
      FAINT_MIN_CONTRAST,
      FAINT_MULTIPLE * medianWithin(contrast, agar.countMask),
    );
    addFaintDiscs(cv, k, mask, agar, frame, contrast, level);
    return level;
  });
  withMats((k) => {
    const lighter = k(lighterThanAgar(cv, k, agar));
    fillColonyHoles(cv, mask, lighter, Math.PI * (RING_COLONY_MAX_MM / 2 / frame.mmPerPx) ** 2);
  });
  cutLightFromDark(cv, mask, agar);
  if (widerOnly)
    withMats((k) => findWiderObjects(cv, k, mask, widerOnly, agar, frame, reach * threshold));
  return { mask, threshold, faintThreshold, widerOnly };
}

/** The pixels above `level`, noise specks opened away, the wall's arcs and ring cleared. */
function thresholdMask(
  cv: OpenCv,
  k: Keep,
  mask: Mat,
  agar: AgarModel,
  frame: WorkingFrame,
  level: number,
): void {
  const above = k(new cv.Mat());
  cv.threshold(agar.deltaE, above, level, 255, cv.THRESH_BINARY);
  above.convertTo(mask, cv.CV_8U);
  cv.bitwise_and(mask, agar.countMask, mask);
  const size = oddAtLeast(3, 0.2 / frame.mmPerPx);
  const disc = k(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(size, size)));
  cv.morphologyEx(mask, mask, cv.MORPH_OPEN, disc);
  clearThinAlongWall(cv, k, mask, agar.wallBand, frame);
  cutFromWall(cv, k, mask, agar, frame);
}

/**
 * A learned model may widen the search (reach < 1, see cv learned-model.ts searchReach): objects
 * above the lower `level` that touch nothing the default threshold found go into `widerOnly`, for
 * the model to judge. They stay out of `mask`, so the default reading (its outlines, its seeds,
 * the plate's typical colony, the pens learned from its writing) is exactly the one without them.
 */
function findWiderObjects(
  cv: OpenCv,
  k: Keep,
  mask: Mat,
  widerOnly: Mat,
  agar: AgarModel,
  frame: WorkingFrame,
  level: number,
): void {
  const wide = k(new cv.Mat());
  thresholdMask(cv, k, wide, agar, frame, level);
  const labels = k(new cv.Mat());
  const n = cv.connectedComponents(wide, labels, 8, cv.CV_32S);
  const near = k(new cv.Mat());
  cv.dilate(mask, near, k(cv.getStructuringElement(cv.MORPH_RECT, new cv.Size(3, 3))));
  const touching = new Uint8Array(n);
  const l = labels.data32S;
  const m = near.data;
  for (let i = 0; i < l.length; i++) if (m[i] && l[i]) touching[l[i]!] = 1;
  const w = wide.data;
  const only = widerOnly.data;
  for (let i = 0; i < l.length; i++) if (w[i] && !touching[l[i]!]) only[i] = 255;
}

/**
 * In the wall zone the meniscus and the wall's reflections draw thin arcs that run round the dish
 * and join everything they touch into one blob (pen writing near the rim, colonies at the wall).
 * There, only what holds a disc of WALL_OPENING_MM survives (a morphological opening restricted
 * to the band); a colony growing at the wall is thicker than that and is kept.
 */
const WALL_OPENING_MM = 0.6;
function clearThinAlongWall(
  cv: OpenCv,
  k: Keep,
  mask: Mat,
  wallBand: Mat,
  frame: WorkingFrame,
): void {
  const opened = k(new cv.Mat());
  openWithDisc(cv, mask, opened, discRadius(WALL_OPENING_MM, frame));
  opened.copyTo(mask, wallBand);
}

/**
 * Large faint colonies (a pale colony only a few ΔE lighter than the agar, 1–3 mm across) stay
 * under the pixel threshold, which must hold against single-pixel noise. Over a disc that size the
 * noise averages out, so a lower threshold is safe where what clears it is a round patch at least
 * FAINT_MIN_MM across: the lower mask is opened with a disc that size (noise specks and thin
 * texture go) and each remaining outline up to FAINT_MAX_MM across that is round is added: it fills at least FAINT_FILL of
 * its smallest enclosing circle (a digital disc a few pixels across fills about 0.8, an ellipse
 * of axes 2:1 or a crescent 0.5 or less; the isoperimetric quotient is biased low on outlines
 * that small).
 */
const FAINT_MULTIPLE = 2.5;
/**
 * However clean the photo, a faint disc differs from the agar by at least one just-noticeable
 * difference, ΔE*ab ≈ 2.3 (Mahy, Van Eycken & Oosterlinck 1994, cited from memory): what nobody
 * can see is not a colony to count, and the averaged colour of a small air bubble's dark rim
 * comes to about 2.
 */
const FAINT_MIN_CONTRAST = 2.3;
const FAINT_MIN_MM = 0.8;
const FAINT_FILL = 0.65;
/** Larger than this (mm across) a faint patch is lighting or a smear, not a colony. */
const FAINT_MAX_MM = 5;
/** A faint disc is added when the mask holds less than FAINT_FOUND of it and FAINT_AROUND of a
 * ring FAINT_RING_MM wide round it (see foundShares). */
const FAINT_FOUND = 0.5;
const FAINT_AROUND = 0.15;
const FAINT_RING_MM = 0.3;
function addFaintDiscs(
  cv: OpenCv,
  k: Keep,
  mask: Mat,
  agar: AgarModel,
  frame: WorkingFrame,
  contrast: Mat,
  faintThreshold: number,
): void {
  const above = k(new cv.Mat());
  cv.threshold(contrast, above, faintThreshold, 255, cv.THRESH_BINARY);
  const low = k(new cv.Mat());
  above.convertTo(low, cv.CV_8U);
  cv.bitwise_and(low, agar.countMask, low);
  // Not in the wall band: there the meniscus and air bubbles pinned at the wall make round,
  // faintly lighter patches of their own.
  cv.subtract(low, agar.wallBand, low);
  // By distance transforms (disc-opening.ts): opencv.js opens with an elliptical kernel pixel
  // by pixel, 89 ms of a 12 MP photo's analysis for this disc, against 39 ms.
  openWithDisc(cv, low, low, discRadius(FAINT_MIN_MM, frame));
  const contours = k(new cv.MatVector());
  const hierarchy = k(new cv.Mat());
  cv.findContours(low, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_SIMPLE);
  const maxRadius = FAINT_MAX_MM / 2 / frame.mmPerPx;
  const gap = Math.max(2, Math.round(FAINT_RING_MM / frame.mmPerPx));
  const scratch = k(cv.Mat.zeros(mask.rows, mask.cols, cv.CV_8UC1));
  const grow = k(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(2 * gap + 1, 2 * gap + 1)));
  for (let i = 0; i < contours.size(); i++) {
    const c = k(contours.get(i));
    const { center, radius } = cv.minEnclosingCircle(c);
    if (cv.contourArea(c) < FAINT_FILL * Math.PI * radius ** 2 || radius > maxRadius) continue;
    cv.drawContours(scratch, contours, i, [255, 0, 0, 0], -1);
    const share = foundShares(
      cv,
      k,
      mask,
      scratch,
      grow,
      squareAround(cv, mask, center, radius + gap),
    );
    cv.drawContours(scratch, contours, i, [0, 0, 0, 0], -1);
    if (share.inside < FAINT_FOUND && share.around < FAINT_AROUND)
      cv.drawContours(mask, contours, i, [255, 0, 0, 0], -1);
  }
}

/**
 * The contrast a faint disc is found by: ΔE*ab between the agar and the photo's colour averaged
 * over a quarter of the smallest faint disc (JPEG blocks and noise make a faint patch's outline
 * ragged at the pixel level). The colour is averaged before its difference is taken: noise then
 * cancels, while a ΔE averaged afterwards keeps the noise's own floor (a magnitude is never
 * negative), which on a noisy photo rose above the faint colonies themselves. Its threshold is a
 * multiple of its own median over the agar, so it is set on the measure it is applied to.
 */
function faintContrast(cv: OpenCv, k: Keep, agar: AgarModel, frame: WorkingFrame): Mat {
  const smooth = k(new cv.Mat());
  const [a, b] = boxPairFor(FAINT_MIN_MM / 4 / frame.mmPerPx);
  cv.blur(agar.lab8, smooth, new cv.Size(a, a));
  cv.blur(smooth, smooth, new cv.Size(b, b));
  return labDistance(cv, smooth, agar.background8);
}

/**
 * How much of a patch (0/255 in `patch`) and of a ring `grow` wide round it the mask already
 * holds, within `box`. Round what the pixel threshold found the lower one only grows a halo, and
 * between touching colonies, or inside an air bubble's dark rim, it finds a pocket of agar: a
 * faint disc is added only where the pixel threshold found little of it and little round it.
 */
function foundShares(
  cv: OpenCv,
  k: Keep,
  mask: Mat,
  patch: Mat,
  grow: Mat,
  box: Rect,
): { inside: number; around: number } {
  const m = k(mask.roi(box));
  const inside = k(patch.roi(box));
  const ring = k(new cv.Mat());
  cv.dilate(inside, ring, grow);
  cv.subtract(ring, inside, ring);
  return { inside: cv.mean(m, inside)[0]! / 255, around: cv.mean(m, ring)[0]! / 255 };
}

/** The square round a circle, clipped to the image. */
function squareAround(
  cv: OpenCv,
  mask: Mat,
  centre: { x: number; y: number },
  radius: number,
): Rect {
  const x0 = Math.max(0, Math.floor(centre.x - radius));
  const y0 = Math.max(0, Math.floor(centre.y - radius));
  const x1 = Math.min(mask.cols, Math.ceil(centre.x + radius));
  const y1 = Math.min(mask.rows, Math.ceil(centre.y + radius));
  return new cv.Rect(x0, y0, Math.max(1, x1 - x0), Math.max(1, y1 - y0));
}

/**
 * A blob that runs along the wall for more than WALL_RUN_MM is the wall's own ring (a meniscus or
 * reflection too thick for the opening above) with whatever touches it: writing near the rim,
 * colonies at the wall. Judged as one blob, nothing in it would look like a stroke or a colony,
 * so its thin part inside the wall band is cut away and what touched it is judged on its own. The run
 * is measured as the blob's pixels on the counting area's outermost ring (`rim`), one pixel per
 * pixel of wall length; a colony at the wall touches it over at most its own diameter.
 */
const WALL_RUN_MM = 6;
/**
 * A colony growing at the wall holds a disc this wide (mm) inside the wall band; the band is
 * WALL_ZONE_MM (1.2 mm) wide, and the wall's ring and glints are thinner than that.
 */
const WALL_COLONY_MM = 1.2;
function cutFromWall(cv: OpenCv, k: Keep, mask: Mat, agar: AgarModel, frame: WorkingFrame): void {
  const labels = k(new cv.Mat());
  const n = cv.connectedComponents(mask, labels, 8, cv.CV_32S);
  const onRim = k(new cv.Mat());
  cv.bitwise_and(mask, agar.rim, onRim);
  // opencv.js has no per-label count: one pass over the 8-bit rim mask (a few ms at working size).
  const run = new Int32Array(n);
  const rim = onRim.data;
  const l = labels.data32S;
  for (let i = 0; i < rim.length; i++) if (rim[i]) run[l[i]!]!++;
  const limit = WALL_RUN_MM / frame.mmPerPx;
  const long = [...run.keys()].filter((id) => id > 0 && run[id]! > limit);
  if (long.length === 0) return;
  const along = k(cv.Mat.zeros(labels.rows, labels.cols, cv.CV_8UC1));
  const one = k(new cv.Mat());
  const lo = k(new cv.Mat(labels.rows, labels.cols, cv.CV_32S, [0, 0, 0, 0]));
  const hi = k(new cv.Mat(labels.rows, labels.cols, cv.CV_32S, [0, 0, 0, 0]));
  for (const id of long) {
    lo.setTo([id, 0, 0, 0]);
    hi.setTo([id, 0, 0, 0]);
    cv.inRange(labels, lo, hi, one);
    cv.bitwise_or(along, one, along);
  }
  cv.bitwise_and(along, agar.wallBand, along);
  // What in that part holds a disc WALL_COLONY_MM across is a colony growing at the wall: kept.
  const thick = k(new cv.Mat());
  openWithDisc(cv, along, thick, discRadius(WALL_COLONY_MM, frame));
  cv.subtract(along, thick, along);
  cv.subtract(mask, along, mask);
}

/**
 * Where a colony lighter than the agar touches one clearly darker than it (a pale colony against
 * a coloured one), a one-pixel cut is made along the seam, so the two are separate blobs however
 * much they overlap: their outline alone would not tell them apart. "Clearly" is SEAM_DARKER in
 * L*: the shaded rim of a pale colony, only a little darker than the agar, is not cut off.
 */
const SEAM_DARKER = 8;
function cutLightFromDark(cv: OpenCv, mask: Mat, agar: AgarModel): void {
  withMats((k) => {
    const planes = k(new cv.MatVector());
    cv.split(agar.lab8, planes);
    const bgPlanes = k(new cv.MatVector());
    cv.split(agar.background8, bgPlanes);
    const L = k(planes.get(0));
    const bgL = k(bgPlanes.get(0));
    const lighter = k(new cv.Mat());
    cv.compare(L, bgL, lighter, cv.CMP_GT);
    const offset = k(
      new cv.Mat(bgL.rows, bgL.cols, cv.CV_8UC1, [Math.round(SEAM_DARKER * 2.55), 0, 0, 0]),
    );
    const darkLimit = k(new cv.Mat());
    cv.subtract(bgL, offset, darkLimit); // saturates at 0
    const darker = k(new cv.Mat());
    cv.compare(L, darkLimit, darker, cv.CMP_LT);
    const light = k(new cv.Mat());
    cv.bitwise_and(mask, lighter, light);
    const dark = k(new cv.Mat());
    cv.bitwise_and(mask, darker, dark);
    const reach = k(cv.getStructuringElement(cv.MORPH_RECT, new cv.Size(3, 3)));
    const seam = k(new cv.Mat());
    cv.dilate(dark, seam, reach);
    cv.bitwise_and(seam, light, seam);
    cv.subtract(mask, seam, mask);
  });
}

/** Half the width of the odd-sized kernel (at least 3 pixels) a disc `mm` across would take. */
function discRadius(mm: number, frame: WorkingFrame): number {
  return oddAtLeast(3, mm / frame.mmPerPx) / 2;
}

/**
 * Median of a float image inside a mask, from every 3rd pixel of every 3rd row: plenty for a
 * noise level and an order of magnitude cheaper than sorting a megapixel.
 */
function medianWithin(img: Mat, mask: Mat): number {
  const v = img.data32F;
  const m = mask.data;
  // A typed array sorts numerically in native code, several times faster than an array of
  // numbers with a comparator (about 40 ms for the 150 000 samples of a 1.3 MP image).
  const samples = new Float32Array(Math.ceil(img.rows / 3) * Math.ceil(img.cols / 3));
  let n = 0;
  for (let y = 1; y < img.rows; y += 3) {
    const row = y * img.cols;
    for (let x = 1; x < img.cols; x += 3) if (m[row + x]) samples[n++] = v[row + x]!;
  }
  if (n === 0) return 0;
  const taken = samples.subarray(0, n).sort();
  return taken[n >> 1]!;
}

/**
 * Fills the holes that belong to a colony and leaves the others. A hole is filled when it is round
 * and the ring round it is at least as thick as the hole is wide (the highlight on a domed
 * colony; the loop of a letter is not round, and its stroke is thin), or when
 * the whole outline is small, round and mostly lighter than the agar (a colourless colony seen
 * only by its rim, whose inside looks like agar: the rim refracts light towards the camera). A
 * small round outline darker than the agar is an "o" written in ink, which absorbs light, or the
 * dark edge of an air bubble, and stays open. A hole in a thin outline that is large or not round (a pen loop, an arc of
 * the wall, writing round colonies) is left open, so that the outline keeps the shape of a
 * stroke and is judged as one (candidates.ts). Roundness is the isoperimetric quotient
 * 4πA/P², 1 for a circle (common practice).
 */
const ROUND = 0.8;
function fillColonyHoles(cv: OpenCv, mask: Mat, lighter: Mat, smallArea: number): void {
  withMats((keep) => {
    const contours = keep(new cv.MatVector());
    const hierarchy = keep(new cv.Mat());
    const work = keep(mask.clone());
    cv.findContours(work, contours, hierarchy, cv.RETR_CCOMP, cv.CHAIN_APPROX_SIMPLE);
    const h = hierarchy.data32S; // [next, previous, firstChild, parent] per contour
    for (let i = 0; i < contours.size(); i++) {
      if (h[4 * i + 3]! !== -1 || h[4 * i + 2]! === -1) continue; // a hole, or no hole
      const outer = keep(contours.get(i));
      const outerArea = cv.contourArea(outer);
      const smallRound =
        outerArea <= smallArea &&
        roundness(cv, outer, outerArea) >= ROUND &&
        mostlyLighter(cv, keep, outer, mask, lighter);
      const outerRadius = Math.sqrt(outerArea / Math.PI);
      for (let c = h[4 * i + 2]!; c !== -1; c = h[4 * c]!) {
        const hole = keep(contours.get(c));
        const holeArea = cv.contourArea(hole);
        const holeRadius = Math.sqrt(holeArea / Math.PI);
        const highlight =
          holeRadius <= outerRadius - holeRadius && roundness(cv, hole, holeArea) >= ROUND;
        if (smallRound || highlight) cv.drawContours(mask, contours, c, [255, 0, 0, 0], -1);
      }
    }
  });
}

/** The isoperimetric quotient 4πA/P² of a contour: 1 for a circle, less for any other shape. */
function roundness(cv: OpenCv, contour: Mat, area: number): number {
  const perimeter = cv.arcLength(contour, true);
  return perimeter > 0 ? (4 * Math.PI * area) / (perimeter * perimeter) : 0;
}

/** 0/255 where the image is lighter (L*) than the agar model there. */
function lighterThanAgar(cv: OpenCv, k: Keep, agar: AgarModel): Mat {
  const planes = k(new cv.MatVector());
  cv.split(agar.lab8, planes);
  const bgPlanes = k(new cv.MatVector());
  cv.split(agar.background8, bgPlanes);
  const lighter = new cv.Mat();
  cv.compare(k(planes.get(0)), k(bgPlanes.get(0)), lighter, cv.CMP_GT);
  return lighter;
}

/** Whether most foreground pixels in the contour's bounding box are lighter than the agar. */
function mostlyLighter(cv: OpenCv, keep: Keep, contour: Mat, mask: Mat, lighter: Mat): boolean {
  const p = contour.data32S; // x, y pairs
  let x0 = Number.POSITIVE_INFINITY;
  let y0 = Number.POSITIVE_INFINITY;
  let x1 = 0;
  let y1 = 0;
  for (let i = 0; i < p.length; i += 2) {
    x0 = Math.min(x0, p[i]!);
    x1 = Math.max(x1, p[i]!);
    y0 = Math.min(y0, p[i + 1]!);
    y1 = Math.max(y1, p[i + 1]!);
  }
  const box = new cv.Rect(x0, y0, x1 - x0 + 1, y1 - y0 + 1);
  const share = cv.mean(keep(lighter.roi(box)), keep(mask.roi(box)))[0]! / 255;
  return share >= 0.5;
}
