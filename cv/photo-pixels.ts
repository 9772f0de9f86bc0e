import type { AnalyzeOptions, Colony, PlateAnalysis } from './types.ts';

/**
 * The one place that converts between a photo's own upright pixels ("original": what the app,
 * the command line's output and the person's taps use) and the decoded copy the analysis reads
 * (at most a few megapixels; the worker and the command line decode large photos smaller).
 * `k` is original pixels per decoded pixel (≥ 1): lengths scale by k, areas by k². Between the
 * decoded copy and the analysis's working pixels, frame.ts converts.
 */
export function analysisToOriginal(
  a: PlateAnalysis,
  k: number,
  width: number,
  height: number,
): PlateAnalysis {
  return {
    ...a,
    width,
    height,
    scale: a.scale / k,
    dish: a.dish && {
      ...a.dish,
      cx: a.dish.cx * k,
      cy: a.dish.cy * k,
      rx: a.dish.rx * k,
      ry: a.dish.ry * k,
      r: a.dish.r * k,
    },
    colonies: a.colonies.map((c) => colonyToOriginal(c, k)),
    ...(a.neither && { neither: a.neither.map((c) => colonyToOriginal(c, k)) }),
    // Sizes in mm stay as they are: only pixel positions and radii scale.
    ...(a.candidates && {
      candidates: a.candidates.map((f) => ({ ...f, x: f.x * k, y: f.y * k, r: f.r * k })),
    }),
  };
}

function colonyToOriginal(c: Colony, k: number): Colony {
  return { ...c, x: c.x * k, y: c.y * k, r: c.r * k, area: c.area * k * k };
}

type GivenDish = NonNullable<AnalyzeOptions['dish']>;

/** A dish placed by the person (original pixels) in the decoded copy's pixels. */
export function dishToDecoded(d: GivenDish, k: number): GivenDish {
  return { cx: d.cx / k, cy: d.cy / k, rx: d.rx / k, ry: d.ry / k, angleDeg: d.angleDeg };
}

/** A point in the photo's own pixels (a tap, a checked colony) in the decoded copy's pixels. */
export function pointToDecoded<P extends { x: number; y: number }>(p: P, k: number): P {
  return { ...p, x: p.x / k, y: p.y / k };
}
