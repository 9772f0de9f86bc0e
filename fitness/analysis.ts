/**
 * A whole experiment: every assay, replicate groups, the marker effect, reciprocal pairs, group
 * comparisons and per-line trajectories.
 */
import {
  type AssayInput,
  type AssayOptions,
  type AssayResult,
  computeAssay,
} from './competition.ts';
import { FitnessError } from './errors.ts';
import { type LabComparisons, labComparisons } from './lab-comparisons.ts';
import { correctedMean } from './marker-correction.ts';
import {
  extraSumOfSquares,
  type FTest,
  type SharedCurveTest,
  sharedCurveTest,
} from './nested-models.ts';
import { type ObservedSpread, type ReplicatesPlan, replicatesFromSpread } from './planning.ts';
import {
  type Anova,
  oneSampleTTest,
  oneWayAnova,
  type Summary,
  summarise,
  type TTest,
  welchTTest,
} from './replicate-stats.ts';
import {
  type CurveFit,
  curveBand,
  fitHyperbolic,
  fitNull,
  fitPowerLaw,
  fitStep,
  type ModelFailure,
  type NullFit,
  type StepFit,
} from './trajectories.ts';

/** Generations at which each fitted curve and its band are given: this many steps from 0. */
export const BAND_STEPS = 40;

export const DEFAULT_MARKER_CONTROL_GROUP = 'marker-control';

export interface AnalysisOptions extends AssayOptions {
  /** Group whose assays compete the reference against itself with the other marker. */
  markerControlGroup?: string;
  /**
   * Divide each other assay's W by the marker controls' mean W and subtract their mean r
   * (off by default). Needs at least one marker-control assay.
   */
  correctMarker?: boolean;
  /**
   * Groups to compare with one test across them (two: Welch's t-test; more: one-way ANOVA). The
   * lab's comparisons of lines (`comparisons`) are made in every run.
   */
  compare?: string[];
  maxChangePoints?: number;
  /**
   * When set, each group also says how many replicate assays a new group like it would need to
   * detect this difference in W from another group (Welch-type two-sample design, 80 % power).
   */
  detectDifference?: number;
}

export interface GroupResult {
  group: string;
  /** Assays of the group left out of these statistics: W only bounded, or not computable. */
  bounded: number;
  dropped: number;
  W: Summary;
  W_vs_1: TTest | null;
  r: Summary;
  r_vs_0: TTest | null;
  /** Present when detectDifference was given; null when the group has one assay. */
  replicatesNeeded?: ReplicatesPlan | null;
}

export interface MarkerEffect {
  group: string;
  n: number;
  W: Summary;
  W_vs_1: TTest | null;
  r: Summary;
  r_vs_0: TTest | null;
  /** True when the other assays were corrected by it. */
  applied: boolean;
}

export interface ReciprocalResult {
  line: string;
  generation: number;
  /** Mean W per marker the test strain carried. */
  byMarker: { marker: string; n: number; meanW: number; meanR: number }[];
  /** Average of the per-marker means: each marker weighs the same. */
  meanW: number;
  meanR: number;
}

export interface Comparison {
  groups: string[];
  test: 'welch' | 'anova';
  W: TTest | Anova | null;
  r: TTest | Anova | null;
}

export interface BandPoint {
  generation: number;
  w: number;
  low: number;
  high: number;
}

export interface LineTrajectory {
  line: string;
  points: { generation: number; w: number; assay: string }[];
  /** w = 1: no change from the ancestor. */
  null: NullFit | ModelFailure;
  hyperbolic: CurveFit | ModelFailure;
  powerLaw: CurveFit | ModelFailure;
  step: StepFit | ModelFailure;
  /** Extra-sum-of-squares F test of the null model against each curve; null when not fitted. */
  vsNull: { hyperbolic: FTest | null; powerLaw: FTest | null };
  /** Each fitted curve with its 95 % band, from generation 0 to the last measured. */
  bands: { hyperbolic: BandPoint[] | null; powerLaw: BandPoint[] | null };
  /** Fitted models ranked by AIC, with differences from the best. */
  ranking: {
    model: string;
    aic: number;
    aicc: number | null;
    bic: number;
    deltaAic: number;
    deltaBic: number;
  }[];
}

