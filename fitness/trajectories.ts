/**
 * Fitness trajectories: models of relative fitness w against generations t, fitted to the
 * replicate-level values of one line.
 *
 * - hyperbolic  w = 1 + a·t/(t + b)   (a: asymptotic gain; b: generations to half of it;
 *   Lenski & Travisano 1994, PNAS 91:6808)
 * - power law   w = (b·t + 1)^a       (Wiser, Ribeck & Lenski 2013, Science 342:1364)
 *   (the citations in this comment are from memory)
 * - step        piecewise-constant w with k change points, placed by exact optimal segmentation
 *   (dynamic programming over the segment-neighbourhood problem, Auger & Lawrence 1989, Bull.
 *   Math. Biol. 51:39), k chosen by BIC.
 *
 * The two curves are fitted by nonlinear least squares with ml-levenberg-marquardt (analytic
 * Jacobian), started from a profiled grid so the fit does not hinge on a guess. Standard errors
 * are √diag(σ̂²·(JᵀJ)⁻¹) with σ̂² = RSS/(n − p), as R's nls and SciPy's curve_fit report them.
 * Log-likelihood, AIC and BIC follow R's logLik.nls for a Gaussian least-squares fit:
 * logLik = −n/2·(ln 2π + 1 + ln(RSS/n)), AIC = −2·logLik + 2k, BIC = −2·logLik + k·ln n, with
 * k = model parameters + 1 (the residual variance counts as a parameter). AICc = AIC +
 * 2k(k + 1)/(n − k − 1) (Hurvich & Tsai 1989, Biometrika 76:297), null when n ≤ k + 1.
 *
 * The null model is w = 1 at every generation (no change from the ancestor; no parameter but the
 * residual variance). Every model needs two residual degrees of freedom or more (n − parameters
 * ≥ 2); with fewer, the residual variance, and so every SE and test, rests on one value or none.
 * Wald 95 % intervals are estimate ± t₀.₉₇₅(n − 2)·SE, and the 95 % band of a fitted curve is
 * f(t) ± t₀.₉₇₅(n − 2)·√(gᵀ V g), g = ∂f/∂θ at t and V = σ̂²(JᵀJ)⁻¹ (delta method; e.g. Bates &
 * Watts 1988, Nonlinear Regression Analysis and Its Applications, §2.3, from memory). A parameter
 * is "poorly determined" when its 95 % interval contains 0: the data cannot tell it from zero, so
 * its value says nothing (common practice; equivalently its Wald t-test has p ≥ 0.05).
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { studentTQuantile } from './distributions.ts';

export interface TrajectoryPoint {
  generation: number;
  w: number;
}

export interface FitStatistics {
  /** Number of points fitted. */
  n: number;
  /** Parameters counted by AIC and BIC: model parameters + 1 for the residual variance. */
  k: number;
  rss: number;
  /** √(RSS / (n − model parameters)). */
  residualSe: number;
  logLik: number;
  aic: number;
  /** Small-sample AIC; null when n ≤ k + 1. */
  aicc: number | null;
  bic: number;
  /** Observed minus fitted, in the order of the points given. */
  residuals: number[];
}

export interface Parameter {
  name: string;
  estimate: number;
  se: number;
  /** Wald 95 % interval: estimate ± t₀.₉₇₅(n − 2)·SE. */
  ci: [number, number];
  /** True when the 95 % interval contains 0: do not read the estimate as a result. */
  poorlyDetermined: boolean;
}

export interface CurveFit extends FitStatistics {
  model: 'hyperbolic' | 'power-law';
  formula: string;
  parameters: Parameter[];
  /** Covariance of the two parameters, σ̂²(JᵀJ)⁻¹, for the confidence band. */
  covariance: [[number, number], [number, number]];
  converged: boolean;
}

export interface NullFit extends FitStatistics {
  model: 'null';
}

export interface Step {
  /** Last generation of the segment before the change. */
  after: number;
  /** First generation of the segment after it. */
  before: number;
}

export interface StepFit extends FitStatistics {
  model: 'step';
  changePoints: number;
  steps: Step[];
  /** Segment heights (means) with their SE from the pooled residual variance. */
  segments: { from: number; to: number; n: number; w: number; se: number }[];
  /** BIC for each number of change points tried. */
  bicByChangePoints: { changePoints: number; bic: number }[];
}

