import type { WorkingFrame } from './frame.ts';
import { glareMask } from './glare.ts';
import { followGlare } from './glare-background.ts';
import { oddAtLeast } from './kernel-size.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';
import type { Size } from './opencv-slice.ts';
import type { Dish, Lab } from './types.ts';
import { followWall } from './wall-background.ts';

/**
 * The agar and its local colour.
 *
 * Input: the working RGB image (CV_8UC3) and the dish in working pixels.
 * Output (Mats owned by the caller's scope):
 *  - `lab8`: the image in opencv's 8-bit CIE L*a*b* (L*·255/100, a*+128, b*+128; lab8ToLab),
 *  - `background8`: the agar colour expected at each pixel with colonies removed, same encoding: a
 *    two-pass median over a window several colonies wide, at quarter resolution. This flattens a
 *    one-sided lamp, vignetting and a colour cast, since colonies are judged against the agar
 *    right around them and not against one global agar colour. Within 3 mm of the wall it follows
 *    the meniscus's rings, which no median that wide follows (wall-background.ts); under lid glare
 *    (glare.ts) it is the reflection's own light, which a window or a lamp gives sharp edges and
 *    bars (glare-background.ts);
 *  - `deltaE`: ΔE*ab of each pixel from that background (CV_32FC1),
 *  - `countMask`: where colonies may be counted (the agar, glare included), 8-bit 0/255,
 *  - `rim`, `glareZone`: the bands next to the wall and round glare where the rejection rules in
 *    candidates.ts look harder,
 *  - `glareFraction`: share of the agar under lid glare, which is reported.
 */
export interface AgarModel {
  /** The image and its background in opencv's 8-bit Lab (see lab8ToLab). */
  lab8: Mat;
  background8: Mat;
  deltaE: Mat;
  countMask: Mat;
  /** The outermost pixels of the counting area, next to the dish wall (8-bit 0/255). */
  rim: Mat;
  /** The band within WALL_ZONE_MM of the wall, where the meniscus and reflections lie (0/255). */
  wallBand: Mat;
  glareFraction: number;
  /** Within GLARE_ZONE_MM of lid glare, where its fainter fringe still lights the agar (0/255). */
  glareZone: Mat;
  /** Lid glare itself (0/255, glare.ts): colonies seen through it teach no colours (classify.ts). */
  glare: Mat;
  agarLab: Lab;
}

/** Window of the background median, in millimetres: wider than any single colony or pair. */
const BACKGROUND_WINDOW_MM = 9;

export function modelAgar(
  cv: OpenCv,
  keep: Keep,
  rgb: Mat,
  dish: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg' | 'agarFraction'>,
  frame: WorkingFrame,
): AgarModel {
  const agarMask = keep(ellipseMask(cv, rgb.rows, rgb.cols, dish, dish.agarFraction));
  const lab8 = keep(new cv.Mat());
  cv.cvtColor(rgb, lab8, cv.COLOR_RGB2Lab);

  const quarter = keep(quarterAgar(cv, lab8, agarMask));
  const glare = keep(glareMask(cv, quarter, agarMask, frame));
  const agarArea = Math.max(1, cv.countNonZero(agarMask));
  const glareFraction = cv.countNonZero(glare) / agarArea;
  const glareZone = keep(zoneAround(cv, glare, quarter, frame));

  const background8 = keep(
    medianBackground(cv, quarter, { width: rgb.cols, height: rgb.rows }, frame),
  );
  followWall(cv, lab8, background8, dish, frame.mmPerPx);
  followGlare(cv, lab8, background8, glare, frame.mmPerPx);
  const deltaE = keep(labDistance(cv, lab8, background8));
  const countMask = agarMask;

  const rim = keep(bandInside(cv, agarMask, RIM_PX));
  const wallBand = keep(wallBandOf(cv, agarMask, dish, WALL_ZONE_MM / frame.mmPerPx));
  const centre = background8.data;
  const ci = (Math.round(dish.cy) * background8.cols + Math.round(dish.cx)) * 3;
  const agarLab = lab8ToLab(centre[ci] ?? 0, centre[ci + 1] ?? 128, centre[ci + 2] ?? 128);
  return {
    lab8,
    background8,
    deltaE,
    countMask,
    rim,
    wallBand,
    glare,
    glareFraction,
    glareZone,
    agarLab,
  };
}

/** An 8-bit 0/255 mask of the dish ellipse scaled by `fraction`. */
export function ellipseMask(
  cv: OpenCv,
  rows: number,
  cols: number,
  d: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg'>,
  fraction: number,
): Mat {
  const mask = cv.Mat.zeros(rows, cols, cv.CV_8UC1);
  cv.ellipse(
    mask,
    new cv.Point(d.cx, d.cy),
    new cv.Size(d.rx * fraction, d.ry * fraction),
    d.angleDeg,
    0,
    360,
    [255, 0, 0, 0],
    -1,
  );
  return mask;
}

const GLARE_ZONE_MM = 3;
function zoneAround(cv: OpenCv, glare: Mat, quarter: Mat, frame: WorkingFrame): Mat {
  return withMats((keep) => {
    const q = keep(new cv.Mat());
    cv.resize(glare, q, new cv.Size(quarter.cols, quarter.rows), 0, 0, cv.INTER_NEAREST);
    const k = oddAtLeast(3, (2 * GLARE_ZONE_MM) / (4 * frame.mmPerPx));
    cv.dilate(q, q, keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(k, k))));
    const zone = new cv.Mat();
    cv.resize(q, zone, new cv.Size(glare.cols, glare.rows), 0, 0, cv.INTER_NEAREST);
    return zone;
  });
}

