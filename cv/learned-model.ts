import { colourFeature } from './classify.ts';
import { labToHex } from './colour.ts';
import type { CandidateLabel } from './labels.ts';
import { fitLogistic, logisticProbability } from './logistic.ts';
import type {
  CandidateFeatures,
  FeatureRange,
  LearnedModel,
  Palette,
  PaletteColour,
} from './types.ts';

/**
 * A per-experiment model learned from the labels of checked plates (labels.ts):
 *
 * - colony or not: L2-regularised logistic regression (logistic.ts) over standardised features
 *   of each considered object (candidate-features.ts), with the default rules' verdict as its
 *   offset (log-odds +PRIOR_LOGIT for what they keep, −PRIOR_LOGIT for what they reject) and
 *   every coefficient shrunk towards 0: with no labels the model is the default rules, and with
 *   a few it moves away from them only where the lab's plates say;
 * - the colour: the nearest class mean in colour relative to the agar (ΔL*, Δa*, Δb*), one mean
 *   per colour name the person used, with its spread, as a palette (classify.ts sorts by it).
 *
 * It overrules the default rules only where the labels showed objects like the one at hand, and
 * only once it has seen enough colonies (isColony, decidesColonies). The model file is under 2 KB;
 * the same labels in the same order give the same model.
 */
export const MODEL_VERSION = 1;
/** The L2 penalty on standardised weights: enough to keep a handful of plates from overfitting. */
const LAMBDA = 1;
/** The default rules' verdict as prior log-odds: 0.88 for what they keep, 0.12 for the rest. */
const PRIOR_LOGIT = 2;
/** Labelled colonies needed per feature before the model decides colony or not (decidesColonies). */
const EVENTS_PER_FEATURE = 5;
/** How far past the labelled range of a feature the model still decides, in its SDs. */
const RANGE_MARGIN = 0.5;
/** Beyond this distance from the wall (mm), the wall no longer matters. */
const WALL_CAP_MM = 5;
/** The candidate search reaches at most this far (a factor on the detection thresholds). */
export const MIN_REACH = 0.6;

export const FEATURE_NAMES = [
  'dL',
  'da',
  'db',
  'chroma',
  'dE',
  'log_radius_mm',
  'log_elongation',
  'ridge_variation',
  'wall_mm',
  'default_colony',
  'log_plate_colonies',
] as const;

/** The plate's crowding describes the plate, not the object: it bounds nothing (isColony). */
const PLATE_FEATURE = FEATURE_NAMES.indexOf('log_plate_colonies');

export function featureVector(f: CandidateFeatures): number[] {
  return [
    f.dL,
    f.da,
    f.db,
    Math.hypot(f.da, f.db),
    f.dE,
    Math.log(Math.max(f.radiusMm, 0.01)),
    Math.log(Math.max(f.elongation, 0.1)),
    f.ridgeVariation,
    Math.min(f.wallMm, WALL_CAP_MM),
    f.verdict === 'colony' ? 1 : 0,
    Math.log1p(f.plateColonies),
  ];
}

export class ModelError extends Error {
  override name = 'ModelError';
}

/**
 * Learns a model from the labels of `plates` checked plates. `names` are the colour names in the
 * order the lab uses them (at most two); `reach` is how far its search reaches (searchReach,
 * worked out by the caller from plates read with the default search). Throws ModelError when the labels cannot teach anything.
 */