export interface ModelFailure {
  model: 'null' | 'hyperbolic' | 'power-law' | 'step';
  reason: string;
}

type Model = {
  name: 'hyperbolic' | 'power-law';
  formula: string;
  names: [string, string];
  f: (p: number[]) => (t: number) => number;
  jac: (p: number[]) => (t: number) => number[];
  /** Best a for a fixed b, for the starting grid. */
  start: (b: number, t: readonly number[], w: readonly number[]) => number;
};

function logGrid(from: number, to: number, steps: number): number[] {
  const out: number[] = [];
  for (let i = 0; i <= steps; i++) out.push(from * (to / from) ** (i / steps));
  return out;
}

const HYPERBOLIC: Model = {
  name: 'hyperbolic',
  formula: 'w = 1 + a·t/(t + b)',
  names: ['a', 'b'],
  f:
    ([a, b]) =>
    (t) =>
      1 + (a! * t) / (t + b!),
  jac:
    ([a, b]) =>
    (t) => [t / (t + b!), (-a! * t) / (t + b!) ** 2],
  start: (b, t, w) => {
    // Linear in a for fixed b: a = Σx(w − 1)/Σx², x = t/(t + b).
    let num = 0;
    let den = 0;
    t.forEach((ti, i) => {
      const x = ti / (ti + b);
      num += x * (w[i]! - 1);
      den += x * x;
    });
    return den > 0 ? num / den : 0;
  },
};

const POWER_LAW: Model = {
  name: 'power-law',
  formula: 'w = (b·t + 1)^a',
  names: ['a', 'b'],
  f:
    ([a, b]) =>
    (t) =>
      (b! * t + 1) ** a!,
  jac:
    ([a, b]) =>
    (t) => {
      const base = b! * t + 1;
      const value = base ** a!;
      return [value * Math.log(base), (a! * t * value) / base];
    },
  start: (b, t, w) => {
    // ln w = a·ln(b·t + 1): least squares in a on the log scale (points with w > 0).
    let num = 0;
    let den = 0;
    t.forEach((ti, i) => {
      if (!(w[i]! > 0)) return;
      const x = Math.log(b * ti + 1);
      num += x * Math.log(w[i]!);
      den += x * x;
    });
    return den > 0 ? num / den : 0;
  },
};

function rssOf(f: (t: number) => number, t: readonly number[], w: readonly number[]): number {
  let rss = 0;
  t.forEach((ti, i) => {
    rss += (w[i]! - f(ti)) ** 2;
  });
  return rss;
}

/** Gaussian log-likelihood of a least-squares fit at its maximum (R's logLik.nls, unit weights). */
export function leastSquaresLogLik(rss: number, n: number): number {
  return (-n / 2) * (Math.log(2 * Math.PI) + 1 + Math.log(rss / n));
}

/** AICc from AIC (Hurvich & Tsai 1989); null when n ≤ k + 1. */
export function aicc(aic: number, k: number, n: number): number | null {
  return n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : null;
}

function statistics(residuals: number[], modelParameters: number): FitStatistics {
  const n = residuals.length;
  let rss = 0;
  for (const r of residuals) rss += r * r;
  const logLik = leastSquaresLogLik(rss, n);
  const k = modelParameters + 1;
  const aic = -2 * logLik + 2 * k;
  return {
    n,
    k,
    rss,
    residualSe: Math.sqrt(rss / (n - modelParameters)),
    logLik,
    aic,
    aicc: aicc(aic, k, n),
    bic: -2 * logLik + k * Math.log(n),
    residuals,
  };
}

/** Fewest residual degrees of freedom a fit may leave (see the file comment). */
export const MIN_RESIDUAL_DF = 2;

/** The null model w = 1; a failure when the values are all exactly 1. */
export function fitNull(points: readonly TrajectoryPoint[]): NullFit | ModelFailure {
  const residuals = points.map((p) => p.w - 1);
  if (points.length < MIN_RESIDUAL_DF) {
    return { model: 'null', reason: `needs ≥ ${MIN_RESIDUAL_DF} values, has ${points.length}` };
  }
  const stats = statistics(residuals, 0);
  if (
    tooExact(
      stats.rss,
      points.map((p) => p.w),
    )
  ) {
    return { model: 'null', reason: 'every value is exactly 1' };
  }
  return { model: 'null', ...stats };
}

