import { type AgarModel, modelAgar, WALL_ZONE_MM } from './agar.ts';
import { resizeRegion } from './banded-resize.ts';
import { type Blob, contrastBlobs } from './blob-seeds.ts';
import { candidateFeatures } from './candidate-features.ts';
import { selectCandidates } from './candidates.ts';
import { classifyAside } from './classify.ts';
import { now } from './clock.ts';
import { DEFAULT_DISH_MM, detectDish, ellipseRadius, givenDish } from './dish.ts';
import { deltaESlope, edgeWidthMm } from './focus.ts';
import { segmentForeground } from './foreground.ts';
import {
  frameForDish,
  inscribedDish,
  originalPxPerMm,
  toOriginal,
  type WorkingFrame,
} from './frame.ts';
import { checkImage } from './image-input.ts';
import { sortByLearnedColours } from './learned-colours.ts';
import { decidesColonies } from './learned-model.ts';
import { learnedCandidates } from './learned-select.ts';
import type { Keep } from './mat-scope.ts';
import { withMats } from './mat-scope.ts';
import { measureRegions } from './measure.ts';
import { loadOpenCv, type Mat, type OpenCv } from './opencv.ts';
import { plateDoubts } from './plate-doubts.ts';
import { type Split, splitTouching } from './split.ts';
import { colonyFlags, countsByClass } from './summary.ts';
import type {
  AnalyzeOptions,
  Colony,
  Dish,
  PlateAnalysis,
  QualityFlag,
  RgbaImage,
} from './types.ts';

/**
 * Edges wider than this (mm) mean the photo is out of focus (see focus.ts). Calibrated on generated
 * plates: sharp photos measure 0.29–0.38 mm (JPEG demo photos 0.42–0.44), a Gaussian blur of
 * σ ≈ 0.14 mm passes 0.5.
 */
const BLURRED_EDGE_MM = 0.5;
const SMOOTHING_MM = 0.07;
/**
 * Below this many photo pixels per millimetre a 0.5 mm colony (about the smallest counted,
 * common practice) spans fewer than 2.5 pixels, near the two samples per detail the sampling
 * theorem asks for: small colonies are lost or taken for specks, and the count is flagged.
 */
const COARSE_PX_PER_MM = 5;
/** More than this share of a plate's objects of neither learned colour: not the model's medium. */
const UNLIKE_SHARE = 0.5;

/**
 * Analyses one plate photo: dish → working frame → agar model → foreground → split → measure →
 * select → classify. Every opencv object lives in one scope and is freed when the analysis ends,
 * whether it succeeds or throws.
 *
 * Input: an upright RGBA image (any size). Output: PlateAnalysis in the image's own pixels.
 */
export async function analyzePlate(
  image: RgbaImage,
  options: AnalyzeOptions = {},
): Promise<PlateAnalysis> {
  checkImage(image);
  const { cv } = await loadOpenCv();
  return withMats((keep) => runPipeline(cv, keep, image, options));
}