export function learnModel(
  labels: readonly CandidateLabel[],
  plates: number,
  names: readonly string[],
  reach = 1,
): LearnedModel {
  const usable = labels.filter((l) => l.features !== null);
  const colonies = usable.filter((l) => l.colony).length;
  if (colonies === 0)
    throw new ModelError('no checked colony lies on an object the analysis measured');
  if (colonies === usable.length)
    throw new ModelError('every object measured was a colony: nothing teaches what is not');
  const rows = usable.map((l) => featureVector(l.features!));
  const mean = FEATURE_NAMES.map((_, k) => rows.reduce((s, r) => s + r[k]!, 0) / rows.length);
  const sd = FEATURE_NAMES.map((_, k) => {
    const v = rows.reduce((s, r) => s + (r[k]! - mean[k]!) ** 2, 0) / rows.length;
    return v > 1e-12 ? Math.sqrt(v) : 1;
  });
  const z = rows.map((r) => r.map((v, k) => (v - mean[k]!) / sd[k]!));
  const fit = fitLogistic(
    z,
    usable.map((l) => (l.colony ? 1 : 0)),
    LAMBDA,
    usable.map((l) => prior(l.features!)),
  );
  return {
    format: 'rivalplate-model',
    version: MODEL_VERSION,
    plates,
    examples: {
      colonies,
      other: usable.length - colonies,
      found: usable.filter((l) => l.colony && l.features!.verdict === 'rejected').length,
      removed: usable.filter((l) => !l.colony && l.features!.verdict === 'colony').length,
    },
    features: [...FEATURE_NAMES],
    mean: mean.map(sig),
    sd: sd.map(sig),
    colonyRange: rangeOf(usable.filter((l) => l.colony))!,
    removedRange: rangeOf(usable.filter((l) => l.kind === 'removed')),
    intercept: sig(fit.intercept),
    weights: fit.weights.map(sig),
    lambda: LAMBDA,
    reach,
    palette: labelledPalette(usable, names),
  };
}

/**
 * How far the candidate search must reach, from the colonies people had to add where the search
 * (run with thresholds × `searched`) had considered nothing: the thresholds are lowered in
 * proportion to the share of checked colonies it missed, reach = searched × (1 − missed share),
 * and never below MIN_REACH. Worked out from plates read with one search only (the default one,
 * in the app and in `learn`), so refitting after every checked plate does not lower it again for
 * the same missed colonies. A rule of thumb of this project, not a published method: a lower
 * threshold finds more faint objects and more noise, and it is the model, fitted on plates read
 * with that reach, that tells them apart (the default rules never see what only the wider search
 * found). Plates where nothing was added keep the reach they were read with.
 */
export function searchReach(labels: readonly CandidateLabel[], searched = 1): number {
  const colonies = labels.filter((l) => l.colony).length;
  if (colonies === 0) return searched;
  const missed = labels.filter((l) => l.kind === 'added').length / colonies;
  return Math.round(Math.max(MIN_REACH, searched * (1 - missed)) * 1000) / 1000;
}

/**
 * Whether the model learned from enough colonies to overrule the default rules at all: at least
 * EVENTS_PER_FEATURE labelled colonies per feature (the events-per-variable rule for logistic
 * regression; 5 is the relaxed bound of Vittinghoff & McCulloch 2007, Am. J. Epidemiol.
 * 165:710, cited from memory). With fewer, it only names and sorts the colours.
 */
export function decidesColonies(model: LearnedModel): boolean {
  return model.examples.colonies >= coloniesNeeded(model);
}

export function coloniesNeeded(model: LearnedModel): number {
  return EVENTS_PER_FEATURE * model.features.length;
}

/**
 * The model's verdict on one object. It overrules the default rules only where its labels hold
 * enough such overrulings, and only for objects like those the person overruled them on.
 *
 * Enough: dropping what the rules kept is one decision, whose rare outcome is an object the
 * person removed; adding what they rejected is another, whose rare outcome is a colony the person
 * found among the rejected. Each needs as many of its rare outcome as decidesColonies asks of
 * colonies (the same events-per-variable rule). A model fitted on few of them learns its slopes
 * from the other objects: from three sparse plates of large colonies it learned "small and faint
 * is not a colony" from the specks, and then dropped 68 of the 419 small colonies of a plates-dev
 * photo that the default rules had right. Models from before these counts were kept are not held
 * to them. What only the wider search found, the default rules never judged: the model alone
 * does, its additions bounded by the rescued share (learned-select.ts).
 *
 * Like: it adds an object when each of its features lies within the range of the labelled
 * colonies, and drops one when each lies within the range of the objects the person removed
 * (both widened by RANGE_MARGIN standard deviations). Beyond them it would only extrapolate
 * (colonies of another size or colour than the lab ever checked), and the default rules stand.
 */