export interface Uncorrected {
  W: number;
  r: number;
  W_ci: [number, number] | null;
}

export interface AnalysedAssay extends AssayResult {
  /** Present when the marker correction was applied: the values before it. */
  uncorrected?: Uncorrected;
}

export interface LeftOut {
  assay: string;
  group: string;
  reason: 'bounded' | 'not computable';
  message: string;
}

export interface Analysis {
  assays: AnalysedAssay[];
  errors: { assay: string; group: string; message: string }[];
  /**
   * Assays left out of every mean, test and fit, with the reason: a strain had no colony (W is
   * only a bound) or the assay could not be computed. Each group counts its own.
   */
  leftOut: LeftOut[];
  groups: GroupResult[];
  markerEffect: MarkerEffect | null;
  reciprocal: ReciprocalResult[];
  /** The test across the groups named in options.compare; null without it. */
  comparison: Comparison | null;
  /** Lines within each generation, each line against W = 1, each line's changes. */
  comparisons: LabComparisons;
  trajectories: LineTrajectory[];
  /** Whether the lines share one curve, per curve model; empty with fewer than two lines. */
  sharedCurves: (SharedCurveTest | ModelFailure)[];
  /**
   * With detectDifference: replicates needed judged from the SD pooled within all groups but
   * the marker controls (steadier than any one small group's SD); null without two replicates.
   */
  pooledReplicatesNeeded?: ReplicatesPlan | null;
}

function by<T>(items: readonly T[], key: (t: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const item of items) {
    const k = key(item);
    const list = map.get(k);
    if (list) list.push(item);
    else map.set(k, [item]);
  }
  return map;
}

function spreadOf(assays: readonly AssayResult[], sd: number): ObservedSpread {
  const mean = (f: (a: AssayResult) => number) =>
    assays.reduce((s, a) => s + f(a), 0) / assays.length;
  const perStrain = (s: 'start' | 'end') =>
    mean((a) => (a[s].test.colonies + a[s].reference.colonies) / 2);
  return {
    sd,
    meanW: mean((a) => a.W),
    countingSe: assays.map((a) => a.countingSe.W),
    colonies: { start: perStrain('start'), end: perStrain('end') },
    mRef: mean((a) => a.mRef),
  };
}

/** SD of W pooled within groups: √(Σ(nᵢ − 1)·sᵢ² / Σ(nᵢ − 1)) over groups with n ≥ 2. */
function pooledSd(groups: readonly GroupResult[]): number | null {
  let ss = 0;
  let df = 0;
  for (const g of groups) {
    if (g.W.sd === null) continue;
    ss += (g.W.n - 1) * g.W.sd ** 2;
    df += g.W.n - 1;
  }
  return df > 0 ? Math.sqrt(ss / df) : null;
}

/**
 * One group's statistics. With `controls` (the marker correction was applied), the means are
 * the corrected ones and their intervals and tests carry the controls' uncertainty
 * (marker-correction.ts).
 */
function groupResult(
  group: string,
  assays: readonly AnalysedAssay[],
  leftOut: readonly LeftOut[],
  detect?: number,
  controls?: readonly AssayResult[],
): GroupResult {
  const mine = leftOut.filter((l) => l.group === group);
  const stats = (field: 'W' | 'r', mu0: number) => {
    if (controls) {
      const c = correctedMean(
        assays.map((a) => (a.uncorrected ?? a)[field]),
        controls.map((a) => a[field]),
        field === 'W' ? 'ratio' : 'difference',
      );
      return { summary: c.summary, test: c.test };
    }
    const values = assays.map((a) => a[field]);
    return { summary: summarise(values), test: oneSampleTTest(values, mu0) };
  };
  const W = stats('W', 1);
  const r = stats('r', 0);
  const result: GroupResult = {
    group,
    bounded: mine.filter((l) => l.reason === 'bounded').length,
    dropped: mine.filter((l) => l.reason === 'not computable').length,
    W: W.summary,
    W_vs_1: W.test,
    r: r.summary,
    r_vs_0: r.test,
  };
  if (detect !== undefined) {
    const sd = result.W.sd;
    result.replicatesNeeded =
      sd === null ? null : replicatesFromSpread(spreadOf(assays, sd), detect);
  }
  return result;
}