/** A fit this close to exact has no usable residual variance (log of zero). */
function tooExact(rss: number, w: readonly number[]): boolean {
  let scale = 0;
  for (const v of w) scale += v * v;
  return !(rss > 1e-24 * Math.max(1, scale));
}

/** JᵀJ (as s00, s01, s11) and Jᵀr of a two-parameter model at params. */
function normalEquations(
  model: Model,
  params: number[],
  t: readonly number[],
  w: readonly number[],
) {
  const f = model.f(params);
  const jac = model.jac(params);
  let s00 = 0;
  let s01 = 0;
  let s11 = 0;
  let g0 = 0;
  let g1 = 0;
  t.forEach((ti, i) => {
    const [j0, j1] = jac(ti) as [number, number];
    const r = w[i]! - f(ti);
    s00 += j0 * j0;
    s01 += j0 * j1;
    s11 += j1 * j1;
    g0 += j0 * r;
    g1 += j1 * r;
  });
  return { s00, s01, s11, g0, g1 };
}

/**
 * Gauss–Newton steps with step halving after the Levenberg–Marquardt run, so the optimum is met
 * to the precision the standard errors need (the LM run's stopping rule is coarse). A step is
 * taken only when it lowers the RSS and keeps b > 0.
 */
function polish(
  model: Model,
  start: number[],
  startRss: number,
  t: readonly number[],
  w: readonly number[],
) {
  let params = start;
  let rss = startRss;
  for (let iteration = 0; iteration < 100; iteration++) {
    const { s00, s01, s11, g0, g1 } = normalEquations(model, params, t, w);
    const det = s00 * s11 - s01 * s01;
    if (!(det > 0) || !Number.isFinite(det)) break;
    const d0 = (s11 * g0 - s01 * g1) / det;
    const d1 = (s00 * g1 - s01 * g0) / det;
    let improved = false;
    for (let scale = 1; scale > 1e-10; scale /= 2) {
      const trial = [params[0]! + scale * d0, params[1]! + scale * d1];
      if (!(trial[1]! > 0)) continue;
      const trialRss = rssOf(model.f(trial), t, w);
      if (trialRss < rss) {
        improved = rss - trialRss > 1e-15 * rss;
        params = trial;
        rss = trialRss;
        break;
      }
    }
    if (!improved) break;
  }
  return { params, rss };
}

function fitCurve(model: Model, points: readonly TrajectoryPoint[]): CurveFit | ModelFailure {
  const t = points.map((p) => p.generation);
  const w = points.map((p) => p.w);
  const n = points.length;
  const distinct = new Set(t).size;
  if (n < 2 + MIN_RESIDUAL_DF || distinct < 2) {
    return {
      model: model.name,
      reason: `needs ≥ ${2 + MIN_RESIDUAL_DF} values at ≥ 2 generations (two residual degrees of freedom), has ${n} at ${distinct}`,
    };
  }
  const tMax = Math.max(...t.map(Math.abs));
  if (!(tMax > 0)) return { model: model.name, reason: 'all values are at generation 0' };
  // Starting grid over b (profiling a), spanning the generations measured.
  const grid =
    model.name === 'hyperbolic'
      ? logGrid(tMax * 1e-3, tMax * 1e3, 60)
      : logGrid(1e-3 / tMax, 1e3 / tMax, 60);
  let best = { a: 0, b: grid[0]!, rss: Number.POSITIVE_INFINITY };
  for (const b of grid) {
    const a = model.start(b, t, w);
    const rss = rssOf(model.f([a, b]), t, w);
    if (rss < best.rss) best = { a, b, rss };
  }
  const fit = levenbergMarquardt({ x: t, y: w }, model.f, {
    initialValues: [best.a, best.b],
    jacobianFunction: model.jac,
    minValues: [-1e6, best.b * 1e-9],
    maxValues: [1e6, best.b * 1e9],
    damping: 1e-3,
    maxIterations: 1000,
    errorTolerance: 1e-14,
    improvementThreshold: 1e-6,
  });
  let params = fit.parameterValues;
  let rss = rssOf(model.f(params), t, w);
  // Keep the grid start if the optimiser wandered off (never worse than the start).
  if (!(rss <= best.rss) || !params.every(Number.isFinite)) {
    params = [best.a, best.b];
    rss = best.rss;
  }
  ({ params, rss } = polish(model, params, rss, t, w));
  if (tooExact(rss, w))
    return { model: model.name, reason: 'the curve passes through every value exactly' };
  // Covariance σ̂²·(JᵀJ)⁻¹ at the solution (2 × 2).
  const { s00, s01, s11, g0, g1 } = normalEquations(model, params, t, w);
  const det = s00 * s11 - s01 * s01;
  if (!(det > 1e-12 * s00 * s11) || !Number.isFinite(det)) {
    return {
      model: model.name,
      reason: 'the two parameters cannot be told apart from these data (singular fit)',
    };
  }
  const f = model.f(params);
  const stats = statistics(
    t.map((ti, i) => w[i]! - f(ti)),
    2,
  );
  const sigma2 = rss / (n - 2);
  const covariance: CurveFit['covariance'] = [
    [(sigma2 * s11) / det, (-sigma2 * s01) / det],
    [(-sigma2 * s01) / det, (sigma2 * s00) / det],
  ];
  const se = [Math.sqrt(covariance[0][0]), Math.sqrt(covariance[1][1])];
  const tq = studentTQuantile(0.975, n - 2);
  // Converged when the gradient Jᵀr is negligible against the scale of the problem.
  const converged =
    Math.abs(g0) <= 1e-6 * Math.sqrt(s00 * rss) + 1e-15 &&
    Math.abs(g1) <= 1e-6 * Math.sqrt(s11 * rss) + 1e-15;
  return {
    model: model.name,
    formula: model.formula,
    parameters: model.names.map((name, i) => {
      const ci: [number, number] = [params[i]! - tq * se[i]!, params[i]! + tq * se[i]!];
      return {
        name,
        estimate: params[i]!,
        se: se[i]!,
        ci,
        poorlyDetermined: !(ci[0] > 0 || ci[1] < 0),
      };
    }),
    covariance,
    converged,
    ...stats,
  };
}