/** The rim: the outermost RIM_PX pixels of the counting area. */
const RIM_PX = 3;
/** The wall zone: within this distance of the wall the meniscus and the wall's reflections lie. */
export const WALL_ZONE_MM = 1.2;

/**
 * The wall band: the agar minus the agar ellipse shrunk by `width` pixels along each semi-axis.
 * Two drawn ellipses instead of an erosion with a kernel as wide as the band (about 30 pixels),
 * which costs a hundred milliseconds or so on a 1.3 MP working image.
 */
function wallBandOf(
  cv: OpenCv,
  agarMask: Mat,
  d: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg' | 'agarFraction'>,
  width: number,
): Mat {
  return withMats((keep) => {
    const inner = keep(
      ellipseMask(
        cv,
        agarMask.rows,
        agarMask.cols,
        {
          ...d,
          rx: Math.max(1, d.rx * d.agarFraction - width),
          ry: Math.max(1, d.ry * d.agarFraction - width),
        },
        1,
      ),
    );
    const band = new cv.Mat();
    cv.subtract(agarMask, inner, band);
    return band;
  });
}

/** The band of `width` pixels just inside the edge of a mask. */
function bandInside(cv: OpenCv, mask: Mat, width: number): Mat {
  return withMats((keep) => {
    const inner = keep(new cv.Mat());
    const k = keep(
      cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(2 * width + 1, 2 * width + 1)),
    );
    cv.erode(mask, inner, k);
    const rim = new cv.Mat();
    cv.subtract(mask, inner, rim);
    return rim;
  });
}

/** One pixel of opencv's 8-bit Lab (L*·255/100, a*+128, b*+128) in real units. */
export function lab8ToLab(l: number, a: number, b: number): Lab {
  return [(l * 100) / 255, a - 128, b - 128];
}

/** The working Lab image at quarter resolution, with everything outside the agar set to the agar mean. */
function quarterAgar(cv: OpenCv, lab8: Mat, agarMask: Mat): Mat {
  return withMats((keep) => {
    // Outside the agar (wall, bench) would drag the median near the rim: fill it with the agar mean.
    const filled = keep(lab8.clone());
    const outside = keep(new cv.Mat());
    cv.bitwise_not(agarMask, outside);
    filled.setTo(cv.mean(lab8, agarMask), outside);
    const quarter = new cv.Mat();
    const qw = Math.max(1, Math.round(lab8.cols / 4));
    const qh = Math.max(1, Math.round(lab8.rows / 4));
    cv.resize(filled, quarter, new cv.Size(qw, qh), 0, 0, cv.INTER_AREA);
    return quarter;
  });
}

/**
 * The background median, taken twice: where the first pass finds colonies (more than
 * COLONY_DELTA_E from it, grown by one pixel), their pixels are replaced by that first estimate
 * and the median is taken again. On a crowded plate a 9 mm window is a fifth colony, enough to
 * tint a single-pass median and make bare agar between blue colonies look yellow.
 */
const COLONY_DELTA_E = 6;
function medianBackground(cv: OpenCv, quarter: Mat, full: Size, frame: WorkingFrame): Mat {
  return withMats((keep) => {
    const k = oddAtLeast(3, BACKGROUND_WINDOW_MM / frame.mmPerPx / 4);
    const first = keep(new cv.Mat());
    cv.medianBlur(quarter, first, k);
    const diff = keep(new cv.Mat());
    cv.absdiff(quarter, first, diff);
    const planes = keep(new cv.MatVector());
    cv.split(diff, planes);
    // Chebyshev distance in 8-bit Lab units is enough to spot colonies here.
    const colony = keep(new cv.Mat());
    cv.threshold(keep(planes.get(0)), colony, COLONY_DELTA_E * 2.55, 255, cv.THRESH_BINARY);
    for (const c of [1, 2]) {
      const p = keep(new cv.Mat());
      cv.threshold(keep(planes.get(c)), p, COLONY_DELTA_E, 255, cv.THRESH_BINARY);
      cv.bitwise_or(colony, p, colony);
    }
    cv.dilate(colony, colony, keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(3, 3))));
    const cleaned = keep(quarter.clone());
    first.copyTo(cleaned, colony);
    const median = keep(new cv.Mat());
    cv.medianBlur(cleaned, median, k);
    const up = new cv.Mat();
    cv.resize(median, up, new cv.Size(full.width, full.height), 0, 0, cv.INTER_LINEAR);
    return up;
  });
}

/** Real-unit weight of each 8-bit Lab plane: L* is stored ·255/100; a* and b* are offset only. */
const LAB8_UNIT = [100 / 255, 1, 1] as const;

/**
 * ΔE*ab (CIE 1976) between two 8-bit Lab images, one plane at a time: the offsets of a* and b*
 * cancel in the difference, so only L* needs rescaling, and no 3-channel float copy (16 MB at
 * 1.3 MP) is ever made.
 */
export function labDistance(cv: OpenCv, lab8: Mat, background8: Mat): Mat {
  return withMats((keep) => {
    const image = keep(new cv.MatVector());
    const background = keep(new cv.MatVector());
    cv.split(lab8, image);
    cv.split(background8, background);
    const sum = keep(cv.Mat.zeros(lab8.rows, lab8.cols, cv.CV_32F));
    const d = keep(new cv.Mat());
    const everywhere = keep(new cv.Mat());
    LAB8_UNIT.forEach((unit, c) => {
      cv.subtract(keep(image.get(c)), keep(background.get(c)), d, everywhere, cv.CV_32F);
      cv.multiply(d, d, d, unit ** 2);
      cv.add(sum, d, sum);
    });
    const out = new cv.Mat();
    cv.sqrt(sum, out);
    return out;
  });
}