function applyMarkerCorrection(a: AssayResult, meanW: number, meanR: number): AnalysedAssay {
  const W = a.W / meanW;
  const r = a.r - meanR;
  return {
    ...a,
    W,
    r,
    rPerDay: r / a.days,
    // s stays r / g: the corrected r over the same generations (its counting SE is unchanged).
    sPerGeneration: r / a.generationsRef,
    W_ci: a.W_ci ? [a.W_ci[0] / meanW, a.W_ci[1] / meanW] : null,
    countingSe: { ...a.countingSe, W: a.countingSe.W / meanW },
    uncorrected: { W: a.W, r: a.r, W_ci: a.W_ci },
    flags: [
      ...a.flags,
      {
        code: 'marker-corrected',
        message: `corrected for the marker effect: W ${a.W.toFixed(4)} / ${meanW.toFixed(4)}, r ${a.r.toFixed(4)} − ${meanR.toFixed(4)}`,
      },
    ],
  };
}

function trajectory(
  line: string,
  assays: readonly AssayResult[],
  maxChangePoints: number,
): LineTrajectory {
  const points = assays.map((a) => ({ generation: a.generation, w: a.W, assay: a.assay }));
  const nullFit = fitNull(points);
  const hyperbolic = fitHyperbolic(points);
  const powerLaw = fitPowerLaw(points);
  const step = fitStep(points, maxChangePoints);
  const fitted = [nullFit, hyperbolic, powerLaw, step].filter(
    (m): m is NullFit | CurveFit | StepFit => 'aic' in m,
  );
  const last = Math.max(...points.map((p) => p.generation));
  const grid = Array.from({ length: BAND_STEPS + 1 }, (_, i) => (last * i) / BAND_STEPS);
  const vs = (curve: CurveFit | ModelFailure) =>
    'reason' in curve || 'reason' in nullFit
      ? null
      : extraSumOfSquares({ rss: nullFit.rss, parameters: 0 }, { ...curve, parameters: 2 });
  const band = (curve: CurveFit | ModelFailure) =>
    'reason' in curve ? null : curveBand(curve, grid);
  const bestAic = Math.min(...fitted.map((m) => m.aic));
  const bestBic = Math.min(...fitted.map((m) => m.bic));
  const ranking = fitted
    .map((m) => ({
      model: m.model,
      aic: m.aic,
      aicc: m.aicc,
      bic: m.bic,
      deltaAic: m.aic - bestAic,
      deltaBic: m.bic - bestBic,
    }))
    .sort((a, b) => a.aic - b.aic);
  return {
    line,
    points,
    null: nullFit,
    hyperbolic,
    powerLaw,
    step,
    vsNull: { hyperbolic: vs(hyperbolic), powerLaw: vs(powerLaw) },
    bands: { hyperbolic: band(hyperbolic), powerLaw: band(powerLaw) },
    ranking,
  };
}

