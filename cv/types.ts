/**
 * Public shapes of the plate-analysis core. Coordinates in every result are in ORIGINAL image
 * pixels of the upright photo (x to the right, y down, origin at the top-left pixel's corner),
 * whatever working resolution the pipeline used internally.
 */

/** An upright RGBA image, 4 bytes per pixel, row-major, as ImageData or a decoder gives it. */
export interface RgbaImage {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8Array | Uint8ClampedArray;
}

/** CIE L*a*b* (D65, 2° observer) as [L*, a*, b*]. */
export type Lab = readonly [number, number, number];

/** The dish as an ellipse (a tilted camera turns the circle into an ellipse). */
export interface Dish {
  cx: number;
  cy: number;
  /** Semi-axes in pixels; rx is along `angleDeg`. */
  rx: number;
  ry: number;
  angleDeg: number;
  /** Mean radius, (rx + ry) / 2, for code that wants a circle. */
  r: number;
  /** Radius scale (fraction of the dish) inside which colonies are counted: the wall band is outside it. */
  agarFraction: number;
  /** Where the geometry came from. */
  source: 'detected' | 'given';
}

export type ColonyClass = 0 | 1;

export interface Colony {
  x: number;
  y: number;
  /** Equivalent-circle radius, sqrt(area / π), in original pixels. */
  r: number;
  /** Area in original pixels². */
  area: number;
  cls: ColonyClass;
  /** 0.5 (a coin toss between the two classes) to 1 (certain). */
  confidence: number;
  /** The colony came out of splitting a touching group. */
  split: boolean;
  /**
   * Colonies this detection stands for: 1 for a single colony; more for a clump that could not
   * be split, estimated from its area against the typical single-colony area.
   */
  count: number;
  /** Colony colour, and its difference from the agar right around it. */
  lab: Lab;
  deltaLab: Lab;
  /** Seen through lid glare: its colour is mixed with the reflection and teaches no palette. */
  glareLit?: true;
}

export interface ColourClass {
  cls: ColonyClass;
  /** A short colour word ("blue", "cream", ...) or the palette's own name. */
  name: string;
  /** Typical colony colour as sRGB hex (#rrggbb). */
  hex: string;
  /** Mean colour difference from the agar. */
  deltaLab: Lab;
}

/** The two marker colours of an experiment, relative to the agar they grow on. */
export interface Palette {
  version: 1;
  colours: readonly [PaletteColour, PaletteColour];
}

export interface PaletteColour {
  name: string;
  hex: string;
  /** Colony colour minus local agar colour, in L*a*b*. */
  deltaLab: Lab;
  /** Spread of that difference across the colonies it was learned from (ΔE units). */
  spread: number;
}

export type QualityFlag =
  | { kind: 'dish-not-found' }
  | { kind: 'glare'; fraction: number }
  | { kind: 'clumps-estimated'; clumps: number; colonies: number }
  | { kind: 'low-confidence'; colonies: number }
  /** Objects of neither palette colour, listed in `neither` and left out of the count. */
  | { kind: 'colour-outliers'; colonies: number }
  /** Ink (writing on the lid or the plate) left out, in `pieces`; colonies under it may be too. */
  | { kind: 'ink'; pieces: number }
  | { kind: 'out-of-focus'; edgeWidthMm: number }
  /** The photo resolves the dish in fewer than COARSE_PX_PER_MM pixels per mm (analyze.ts). */
  | { kind: 'coarse-photo'; pxPerMm: number }
  | { kind: 'one-colour'; reason: string }
  /** No colony counted though part of the agar differs from the agar round it. */
  | { kind: 'nothing-found'; foregroundShare: number }
  /** More colony-sized objects set aside (writing, shading, neither colour) than counted. */
  | { kind: 'many-rejected'; setAside: number; counted: number }
  /** This share of the colonies lies near the detection threshold: the count leans on it. */
  | { kind: 'unstable-count'; share: number }
  /** The experiment's learned model and the default rules disagree on many objects: look. */
  | { kind: 'learned-differs'; added: number; dropped: number }
  /** The learned colours and the plate's own two colours sort many colonies differently: look. */
  | { kind: 'learned-recolours'; recoloured: number; colonies: number };

