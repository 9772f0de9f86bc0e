/**
 * The studentized range distribution: the range of k independent standard normal values divided
 * by an independent √(χ²_ν/ν), for Tukey's HSD. stdlib has no such distribution, so this is the
 * published algorithm: Copenhaver & Holland (1988), J. Statist. Comput. Simul. 30:1, "Computation
 * of the distribution of the maximum studentized range statistic with application to multiple
 * significance testing of simple effects" (Algorithm AS 190 by Lund & Lund 1983, Appl. Statist.
 * 32:204, refined), in the form R's ptukey() uses: Gauss–Legendre quadrature over the range of
 * the normal values (wprob, Hartley's form) and over the χ density of the scale.
 * Checked against R 4.2's ptukey and qtukey in studentized-range.test.ts.
 */
import erfc from '@stdlib/math-base-special-erfc';
import gammaln from '@stdlib/math-base-special-gammaln';

/** Standard normal lower tail Φ(x) = erfc(−x/√2)/2. */
const phi = (x: number) => 0.5 * erfc(-x / Math.SQRT2);

// 12-point Gauss–Legendre nodes (positive half) and weights.
const X12 = [
  0.9815606342467192, 0.9041172563704749, 0.7699026741943047, 0.5873179542866175,
  0.3678314989981802, 0.1252334085114689,
];
const A12 = [
  0.04717533638651183, 0.10693932599531843, 0.16007832854334622, 0.20316742672306592,
  0.2334925365383548, 0.24914704581340277,
];
// 16-point Gauss–Legendre nodes (positive half) and weights.
const X16 = [
  0.9894009349916499, 0.9445750230732326, 0.8656312023878318, 0.755404408355003, 0.6178762444026438,
  0.45801677765722737, 0.2816035507792589, 0.09501250983763744,
];
const A16 = [
  0.027152459411754096, 0.062253523938647894, 0.09515851168249279, 0.12462897125553388,
  0.14959598881657674, 0.16915651939500254, 0.18260341504492358, 0.1894506104550685,
];

/** P(range of cc standard normals < w). */
function rangeProbability(w: number, cc: number): number {
  const half = w * 0.5;
  if (half >= 8) return 1;
  let pr = 2 * phi(half) - 1;
  pr = pr >= Math.exp(-50 / cc) ? pr ** cc : 0;
  const intervals = w > 3 ? 2 : 3;
  let lower = half;
  const step = (8 - half) / intervals;
  let upper = lower + step;
  let sum = 0;
  const cc1 = cc - 1;
  for (let i = 0; i < intervals; i++) {
    let part = 0;
    const mid = 0.5 * (upper + lower);
    const radius = 0.5 * (upper - lower);
    for (let jj = 0; jj < 12; jj++) {
      const j = jj < 6 ? jj : 11 - jj;
      const x = jj < 6 ? -X12[j]! : X12[j]!;
      const ac = mid + radius * x;
      const qexpo = ac * ac;
      if (qexpo > 60) break;
      const inside = phi(ac) - phi(ac - w);
      if (inside >= Math.exp(-30 / cc1)) {
        part += A12[j]! * Math.exp(-0.5 * qexpo) * inside ** cc1;
      }
    }
    sum += (part * 2 * radius * cc) / Math.sqrt(2 * Math.PI);
    lower = upper;
    upper += step;
  }
  pr += sum;
  if (pr <= Math.exp(-30)) return 0;
  return Math.min(1, pr);
}

/** P(Q ≥ q) for the studentized range of k means with df residual degrees of freedom. */
export function studentizedRangeUpperP(q: number, k: number, df: number): number {
  if (!(k >= 2) || !(df >= 2) || !Number.isFinite(q) || !Number.isFinite(df)) {
    throw new RangeError(
      `studentized range needs k ≥ 2, df ≥ 2 and a finite q (${q}, ${k}, ${df})`,
    );
  }
  return 1 - studentizedRangeCdf(q, k, df);
}

function studentizedRangeCdf(q: number, k: number, df: number): number {
  if (q <= 0) return 0;
  if (df > 25000) return rangeProbability(q, k);
  const f2 = df * 0.5;
  let f2lf = f2 * Math.log(df) - df * Math.LN2 - gammaln(f2);
  const f21 = f2 - 1;
  const ff4 = df * 0.25;
  const ulen = df <= 100 ? 1 : df <= 800 ? 0.5 : df <= 5000 ? 0.25 : 0.125;
  f2lf += Math.log(ulen);
  let total = 0;
  for (let i = 1; i <= 50; i++) {
    let part = 0;
    const twa1 = (2 * i - 1) * ulen;
    for (let jj = 0; jj < 16; jj++) {
      const upperHalf = jj >= 8;
      const j = upperHalf ? jj - 8 : jj;
      const offset = X16[j]! * ulen;
      const u = upperHalf ? twa1 + offset : twa1 - offset;
      const t1 = f2lf + f21 * Math.log(u) - u * ff4;
      if (t1 >= -30) {
        part += rangeProbability(q * Math.sqrt(u * 0.5), k) * A16[j]! * Math.exp(t1);
      }
    }
    if (i * ulen >= 1 && part <= 1e-14) break;
    total += part;
  }
  return Math.min(1, total);
}

/** The q with P(Q ≤ q) = p (Illinois-modified regula falsi on the CDF, to 1e-12 of q). */
export function studentizedRangeQuantile(p: number, k: number, df: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`probability must lie in (0, 1), got ${p}`);
  studentizedRangeUpperP(1, k, df);
  let lo = 0;
  let flo = -p;
  let hi = 1;
  let fhi = studentizedRangeCdf(hi, k, df) - p;
  while (fhi < 0) {
    lo = hi;
    flo = fhi;
    hi *= 2;
    fhi = studentizedRangeCdf(hi, k, df) - p;
  }
  let side = 0;
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const q = (lo * fhi - hi * flo) / (fhi - flo);
    const fq = studentizedRangeCdf(q, k, df) - p;
    if (fq === 0) return q;
    if (fq < 0) {
      lo = q;
      flo = fq;
      if (side === -1) fhi /= 2;
      side = -1;
    } else {
      hi = q;
      fhi = fq;
      if (side === 1) flo /= 2;
      side = 1;
    }
  }
  return (lo * fhi - hi * flo) / (fhi - flo);
}