const MODELS: Record<CurveFit['model'], Model> = { hyperbolic: HYPERBOLIC, 'power-law': POWER_LAW };

/** The fitted curve as a function of generations, to draw it between the measured ones. */
export function curveAt(fit: CurveFit): (generation: number) => number {
  return MODELS[fit.model].f(fit.parameters.map((p) => p.estimate));
}

/**
 * The fitted curve with its 95 % confidence band (delta method, see the file comment) at the
 * generations asked for.
 */
export function curveBand(
  fit: CurveFit,
  generations: readonly number[],
): { generation: number; w: number; low: number; high: number }[] {
  const model = MODELS[fit.model];
  const params = fit.parameters.map((p) => p.estimate);
  const f = model.f(params);
  const jac = model.jac(params);
  const [[v00, v01], [, v11]] = fit.covariance;
  const tq = studentTQuantile(0.975, fit.n - 2);
  return generations.map((t) => {
    const [g0, g1] = jac(t) as [number, number];
    const se = Math.sqrt(Math.max(0, g0 * g0 * v00 + 2 * g0 * g1 * v01 + g1 * g1 * v11));
    const w = f(t);
    return { generation: t, w, low: w - tq * se, high: w + tq * se };
  });
}

export function fitHyperbolic(points: readonly TrajectoryPoint[]): CurveFit | ModelFailure {
  return fitCurve(HYPERBOLIC, points);
}

export function fitPowerLaw(points: readonly TrajectoryPoint[]): CurveFit | ModelFailure {
  return fitCurve(POWER_LAW, points);
}

/**
 * Step model. Points at the same generation always share a segment. For each k from 0 to
 * maxChangePoints (and while n − (2k + 1) ≥ 2) the optimal k-change segmentation minimises the residual
 * sum of squares exactly; k with the lowest BIC wins, counting k + 1 heights, k positions and the
 * residual variance (2k + 2 parameters).
 */