export interface PlateAnalysis {
  width: number;
  height: number;
  /** Working pixels per original pixel (≤ 1). */
  scale: number;
  dish: Dish | null;
  colonies: Colony[];
  /**
   * Colony-like objects of neither palette colour (a tinted droplet, a piece of writing, a strain
   * that is not one of the two): not counted, listed for the person to decide, and counted in the
   * 'colour-outliers' flag. Re-sorting against another palette considers them again.
   */
  neither?: Colony[];
  /** Colony totals per class name (clump estimates included). */
  counts: Record<string, number>;
  classes: ColourClass[];
  /** The agar colour in the middle of the dish. */
  agarLab: Lab;
  flags: QualityFlag[];
  /** Sharpness: mean width of colony edges in mm (focus.ts); null without colonies. */
  edgeWidthMm: number | null;
  /** Milliseconds per stage. */
  timings: Record<string, number>;
  /** Every object considered, kept or not, with its features: only with `withCandidates`. */
  candidates?: CandidateFeatures[];
  /** The experiment's learned model that decided this plate, or absent for the default rules. */
  model?: { plates: number };
}

/** What the default rules made of a considered object. */
export type CandidateVerdict = 'colony' | 'rejected';

/** One considered object's features (candidate-features.ts); x, y in original pixels. */
export interface CandidateFeatures {
  /** The region's id within this analysis. */
  id: number;
  x: number;
  y: number;
  /** Equivalent radius in original pixels. */
  r: number;
  /** Mean colour minus local agar, L*a*b*, and mean ΔE*ab per pixel. */
  dL: number;
  da: number;
  db: number;
  dE: number;
  /** Equivalent radius √(area/π) in mm. */
  radiusMm: number;
  /** area / (π·halfWidth²): 1 for a disc. */
  elongation: number;
  ridgeVariation: number;
  /** Distance from the dish wall in mm. */
  wallMm: number;
  verdict: CandidateVerdict;
  /** Objects the default rules kept on this plate: how crowded the plate is. */
  plateColonies: number;
  /**
   * Found only by a learned model's wider search (learned-model.ts searchReach): the default rules
   * never judged it. Known while a plate is read, not stored with labels.
   */
  wider?: true;
}

export interface FeatureRange {
  low: number[];
  high: number[];
}

/**
 * A per-experiment model learned from checked plates (learned-model.ts): which objects are
 * colonies (logistic regression over standardised features) and the two colours (a palette of
 * the labelled colonies' mean colours, named as the lab names them).
 */
export interface LearnedModel {
  format: 'rivalplate-model';
  version: 1;
  /** Checked plates it was learned from. */
  plates: number;
  /**
   * Labelled objects: colonies and not; of the colonies those the default rules had rejected
   * (`found`; absent in models learned before it was kept: their additions are not bounded); and
   * of the others those the default rules had kept (`removed`; absent in models learned before it
   * was kept: they drop colonies as their range allows).
   */
  examples: { colonies: number; other: number; found?: number; removed?: number };
  features: string[];
  mean: number[];
  sd: number[];
  /**
   * Where the model may overrule the default rules: each feature's smallest and largest value
   * among the labelled colonies (to add an object the rules rejected) and among the objects the
   * rules kept and the person removed (to drop one they kept; null when none was removed).
   */
  colonyRange: FeatureRange;
  removedRange: FeatureRange | null;
  intercept: number;
  weights: number[];
  /** The L2 penalty it was fitted with. */
  lambda: number;
  /**
   * How far the candidate search reaches: the factor on the detection thresholds (1 = the
   * defaults; lower finds fainter objects for the model to judge). See searchReach.
   */
  reach: number;
  palette: Palette | null;
}

export interface AnalyzeOptions {
  /**
   * The factor on the detection thresholds (0 < reach ≤ 1; default 1, or a learned model's reach
   * when the model decides colonies). Objects only the wider search finds go to the model, not
   * to the default rules.
   */
  searchReach?: number;
  /** Skip detection and use this dish (original pixels). */
  dish?: Pick<Dish, 'cx' | 'cy' | 'rx' | 'ry' | 'angleDeg'>;
  /**
   * Scale the dish found (or given) by this factor about its centre (default 1). A check of the
   * analysis, not a setting: 0.998 or 1.002 moves the dish's edge by about a pixel and the
   * working image's sampling by a fraction of one, which no plate's colonies notice, so what it
   * changes in the counts is chance (see `rivalplate accuracy --dish-scale`).
   */
  dishScale?: number;
  /** Classify against these two colours instead of clustering this plate alone. */
  palette?: Palette;
  /** Dish inner diameter in mm (default 90), used to turn mm sizes into pixels. */
  dishDiameterMm?: number;
  /** Also return every considered object with its features (`candidates`). */
  withCandidates?: boolean;
  /** Decide colonies and colours with this learned model instead of the default rules. */
  model?: LearnedModel;
  /** Report progress between stages (0..1). */
  onProgress?: (stage: string, fraction: number) => void;
}