export function analyse(inputs: readonly AssayInput[], options: AnalysisOptions = {}): Analysis {
  const controlGroup = options.markerControlGroup ?? DEFAULT_MARKER_CONTROL_GROUP;
  const errors: Analysis['errors'] = [];
  const raw: AssayResult[] = [];
  for (const input of inputs) {
    try {
      raw.push(computeAssay(input, options));
    } catch (e) {
      if (!(e instanceof FitnessError)) throw e;
      errors.push({ assay: input.assay, group: input.group, message: e.message });
    }
  }
  const leftOut: LeftOut[] = [
    ...raw
      .filter((a) => a.bound !== null)
      .map((a) => ({
        assay: a.assay,
        group: a.group,
        reason: 'bounded' as const,
        message: a.flags.find((f) => f.code === 'bounded')!.message,
      })),
    ...errors.map((e) => ({ ...e, reason: 'not computable' as const })),
  ];
  const controls = raw.filter((a) => a.group === controlGroup && a.bound === null);
  let markerEffect: MarkerEffect | null = null;
  let assays: AnalysedAssay[] = raw;
  if (controls.length > 0) {
    const g = groupResult(controlGroup, controls, leftOut);
    markerEffect = { ...g, n: controls.length, applied: Boolean(options.correctMarker) };
    if (options.correctMarker) {
      assays = raw.map((a) =>
        a.group === controlGroup ? a : applyMarkerCorrection(a, g.W.mean, g.r.mean),
      );
    }
  } else if (options.correctMarker) {
    throw new FitnessError(
      `marker correction asked for, but no assay of group "${controlGroup}" could be computed`,
    );
  }
  const usable = assays.filter((a) => a.bound === null);
  const correctedBy = options.correctMarker ? controls : undefined;
  const groups = [...by(usable, (a) => a.group)].map(([group, list]) =>
    groupResult(
      group,
      list,
      leftOut,
      options.detectDifference,
      group === controlGroup ? undefined : correctedBy,
    ),
  );
  const tested = usable.filter((a) => a.group !== controlGroup);

  const compareNames = options.compare ?? [];
  const byGroup = by(usable, (a) => a.group);
  for (const name of compareNames) {
    if (!byGroup.has(name))
      throw new FitnessError(`no computed assay in group "${name}" to compare`);
  }
  let comparison: Comparison | null = null;
  const values = (field: 'W' | 'r') =>
    compareNames.map((name) => byGroup.get(name)!.map((a) => a[field]));
  if (compareNames.length === 2) {
    const [wa, wb] = values('W') as [number[], number[]];
    const [ra, rb] = values('r') as [number[], number[]];
    comparison = {
      groups: compareNames,
      test: 'welch',
      W: welchTTest(wa, wb),
      r: welchTTest(ra, rb),
    };
  } else if (compareNames.length > 2) {
    comparison = {
      groups: compareNames,
      test: 'anova',
      W: oneWayAnova(values('W')),
      r: oneWayAnova(values('r')),
    };
  }

  const reciprocal: ReciprocalResult[] = [];
  for (const list of by(
    tested.filter((a) => a.testMarker),
    (a) => `${a.line}\u0000${a.generation}`,
  ).values()) {
    const markers = by(list, (a) => a.testMarker!);
    if (markers.size < 2) continue;
    const byMarker = [...markers].map(([marker, ms]) => ({
      marker,
      n: ms.length,
      meanW: ms.reduce((s, a) => s + a.W, 0) / ms.length,
      meanR: ms.reduce((s, a) => s + a.r, 0) / ms.length,
    }));
    reciprocal.push({
      line: list[0]!.line,
      generation: list[0]!.generation,
      byMarker,
      meanW: byMarker.reduce((s, m) => s + m.meanW, 0) / byMarker.length,
      meanR: byMarker.reduce((s, m) => s + m.meanR, 0) / byMarker.length,
    });
  }

  const trajectories: LineTrajectory[] = [];
  for (const [line, list] of by(tested, (a) => a.line)) {
    if (new Set(list.map((a) => a.generation)).size < 2) continue;
    trajectories.push(trajectory(line, list, options.maxChangePoints ?? 3));
  }
  const sharedCurves =
    trajectories.length < 2
      ? []
      : (['hyperbolic', 'power-law'] as const).map((model) => sharedCurveTest(model, trajectories));
  const result: Analysis = {
    assays,
    errors,
    leftOut,
    groups,
    markerEffect,
    reciprocal,
    comparison,
    comparisons: labComparisons(
      tested,
      options.correctMarker ? controls.map((a) => a.W) : undefined,
    ),
    trajectories,
    sharedCurves,
  };
  if (options.detectDifference !== undefined) {
    const sd = pooledSd(groups.filter((g) => g.group !== controlGroup));
    result.pooledReplicatesNeeded =
      sd === null ? null : replicatesFromSpread(spreadOf(tested, sd), options.detectDifference);
  }
  return result;
}