function runPipeline(
  cv: OpenCv,
  keep: Keep,
  image: RgbaImage,
  options: AnalyzeOptions,
): PlateAnalysis {
  const timings: Record<string, number> = {};
  let last = now();
  const stage = (name: string, fraction: number) => {
    const t = now();
    timings[name] = t - last;
    last = t;
    options.onProgress?.(name, fraction);
  };
  const flags: QualityFlag[] = [];

  // The photo stays in JavaScript memory: the dish is found on a preview and the working image
  // made from it band by band, so the full-size pixels never enter the WASM heap.
  const dishMm = options.dishDiameterMm ?? DEFAULT_DISH_MM;
  let dish: Dish | null = options.dish ? givenDish(options.dish) : detectDish(cv, image, dishMm);
  if (!dish) flags.push({ kind: 'dish-not-found' });
  if (dish && options.dishScale !== undefined) dish = scaledDish(dish, options.dishScale);
  const geometry = dish ?? inscribedDish(image.width, image.height);
  const frame = frameForDish(geometry, image.width, image.height, dishMm);
  const pxPerMm = originalPxPerMm(frame);
  if (pxPerMm < COARSE_PX_PER_MM) flags.push({ kind: 'coarse-photo', pxPerMm: round(pxPerMm, 1) });
  stage('dish', 0.2);

  const rgb = keep(workingImage(cv, image, frame));
  const dishW = toWorkingDish(geometry, frame);
  stage('working-image', 0.3);

  const agar = modelAgar(cv, keep, rgb, dishW, frame);
  if (agar.glareFraction > 0.005)
    flags.push({ kind: 'glare', fraction: round(agar.glareFraction, 3) });
  stage('background', 0.45);

  const reach =
    options.searchReach ??
    (options.model && decidesColonies(options.model) ? options.model.reach : 1);
  const fg = segmentForeground(cv, keep, agar, frame, reach);
  stage('foreground', 0.6);
  const blobs = contrastBlobs(cv, agar.deltaE, agar.countMask, fg.mask, frame.mmPerPx);
  const split = splitTouching(cv, keep, rgb, fg.mask, frame, { blobs, deltaE: agar.deltaE });
  stage('split', 0.75);
  const slope = deltaESlope(cv, keep, agar.deltaE);
  const measured = measureSplit(split, agar, slope, blobs);
  const { candidates: byDefault, rejected } = selectCandidates(
    measured.regions,
    measured.components,
    {
      typicalRadius: split.typicalRadius,
      mmPerPx: frame.mmPerPx,
      scale: frame.scale,
      threshold: fg.threshold,
      faintThreshold: fg.faintThreshold,
      nearWall: (r) =>
        (1 - ellipseRadius(dishW, r.x, r.y)) * dishW.r * frame.mmPerPx < WALL_ZONE_MM,
      nearGlare: (r) => onMask(agar.glareZone, r.x, r.y),
    },
  );
  // What only a learned model's wider search found is split and measured on its own, after the
  // default reading, which it cannot change: the model judges it, the default rules never see it.
  const wider = fg.widerOnly
    ? renumbered(
        measureSplit(splitTouching(cv, keep, rgb, fg.widerOnly, frame), agar, slope),
        split.regionCount,
        split.componentCount,
      )
    : { regions: [], components: [] };
  const allRegions = [...measured.regions, ...wider.regions];
  // The person looks there: a colony under writing shares the stroke's blob and may go with it.
  if (rejected.strokes > 0) flags.push({ kind: 'ink', pieces: rejected.strokes });
  // Learning's hook: every object considered, with its features, only when asked for.
  const considered =
    options.withCandidates || options.model
      ? candidateFeatures({
          regions: allRegions,
          components: [...measured.components, ...wider.components],
          verdict: new Map(byDefault.map((c) => [c.region.id, 'colony' as const])),
          mmPerPx: frame.mmPerPx,
          scale: frame.scale,
          wallMm: (x, y) => (1 - ellipseRadius(dishW, x, y)) * dishW.r * frame.mmPerPx,
          toOriginal: (x, y) => toOriginal(frame, x, y),
          firstWiderId: split.regionCount + 1,
        })
      : null;
  const learned = options.model
    ? learnedCandidates(options.model, considered!, allRegions, byDefault)
    : null;
  if (learned?.flag) flags.push(learned.flag);
  const candidates = learned?.candidates ?? byDefault;
  stage('measure', 0.85);

  const samples = candidates.map((c) => ({
    lab: c.region.lab,
    deltaLab: subtract(c.region.lab, c.region.backgroundLab),
  }));
  const lit = candidates.map((c) => onMask(agar.glare, c.region.x, c.region.y));
  const sorted = options.model?.palette
    ? sortByLearnedColours(samples, lit, options.model.palette)
    : { classes: classifyAside(samples, lit, options.palette), flag: null };
  const classes = sorted.classes;
  if (sorted.flag) flags.push(sorted.flag);
  const all: Colony[] = candidates.map((c, i) => {
    const [x, y] = toOriginal(frame, c.region.x, c.region.y);
    const area = c.region.area / frame.scale ** 2;
    return {
      x: round(x, 1),
      y: round(y, 1),
      r: round(Math.sqrt(area / Math.PI), 2),
      area: Math.round(area),
      cls: classes.cls[i]!,
      confidence: round(classes.confidence[i]!, 3),
      split: c.split,
      count: c.count,
      lab: roundLab(samples[i]!.lab),
      deltaLab: roundLab(samples[i]!.deltaLab),
      ...(lit[i] ? { glareLit: true as const } : {}),
    };
  });
  // An object of neither colour is shown for the person to decide. A learned model that decides
  // colonies has judged each object one, and a colour unlike both of the lab's is still set
  // aside (counted, they made about 40 false colonies on one plates-dev photo read with a model
  // learned from three plates) — unless most of the plate is unlike them: then the plate is not
  // of the medium the model learned, and its objects take the nearer colour as before.
  const outliers = classes.outlier.filter(Boolean).length;
  const judged = options.model !== undefined && decidesColonies(options.model);
  const unlikeModel = judged && outliers > UNLIKE_SHARE * all.length;
  const outlier = (i: number) => !unlikeModel && classes.outlier[i]!;
  const colonies = all.filter((_, i) => !outlier(i));
  const neither = all.filter((_, i) => outlier(i));
  stage('classify', 0.95);
  flags.push(
    ...plateDoubts({
      counted: colonies.length,
      foregroundShare: cv.countNonZero(fg.mask) / Math.max(1, cv.countNonZero(agar.countMask)),
      setAside: rejected.strokes + rejected.shades + neither.length,
      contrasts: candidates.filter((_, i) => !classes.outlier[i]).map((c) => c.region.contrast),
      threshold: fg.threshold,
    }),
  );

  flags.push(...colonyFlags(colonies, classes.oneColour, neither.length));
  const edge = edgeWidthMm(
    candidates.map((c) => c.region),
    frame.mmPerPx,
  );
  if (edge !== null && edge > BLURRED_EDGE_MM)
    flags.push({ kind: 'out-of-focus', edgeWidthMm: round(edge, 3) });
  stage('focus', 1);

  if (dish) dish = { ...dish, cx: round(dish.cx, 1), cy: round(dish.cy, 1) };
  return {
    width: image.width,
    height: image.height,
    scale: frame.scale,
    dish,
    colonies,
    neither,
    counts: countsByClass(colonies, classes.classes),
    classes: classes.classes,
    agarLab: roundLab(agar.agarLab),
    flags,
    edgeWidthMm: edge === null ? null : round(edge, 3),
    timings,
    ...(options.withCandidates ? { candidates: considered! } : {}),
    ...(options.model ? { model: { plates: options.model.plates } } : {}),
  };
}

