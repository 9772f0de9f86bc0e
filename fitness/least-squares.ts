/**
 * Linear least squares by QR decomposition (modified Gram–Schmidt with one re-orthogonalisation,
 * e.g. Björck 1996, Numerical Methods for Least Squares Problems, §2.4, from memory), columns taken
 * in order. A column that the earlier ones already span (relative norm below 1e-9) is aliased and
 * skipped, as R's lm() does with the columns of an unbalanced design, so the sums of squares per
 * term are the sequential (type I) ones of R's anova()/aov().
 */
export interface Term {
  name: string;
  /** The term's columns of the design, each of length n. */
  columns: number[][];
}

export interface SequentialFit {
  /** Per term: degrees of freedom (non-aliased columns) and sequential sum of squares. */
  terms: { name: string; df: number; ss: number }[];
  residualDf: number;
  rss: number;
}

interface Decomposition {
  q: number[][];
  /** R's rows (upper triangular over the kept columns). */
  r: number[][];
  /** Index of each kept column in the design. */
  kept: number[];
}

const dot = (a: readonly number[], b: readonly number[]) => {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i]! * b[i]!;
  return s;
};

function decompose(columns: readonly (readonly number[])[]): Decomposition {
  const q: number[][] = [];
  const r: number[][] = [];
  const kept: number[] = [];
  columns.forEach((column, j) => {
    const v = [...column];
    const coefficients = new Array<number>(q.length).fill(0);
    for (let pass = 0; pass < 2; pass++) {
      q.forEach((qi, i) => {
        const c = dot(qi, v);
        coefficients[i]! += c;
        for (let k = 0; k < v.length; k++) v[k]! -= c * qi[k]!;
      });
    }
    const norm = Math.sqrt(dot(v, v));
    const original = Math.sqrt(dot(column, column));
    if (!(norm > 1e-9 * original)) return;
    q.push(v.map((x) => x / norm));
    for (const [i, row] of r.entries()) row.push(coefficients[i]!);
    r.push([...new Array<number>(q.length - 1).fill(0), norm]);
    kept.push(j);
  });
  return { q, r, kept };
}

/** Sequential sums of squares of the terms, in order, and the residual. */
export function sequentialFit(y: readonly number[], terms: readonly Term[]): SequentialFit {
  const columns = terms.flatMap((t) => t.columns);
  const owner = terms.flatMap((t, i) => t.columns.map(() => i));
  const { q, kept } = decompose(columns);
  const out = terms.map((t) => ({ name: t.name, df: 0, ss: 0 }));
  const residual = [...y];
  q.forEach((qi, i) => {
    const c = dot(qi, y);
    const term = out[owner[kept[i]!]!]!;
    term.df += 1;
    term.ss += c * c;
    for (let k = 0; k < residual.length; k++) residual[k]! -= c * qi[k]!;
  });
  return { terms: out, residualDf: y.length - q.length, rss: dot(residual, residual) };
}

export interface LeastSquares {
  coefficients: number[];
  /** (XᵀX)⁻¹, for standard errors. */
  unscaledCovariance: number[][];
  /** log det(XᵀX) = 2·Σ log|Rᵢᵢ|. */
  logDetXtX: number;
  rss: number;
}

/** Least squares for a design of full column rank; null when a column is aliased. */
export function leastSquares(
  columns: readonly (readonly number[])[],
  y: readonly number[],
): LeastSquares | null {
  const { q, r, kept } = decompose(columns);
  const p = columns.length;
  if (kept.length < p) return null;
  const qty = q.map((qi) => dot(qi, y));
  // Back substitution R·β = Qᵀy, and R⁻¹ column by column.
  const rInv: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let c = 0; c < p; c++) {
    for (let i = c; i >= 0; i--) {
      let s = i === c ? 1 : 0;
      for (let k = i + 1; k <= c; k++) s -= r[i]![k]! * rInv[k]![c]!;
      rInv[i]![c] = s / r[i]![i]!;
    }
  }
  const coefficients = rInv.map((row) => dot(row, qty));
  const unscaledCovariance = rInv.map((ri) => rInv.map((rj) => dot(ri, rj)));
  let rss = 0;
  y.forEach((yk, k) => {
    let fitted = 0;
    for (let j = 0; j < p; j++) fitted += columns[j]![k]! * coefficients[j]!;
    rss += (yk - fitted) ** 2;
  });
  let logDet = 0;
  for (let i = 0; i < p; i++) logDet += 2 * Math.log(Math.abs(r[i]![i]!));
  return { coefficients, unscaledCovariance, logDetXtX: logDet, rss };
}
