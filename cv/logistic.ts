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
  const xs = rows.map((row) => [1, ...row]);
  const off = (i: number) => offset?.[i] ?? 0;
  let beta = new Array<number>(p).fill(0);
  let current = objective(xs, y, off, lambda, beta);
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const grad = beta.map((b) => -lambda * b);
    const hess = Array.from({ length: p }, (_, a) => {
      const row = new Array<number>(p).fill(0);
      // A tiny ridge keeps an unpenalised fit solvable when one class is absent.
      row[a] = lambda + 1e-9;
      return row;
    });
    xs.forEach((x, i) => {
      const mu = sigmoid(dot(beta, x) + off(i));
      const w = mu * (1 - mu);
      for (let a = 0; a < p; a++) {
        grad[a]! += (y[i]! - mu) * x[a]!;
        for (let b = 0; b <= a; b++) hess[a]![b]! += w * x[a]! * x[b]!;
      }
    });
    const step = choleskySolve(hess, grad);
    // Step halving (damped Newton): a full step can overshoot far from the optimum on data that
    // is nearly separable; a step is taken only when it lowers the penalised loss.
    let scale = 1;
    let next = beta;
    let value = current;
    for (let h = 0; h < 30; h++) {
      const trial = beta.map((b, a) => b + scale * step[a]!);
      const v = objective(xs, y, off, lambda, trial);
      if (v <= current) {
        next = trial;
        value = v;
        break;
      }
      scale /= 2;
    }
    const largest = Math.max(...next.map((b, a) => Math.abs(b - beta[a]!)));
    beta = next;
    current = value;
    if (largest < TOLERANCE) break;
  }
  return { intercept: beta[0]!, weights: beta.slice(1) };
}

/** The penalised negative log-likelihood. */
function objective(
  xs: readonly number[][],
  y: readonly number[],
  off: (i: number) => number,
  lambda: number,
  beta: readonly number[],
): number {
  let loss = 0;
  xs.forEach((x, i) => {
    const t = dot(beta, x) + off(i);
    // −log σ(t) for y = 1 and −log(1 − σ(t)) for y = 0, computed without overflow.
    const s = y[i] ? -t : t;
    loss += s > 0 ? s + Math.log1p(Math.exp(-s)) : Math.log1p(Math.exp(s));
  });
  return loss + 0.5 * lambda * beta.reduce((acc, b) => acc + b * b, 0);
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
