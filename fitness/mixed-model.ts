/**
 * A linear mixed model with one random intercept per group (block), fitted by restricted maximum
 * likelihood, as R's nlme::lme(y ~ x, random = ~ 1 | block, method = "REML") fits it
 * (Patterson & Thompson 1971, Biometrika 58:545; Pinheiro & Bates 2000, Mixed-Effects Models in
 * S and S-PLUS, ch. 2, from memory).
 *
 * y = Xβ + b_block + e, b ~ N(0, σ_b²), e ~ N(0, σ²). With γ = σ_b²/σ², each block's covariance is
 * σ²·H_j, H_j = I + γ·J; H_j^(−1/2) = I − c_j·J with c_j = (1 − 1/√(1 + n_j γ))/n_j, so for a
 * given γ the fixed effects are ordinary least squares on the transformed data. σ² is profiled
 * out, σ̂² = r'H⁻¹r/(N − p), and the restricted log-likelihood
 *   −½[(N − p)·log σ̂² + Σ_j log(1 + n_j γ) + log det(X'H⁻¹X)] (+ constants)
 * is maximised over log γ (a grid, then golden-section search), or at γ = 0 when that is higher.
 * Fixed effects get SE = √(σ̂²·diag((X'H⁻¹X)⁻¹)) and t-tests with nlme's degrees of freedom: a
 * column that varies within blocks (and the intercept) has N − M − (number of such columns but
 * the intercept), one constant within every block M − 1 − (number of such columns), M blocks.
 */
import { studentTTwoSidedP } from './distributions.ts';
import { leastSquares } from './least-squares.ts';

export interface FixedEffect {
  name: string;
  estimate: number;
  se: number;
  df: number;
  t: number;
  p: number;
}

export interface MixedModelFit {
  fixed: FixedEffect[];
  /** SD of the block intercepts, σ_b. */
  sdBlock: number;
  /** Residual SD within blocks, σ. */
  sdResidual: number;
  blocks: number;
  n: number;
}

export interface MixedModelFailure {
  reason: string;
}

interface Column {
  name: string;
  values: number[];
}

function transform(values: readonly number[], groups: readonly number[][], gamma: number) {
  const out = [...values];
  for (const idx of groups) {
    const n = idx.length;
    const c = (1 - 1 / Math.sqrt(1 + n * gamma)) / n;
    let sum = 0;
    for (const i of idx) sum += values[i]!;
    for (const i of idx) out[i] = values[i]! - c * sum;
  }
  return out;
}

function profile(
  y: readonly number[],
  columns: readonly Column[],
  groups: number[][],
  gamma: number,
) {
  const fit = leastSquares(
    columns.map((c) => transform(c.values, groups, gamma)),
    transform(y, groups, gamma),
  );
  if (!fit) return null;
  const dfResidual = y.length - columns.length;
  const sigma2 = fit.rss / dfResidual;
  const logDetH = groups.reduce((s, g) => s + Math.log(1 + g.length * gamma), 0);
  const restricted = -0.5 * (dfResidual * Math.log(sigma2) + logDetH + fit.logDetXtX);
  return { fit, sigma2, restricted };
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/**
 * `columns` is the fixed-effects design, its first column the intercept; `block` names each
 * value's block. Fails, in words, with fewer than two blocks, no residual df, an aliased design or
 * no variation at all.
 */
export function randomInterceptReml(
  y: readonly number[],
  columns: readonly Column[],
  block: readonly string[],
): MixedModelFit | MixedModelFailure {
  const names = [...new Set(block)];
  const groups = names.map((b) => block.flatMap((x, i) => (x === b ? [i] : [])));
  const M = groups.length;
  const N = y.length;
  if (M < 2) return { reason: 'needs assays from two blocks or more' };
  if (N - columns.length - (M - 1) < 1) {
    return { reason: `too few assays (${N}) for ${columns.length} fixed effects and ${M} blocks` };
  }
  const at = (logGamma: number) => profile(y, columns, groups, Math.exp(logGamma));
  const zero = profile(y, columns, groups, 0);
  if (!zero) return { reason: 'the lines cannot be told apart from the blocks (aliased design)' };
  if (!(zero.sigma2 > 0)) return { reason: 'no variation left to split between blocks' };
  // Grid over log γ from 1e-8 to 1e8, then golden-section search around the best point.
  let bestX = -18;
  let bestValue = Number.NEGATIVE_INFINITY;
  for (let x = -18; x <= 18; x += 0.5) {
    const v = at(x)?.restricted ?? Number.NEGATIVE_INFINITY;
    if (v > bestValue) {
      bestValue = v;
      bestX = x;
    }
  }
  let lo = bestX - 0.5;
  let hi = bestX + 0.5;
  let x1 = hi - GOLDEN * (hi - lo);
  let x2 = lo + GOLDEN * (hi - lo);
  let f1 = at(x1)?.restricted ?? Number.NEGATIVE_INFINITY;
  let f2 = at(x2)?.restricted ?? Number.NEGATIVE_INFINITY;
  while (hi - lo > 1e-10) {
    if (f1 > f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - GOLDEN * (hi - lo);
      f1 = at(x1)?.restricted ?? Number.NEGATIVE_INFINITY;
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + GOLDEN * (hi - lo);
      f2 = at(x2)?.restricted ?? Number.NEGATIVE_INFINITY;
    }
  }
  const interior = at((lo + hi) / 2);
  const best = interior && interior.restricted > zero.restricted ? interior : zero;
  const gamma = best === zero ? 0 : Math.exp((lo + hi) / 2);
  const varies = columns.map(
    (c, j) => j === 0 || groups.some((g) => g.some((i) => c.values[i] !== c.values[g[0]!])),
  );
  const inner = varies.filter(Boolean).length - 1;
  const outer = varies.length - 1 - inner;
  if (outer > 0 && M - 1 - outer < 1) {
    return {
      reason: `effects that do not vary within blocks need more blocks than ${M} to be tested`,
    };
  }
  return {
    fixed: columns.map((c, j) => {
      const estimate = best.fit.coefficients[j]!;
      const se = Math.sqrt(best.sigma2 * best.fit.unscaledCovariance[j]![j]!);
      const df = varies[j] ? N - M - inner : M - 1 - outer;
      const t = estimate / se;
      return { name: c.name, estimate, se, df, t, p: studentTTwoSidedP(t, df) };
    }),
    sdBlock: Math.sqrt(gamma * best.sigma2),
    sdResidual: Math.sqrt(best.sigma2),
    blocks: M,
    n: N,
  };
}