function workingImage(cv: OpenCv, image: RgbaImage, frame: WorkingFrame): Mat {
  return withMats((keep) => {
    const small = keep(resizeRegion(cv, image, frame.roi, frame.scale, frame.width, frame.height));
    const rgb = new cv.Mat();
    cv.cvtColor(small, rgb, cv.COLOR_RGBA2RGB);
    // Smoothing at the scale of the smallest colony counted (a Gaussian of σ = SMOOTHING_MM, a
    // quarter of a 0.45 mm colony's diameter): noise, JPEG blocks and a phone's noise reduction
    // are averaged down while a colony, however faint, keeps its contrast over its area. Its
    // scale is in millimetres, so the same physical detail is kept whatever the camera.
    cv.GaussianBlur(rgb, rgb, new cv.Size(0, 0), SMOOTHING_MM / frame.mmPerPx);
    return rgb;
  });
}

type MeasuredRegions = ReturnType<typeof measureRegions>;

function measureSplit(
  split: Split,
  agar: AgarModel,
  slope: Mat,
  bumps: readonly Blob[] = [],
): MeasuredRegions {
  return measureRegions(
    split.regions,
    split.regionCount,
    split.components,
    split.componentCount,
    split.distance,
    agar.lab8,
    agar.background8,
    agar.deltaE,
    slope,
    agar.rim,
    split.ridge,
    bumps,
  );
}

/** Region and blob ids moved past the default reading's, so that both sets can be considered. */
function renumbered(m: MeasuredRegions, regions: number, components: number): MeasuredRegions {
  return {
    ...m,
    regions: m.regions.map((r) => ({
      ...r,
      id: r.id + regions,
      component: r.component + components,
    })),
    components: m.components.map((c) => ({ ...c, id: c.id + components })),
  };
}

function onMask(mask: Mat, x: number, y: number): boolean {
  return mask.data[Math.floor(y) * mask.cols + Math.floor(x)]! > 0;
}

function scaledDish(d: Dish, k: number): Dish {
  return { ...d, rx: d.rx * k, ry: d.ry * k, r: d.r * k };
}

function toWorkingDish(d: Dish, f: WorkingFrame): Dish {
  return {
    ...d,
    cx: (d.cx - f.roi.x) * f.scale,
    cy: (d.cy - f.roi.y) * f.scale,
    rx: d.rx * f.scale,
    ry: d.ry * f.scale,
    r: d.r * f.scale,
  };
}

function subtract(a: readonly number[], b: readonly number[]): [number, number, number] {
  return [a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!];
}

function roundLab(l: readonly number[]): [number, number, number] {
  return [round(l[0]!, 2), round(l[1]!, 2), round(l[2]!, 2)];
}

function round(v: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
