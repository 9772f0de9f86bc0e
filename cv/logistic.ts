/**
 * L2-regularised (ridge) logistic regression fitted by Newton–Raphson, i.e. iteratively
 * reweighted least squares (Hastie, Tibshirani & Friedman, The Elements of Statistical Learning,
 * 2nd ed., §4.4.1 for the Newton/IRLS fit and §4.4.4 for the L2 penalty), with a fixed offset
 * per example (a known part of each log-odds, as in a generalised linear model's offset term).
 * The intercept is penalised like the weights: the offset carries the prior decision, and the fit
 * moves away from it only as far as the examples ask. The penalised log-likelihood is strictly concave, so the fit has one optimum and the
 * same data in the same order always give the same weights: no random start, no sampling.
 *
 * Chosen over a random forest because it is small (one weight per feature), fits in a few
 * milliseconds on a few thousand examples, extrapolates smoothly to plates unlike the training
 * ones, and its weights can be read.
 */
const MAX_ITERATIONS = 100;
const TOLERANCE = 1e-9;

export interface LogisticFit {
  intercept: number;
  weights: number[];
}

/**
 * rows: feature vectors (already standardised); y: 1 or 0; lambda: the L2 penalty; offset: the
 * fixed log-odds of each example before the fit (0 when absent).
 */
export function fitLogistic(
  rows: readonly (readonly number[])[],
  y: readonly number[],
  lambda: number,
  offset?: readonly number[],
): LogisticFit {
  const p = (rows[0]?.length ?? 0) + 1;
  const beta = new Array<number>(p).fill(0);
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const grad = new Array<number>(p).fill(0);
    const hess = Array.from({ length: p }, () => new Array<number>(p).fill(0));
    rows.forEach((row, i) => {
      const x = [1, ...row];
      const mu = sigmoid(dot(beta, x) + (offset?.[i] ?? 0));
      const w = Math.max(mu * (1 - mu), 1e-12);
      for (let a = 0; a < p; a++) {
        grad[a]! += (y[i]! - mu) * x[a]!;
        for (let b = 0; b <= a; b++) hess[a]![b]! += w * x[a]! * x[b]!;
      }
    });
    for (let a = 0; a < p; a++) {
      grad[a]! -= lambda * beta[a]!;
      // A tiny ridge keeps an unpenalised fit solvable when one class is absent.
      hess[a]![a]! += lambda + 1e-9;
    }
    const step = choleskySolve(hess, grad);
    let largest = 0;
    for (let a = 0; a < p; a++) {
      beta[a]! += step[a]!;
      largest = Math.max(largest, Math.abs(step[a]!));
    }
    if (largest < TOLERANCE) break;
  }
  return { intercept: beta[0]!, weights: beta.slice(1) };
}

export function logisticProbability(fit: LogisticFit, x: readonly number[], offset = 0): number {
  return sigmoid(fit.intercept + dot(fit.weights, x) + offset);
}

function sigmoid(t: number): number {
  return t >= 0 ? 1 / (1 + Math.exp(-t)) : Math.exp(t) / (1 + Math.exp(t));
}

function dot(a: readonly number[], b: readonly number[]): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i]! * b[i]!;
  return s;
}

/** Solves H·s = g for a symmetric positive-definite H given by its lower triangle. */
function choleskySolve(h: number[][], g: number[]): number[] {
  const n = g.length;
  const l = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = h[i]![j]!;
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!;
      l[i]![j] = i === j ? Math.sqrt(Math.max(s, 1e-300)) : s / l[j]![j]!;
    }
  }
  const z = new Array<number>(n).fill(0);
  for (let i = 0; i < n; i++) {
    let s = g[i]!;
    for (let k = 0; k < i; k++) s -= l[i]![k]! * z[k]!;
    z[i] = s / l[i]![i]!;
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i--) {
    let s = z[i]!;
    for (let k = i + 1; k < n; k++) s -= l[k]![i]! * x[k]!;
    x[i] = s / l[i]![i]!;
  }
  return x;
}