export function isColony(model: LearnedModel, f: CandidateFeatures): boolean {
  const byDefault = f.verdict === 'colony';
  if (!decidesColonies(model)) return byDefault;
  const overrulings = byDefault
    ? model.examples.removed
    : f.wider
      ? undefined
      : model.examples.found;
  if (overrulings !== undefined && overrulings < coloniesNeeded(model)) return byDefault;
  const range = byDefault ? model.removedRange : model.colonyRange;
  if (!range || !within(model, range, featureVector(f))) return byDefault;
  return colonyProbability(model, f) >= 0.5;
}

function within(model: LearnedModel, range: FeatureRange, x: readonly number[]): boolean {
  return x.every(
    (v, k) =>
      k === PLATE_FEATURE ||
      (v >= range.low[k]! - RANGE_MARGIN * model.sd[k]! &&
        v <= range.high[k]! + RANGE_MARGIN * model.sd[k]!),
  );
}

function rangeOf(labels: readonly CandidateLabel[]): FeatureRange | null {
  if (labels.length === 0) return null;
  const rows = labels.map((l) => featureVector(l.features!));
  return {
    low: FEATURE_NAMES.map((_, k) => sig(Math.min(...rows.map((r) => r[k]!)))),
    high: FEATURE_NAMES.map((_, k) => sig(Math.max(...rows.map((r) => r[k]!)))),
  };
}

/** The probability that an object is a colony, by the model. */
export function colonyProbability(model: LearnedModel, f: CandidateFeatures): number {
  const x = featureVector(f).map((v, k) => (v - model.mean[k]!) / model.sd[k]!);
  return logisticProbability({ intercept: model.intercept, weights: model.weights }, x, prior(f));
}

function prior(f: CandidateFeatures): number {
  return f.verdict === 'colony' ? PRIOR_LOGIT : -PRIOR_LOGIT;
}

/**
 * The two colours as the person named them: per name, the mean colour relative to the agar of
 * its labelled colonies and their RMS distance from it in classify.ts's colour feature. A name
 * with no measured colony, or a single name, gives no palette (null): colours are then sorted as
 * by default.
 */
function labelledPalette(
  labels: readonly CandidateLabel[],
  names: readonly string[],
): Palette | null {
  if (names.length !== 2) return null;
  const colours = names.map((name) => {
    const own = labels.filter((l) => l.colony && l.cls === name).map((l) => l.features!);
    if (own.length === 0) return null;
    const d = [0, 1, 2].map(
      (k) => own.reduce((s, f) => s + [f.dL, f.da, f.db][k]!, 0) / own.length,
    ) as [number, number, number];
    const centre = colourFeature(d);
    const spread = Math.sqrt(
      own.reduce((s, f) => {
        const p = colourFeature([f.dL, f.da, f.db]);
        return s + (p[0] - centre[0]) ** 2 + (p[1] - centre[1]) ** 2 + (p[2] - centre[2]) ** 2;
      }, 0) / own.length,
    );
    const colour: PaletteColour = {
      name,
      // The colony's look on a mid-grey agar: the model keeps no agar colour of its own.
      hex: labToHex([60 + d[0], d[1], d[2]]),
      deltaLab: [sig(d[0]), sig(d[1]), sig(d[2])],
      spread: sig(spread),
    };
    return colour;
  });
  if (!colours[0] || !colours[1]) return null;
  return { version: 1, colours: [colours[0], colours[1]] };
}

/** Six significant digits: the model's bytes do not depend on the last bits of a float. */
function sig(v: number): number {
  return Number(v.toPrecision(6));
}