export function fitStep(
  points: readonly TrajectoryPoint[],
  maxChangePoints = 3,
): StepFit | ModelFailure {
  const sorted = [...points]
    .map((p, i) => ({ ...p, i }))
    .sort((a, b) => a.generation - b.generation);
  // Blocks of equal generation.
  const blocks: { generation: number; start: number; end: number }[] = [];
  sorted.forEach((p, idx) => {
    const last = blocks[blocks.length - 1];
    if (last && last.generation === p.generation) last.end = idx + 1;
    else blocks.push({ generation: p.generation, start: idx, end: idx + 1 });
  });
  const n = sorted.length;
  if (n < 3) return { model: 'step', reason: `needs ≥ 3 values, has ${n}` };
  // Within-segment SS of points [a, b), two-pass (mean, then squared deviations), so the
  // segmentation is chosen on the same RSS that is reported (Σw² − (Σw)²/m loses the digits that
  // tell close segmentations apart). Memoised: O(n) per segment, n is small.
  const costs = new Map<number, number>();
  const heightOf = (a: number, b: number) => {
    let sum = 0;
    for (let q = a; q < b; q++) sum += sorted[q]!.w;
    return sum / (b - a);
  };
  const cost = (a: number, b: number) => {
    const key = a * (n + 1) + b;
    const known = costs.get(key);
    if (known !== undefined) return known;
    const m = heightOf(a, b);
    let ss = 0;
    for (let q = a; q < b; q++) ss += (sorted[q]!.w - m) ** 2;
    costs.set(key, ss);
    return ss;
  };
  const B = blocks.length;
  const kMax = Math.min(maxChangePoints, B - 1);
  // dp[k][j]: best SS of blocks [0, j) in k + 1 segments; from[k][j]: where the last one starts.
  const dp: number[][] = [];
  const from: number[][] = [];
  dp.push(blocks.map((_, j) => cost(0, blocks[j]!.end)));
  from.push(blocks.map(() => 0));
  for (let k = 1; k <= kMax; k++) {
    const row: number[] = [];
    const arg: number[] = [];
    for (let j = 0; j < B; j++) {
      let bestV = Number.POSITIVE_INFINITY;
      let bestI = -1;
      for (let i = k; i <= j; i++) {
        const v = dp[k - 1]![i - 1]! + cost(blocks[i]!.start, blocks[j]!.end);
        if (v < bestV) {
          bestV = v;
          bestI = i;
        }
      }
      row.push(bestV);
      arg.push(bestI);
    }
    dp.push(row);
    from.push(arg);
  }
  const tried: { changePoints: number; bic: number; rss: number }[] = [];
  for (let k = 0; k <= kMax; k++) {
    const rss = dp[k]![B - 1]!;
    const p = 2 * k + 1;
    if (
      n - p < MIN_RESIDUAL_DF ||
      tooExact(
        rss,
        sorted.map((s) => s.w),
      )
    )
      continue;
    tried.push({
      changePoints: k,
      bic: -2 * leastSquaresLogLik(rss, n) + (p + 1) * Math.log(n),
      rss,
    });
  }
  if (tried.length === 0)
    return { model: 'step', reason: 'no segmentation leaves residual variance to estimate' };
  const chosen = tried.reduce((a, b) => (b.bic < a.bic ? b : a));
  const k = chosen.changePoints;
  // Walk back the segment starts.
  const starts: number[] = [];
  let j = B - 1;
  for (let kk = k; kk >= 0; kk--) {
    const i = from[kk]![j]!;
    starts.unshift(i);
    j = i - 1;
  }
  const fitted = new Array<number>(n);
  const segmentsRaw = starts.map((bi, s) => {
    const endBlock = s + 1 < starts.length ? starts[s + 1]! - 1 : B - 1;
    const a = blocks[bi]!.start;
    const b = blocks[endBlock]!.end;
    const height = heightOf(a, b);
    for (let q = a; q < b; q++) fitted[sorted[q]!.i] = height;
    return { from: blocks[bi]!.generation, to: blocks[endBlock]!.generation, n: b - a, w: height };
  });
  const residuals = points.map((p, i) => p.w - fitted[i]!);
  const stats = statistics(residuals, 2 * k + 1);
  // Heights' SE from the residual variance with the same df as the residual SE, n − (2k + 1):
  // the change positions are estimated too.
  const sigma = stats.residualSe;
  return {
    model: 'step',
    changePoints: k,
    steps: starts
      .slice(1)
      .map((bi) => ({ after: blocks[bi - 1]!.generation, before: blocks[bi]!.generation })),
    segments: segmentsRaw.map((s) => ({ ...s, se: sigma / Math.sqrt(s.n) })),
    bicByChangePoints: tried.map(({ changePoints, bic }) => ({ changePoints, bic })),
    ...stats,
  };
}
