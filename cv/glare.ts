import type { WorkingFrame } from './frame.ts';
import { oddAtLeast } from './kernel-size.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import type { Mat, OpenCv } from './opencv.ts';

/**
 * Lid glare: light reflected off the lid, seen as a soft patch brighter and greyer than the agar
 * under it and several millimetres across.
 *
 * Input: the working image in 8-bit Lab at quarter resolution (agar only, the rest filled with
 * the agar mean) and the full-size agar mask. Output: an 8-bit 0/255 mask at working size.
 *
 * A pixel is glare-lit when its L* is more than GLARE_LIGHTER above the agar's large-scale level
 * (a median over GLARE_WINDOW_MM, which follows a lamp gradient but not a patch) and its chroma is
 * at least GLARE_GREYER below the agar's there. Only patches that hold a disc of
 * GLARE_MIN_DIAMETER_MM survive (an opening), larger than any pale colony or pale pair, or that
 * are the narrower panes of a reflected window (windowPanes), and the
 * soft halo around each is taken in by a dilation GLARE_HALO times that size.
 */
const GLARE_LIGHTER = 6;
const GLARE_GREYER = 2;
const GLARE_WINDOW_MM = 25;
const GLARE_MIN_DIAMETER_MM = 4;
/** The halo taken in round a patch, as a multiple of GLARE_MIN_DIAMETER_MM. */
const GLARE_HALO = 1.0;

export function glareMask(cv: OpenCv, quarterLab8: Mat, agarMask: Mat, frame: WorkingFrame): Mat {
  return withMats((keep) => {
    const qmm = frame.mmPerPx * 4; // mm per quarter-resolution pixel
    const tiny = keep(new cv.Mat());
    const tw = Math.max(1, Math.round(quarterLab8.cols / 4));
    const th = Math.max(1, Math.round(quarterLab8.rows / 4));
    cv.resize(quarterLab8, tiny, new cv.Size(tw, th), 0, 0, cv.INTER_AREA);
    cv.medianBlur(tiny, tiny, oddAtLeast(3, GLARE_WINDOW_MM / (qmm * 4)));
    const level = keep(new cv.Mat());
    cv.resize(tiny, level, new cv.Size(quarterLab8.cols, quarterLab8.rows), 0, 0, cv.INTER_LINEAR);

    const [L, C] = lightnessAndChroma(cv, keep, quarterLab8);
    const [Lb, Cb] = lightnessAndChroma(cv, keep, level);
    const lighter = keep(new cv.Mat());
    cv.subtract(L, Lb, lighter);
    const greyer = keep(new cv.Mat());
    cv.subtract(Cb, C, greyer);
    const a = keep(new cv.Mat());
    const b = keep(new cv.Mat());
    cv.threshold(lighter, a, GLARE_LIGHTER, 255, cv.THRESH_BINARY);
    cv.threshold(greyer, b, GLARE_GREYER, 255, cv.THRESH_BINARY);
    const both = keep(new cv.Mat());
    cv.bitwise_and(a, b, both);
    const lit = keep(new cv.Mat());
    both.convertTo(lit, cv.CV_8U);

    const panes = windowPanes(cv, keep, lit, qmm);
    const k = oddAtLeast(3, GLARE_MIN_DIAMETER_MM / qmm);
    const disc = keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(k, k)));
    cv.morphologyEx(lit, lit, cv.MORPH_OPEN, disc);
    cv.bitwise_or(lit, panes, lit);
    const h = oddAtLeast(3, (GLARE_HALO * GLARE_MIN_DIAMETER_MM) / qmm);
    cv.dilate(lit, lit, keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(h, h))));
    const out = new cv.Mat();
    cv.resize(lit, out, new cv.Size(agarMask.cols, agarMask.rows), 0, 0, cv.INTER_NEAREST);
    cv.bitwise_and(out, agarMask, out);
    return out;
  });
}

/**
 * The panes of a reflected window: a window's frame bars cut its reflection into panes that may
 * be narrower than GLARE_MIN_DIAMETER_MM. A lit patch that holds a disc half that wide, is at
 * least as large as the full disc and is convex (its area at least PANE_SOLIDITY of its convex
 * hull's, a rectangle's 1) is a pane; pale colonies are smaller, and a clump of them is lobed.
 * Solidity (area over convex hull area) is the usual measure of convexity (Gonzalez & Woods,
 * "Digital Image Processing", on regional descriptors, cited from memory).
 */
const PANE_SOLIDITY = 0.9;
/** The panes found in `lit` (0/255), kept in the caller's scope. */
function windowPanes(cv: OpenCv, keep: Keep, lit: Mat, qmm: number): Mat {
  const panes = keep(cv.Mat.zeros(lit.rows, lit.cols, cv.CV_8UC1));
  const opened = keep(new cv.Mat());
  const k = oddAtLeast(3, GLARE_MIN_DIAMETER_MM / 2 / qmm);
  cv.morphologyEx(
    lit,
    opened,
    cv.MORPH_OPEN,
    keep(cv.getStructuringElement(cv.MORPH_ELLIPSE, new cv.Size(k, k))),
  );
  const contours = keep(new cv.MatVector());
  const hierarchy = keep(new cv.Mat());
  cv.findContours(opened, contours, hierarchy, cv.RETR_EXTERNAL, cv.CHAIN_APPROX_SIMPLE);
  const minArea = Math.PI * (GLARE_MIN_DIAMETER_MM / 2 / qmm) ** 2;
  for (let i = 0; i < contours.size(); i++) {
    const contour = keep(contours.get(i));
    const area = cv.contourArea(contour);
    if (area < minArea) continue;
    const hull = keep(new cv.Mat());
    cv.convexHull(contour, hull, false, true);
    if (area >= PANE_SOLIDITY * cv.contourArea(hull))
      cv.drawContours(panes, contours, i, [255, 0, 0, 0], -1);
  }
  return panes;
}

/** L* (0..100) and chroma C*ab of an 8-bit Lab image, as CV_32F planes. */
function lightnessAndChroma(cv: OpenCv, keep: Keep, lab8: Mat): [Mat, Mat] {
  const f = keep(new cv.Mat());
  lab8.convertTo(f, cv.CV_32F);
  const planes = keep(new cv.MatVector());
  cv.split(f, planes);
  const L = keep(planes.get(0));
  const a = keep(planes.get(1));
  const b = keep(planes.get(2));
  const Ls = keep(new cv.Mat());
  L.convertTo(Ls, cv.CV_32F, 100 / 255);
  a.convertTo(a, cv.CV_32F, 1, -128);
  b.convertTo(b, cv.CV_32F, 1, -128);
  const C = keep(new cv.Mat());
  cv.magnitude(a, b, C);
  return [Ls, C];
}
