import type { AnalyzeOptions, PlateAnalysis } from '../cv/types.ts';

/**
 * The worker analyses a decoded copy at most WORKING_MAX_SIDE pixels long; the app keeps every
 * coordinate in the original photo's upright pixels. `k` is original pixels per decoded pixel
 * (≥ 1). Lengths scale by k, areas by k².
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
    colonies: a.colonies.map((c) => ({
      ...c,
      x: c.x * k,
      y: c.y * k,
      r: c.r * k,
      area: c.area * k * k,
    })),
    // Sizes in mm stay as they are: only pixel positions and radii scale.
    ...(a.candidates && {
      candidates: a.candidates.map((f) => ({ ...f, x: f.x * k, y: f.y * k, r: f.r * k })),
    }),
  };
}

type GivenDish = NonNullable<AnalyzeOptions['dish']>;

/** A dish placed by the person (original pixels) in the decoded copy's pixels. */
export function dishToDecoded(d: GivenDish, k: number): GivenDish {
  return { cx: d.cx / k, cy: d.cy / k, rx: d.rx / k, ry: d.ry / k, angleDeg: d.angleDeg };
}
