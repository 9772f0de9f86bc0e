/**
 * One competition assay: a test strain against the reference strain carrying the other marker,
 * mixed, sampled at the start and at the end.
 *
 * Realised Malthusian parameter of each strain (Lenski et al. 1991, Am. Nat. 138:1315; this and
 * the Travisano & Lenski citation are from memory, Chevin 2011 is checked):
 *   m = ln(N_end × D / N_start), D = total fold dilution applied between the two samples.
 * Relative fitness W = m_test / m_ref; selection rate r = m_test − m_ref (Travisano & Lenski
 * 1996, Genetics 143:15), r per day = r / days; generations of the reference
 * g = log₂(N_ref,end × D / N_ref,start) = m_ref / ln 2; selection coefficient per generation of the
 * reference s = r / g = (W − 1)·ln 2 (Chevin 2011, Biol. Lett. 7:210). D cancels in r but not in W.
 *
 * Counting noise: each strain's pooled count is Poisson, so Var(m) = 1/C_start + 1/C_end and
 * Var(r) is the sum of the four; Var(W) ≈ (Var(m_test) + W²·Var(m_ref))/m_ref² (delta method).
 * The interval for W is a parametric bootstrap: the four pooled counts are redrawn as Poisson with their observed means (B = 2000 draws, mulberry32 seeded from the assay name), W is
 * recomputed, and the 2.5 % and 97.5 % percentiles are reported.
 *
 * A strain with no colony in one sample (extinct at the end, or missed at the start) gives no W
 * but a bound: the zero count is replaced by its exact one-sided 95 % Poisson upper limit
 * (−ln 0.05 ≈ 3.0 colonies, poisson.ts), so the density is at most that, and W is at most (or at
 * least, depending on which count was zero and the sign of m_test) the value computed. Such an
 * assay is flagged 'bounded', has no interval, and is left out of means and tests (analysis.ts).
 * With more than one zero count the bounds pull different ways and the assay is an error.
 */
import { type DensityOptions, type Plate, type SampleDensity, sampleDensity } from './densities.ts';
import { FitnessError } from './errors.ts';
import { generationsWarning } from './generation-check.ts';
import { hashSeed, poissonDraw, seededUniform, ZERO_COUNT_UPPER_95 } from './poisson.ts';

export interface AssayInput {
  assay: string;
  group: string;
  line: string;
  /** Generation of the evolved line that was competed. */
  generation: number;
  replicate: string;
  /** Length of the competition in days (for r per day); default 1. */
  days: number;
  /** Total fold dilution applied to the culture between the start and end samples (D ≥ 1). */
  foldDilutionSinceStart: number;
  /** Marker the test strain carries, when the CSV says (for reciprocal designs). */
  testMarker?: string;
  /** The day or batch the assay was run in, when the CSV says. */
  block?: string;
  start: Plate[];
  end: Plate[];
}

export type FlagCode =
  | 'out-of-range'
  | 'plates-dropped'
  | 'test-declined'
  | 'generations-implausible'
  | 'ci-partial'
  | 'ci-undefined'
  | 'marker-corrected'
  | 'bounded';

/** W is at most, or at least, the value given (a strain had no colony in one sample). */
export type Bound = 'at-most' | 'at-least';

export interface Flag {
  code: FlagCode;
  message: string;
}

export interface AssayResult {
  assay: string;
  group: string;
  line: string;
  generation: number;
  replicate: string;
  days: number;
  testMarker?: string;
  block?: string;
  D: number;
  start: SampleDensity;
  end: SampleDensity;
  mTest: number;
  mRef: number;
  W: number;
  r: number;
  rPerDay: number;
  /** Generations of the reference over the assay: m_ref / ln 2. */
  generationsRef: number;
  /** Selection coefficient per generation of the reference: r / generationsRef. */
  sPerGeneration: number;
  /** Standard errors from counting noise alone (delta method). */
  countingSe: {
    mTest: number;
    mRef: number;
    W: number;
    r: number;
    rPerDay: number;
    sPerGeneration: number;
  };
  /** Bootstrap 95 % interval of W from counting noise alone; null when too many draws fail. */
  W_ci: [number, number] | null;
  /** Set when a strain had no colony in one sample: W is then a bound, not an estimate. */
  bound: Bound | null;
  flags: Flag[];
}

export interface AssayOptions extends DensityOptions {
  /** Bootstrap draws for W_ci; default 2000. 0 turns the bootstrap off. */
  bootstrapDraws?: number;
  /** Mixed into the per-assay seed; default 0. */
  seed?: number;
}

export const DEFAULT_BOOTSTRAP_DRAWS = 2000;

function percentile(sorted: readonly number[], q: number): number {
  // Linear interpolation between order statistics (type 7, R's and NumPy's default).
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/** Malthusian parameter from pooled counts and culture volumes: ln((Ce/Ve)·D / (Cs/Vs)). */
function malthusian(cStart: number, vStart: number, cEnd: number, vEnd: number, D: number) {
  return Math.log(((cEnd / vEnd) * D) / (cStart / vStart));
}

function bootstrapW(
  start: SampleDensity,
  end: SampleDensity,
  D: number,
  draws: number,
  seed: number,
): { ci: [number, number] | null; failed: number } {
  const uniform = seededUniform(seed);
  const values: number[] = [];
  let failed = 0;
  for (let b = 0; b < draws; b++) {
    const ts = poissonDraw(start.test.colonies, uniform);
    const rs = poissonDraw(start.reference.colonies, uniform);
    const te = poissonDraw(end.test.colonies, uniform);
    const re = poissonDraw(end.reference.colonies, uniform);
    if (ts === 0 || rs === 0 || te === 0 || re === 0) {
      failed += 1;
      continue;
    }
    const mt = malthusian(ts, start.cultureMl, te, end.cultureMl, D);
    const mr = malthusian(rs, start.cultureMl, re, end.cultureMl, D);
    if (!(mr > 0)) {
      failed += 1;
      continue;
    }
    values.push(mt / mr);
  }
  // More than 2.5 % undefined draws would move the 2.5 % percentile itself: give no interval.
  if (values.length < 2 || failed > 0.025 * draws) return { ci: null, failed };
  values.sort((a, b) => a - b);
  return { ci: [percentile(values, 0.025), percentile(values, 0.975)], failed };
}

function rangeFlags(label: string, sample: SampleDensity): Flag[] {
  const flags: Flag[] = [];
  const out = sample.plates.filter((p) => p.status !== 'countable');
  if (out.length > 0) {
    const list = out.map((p) => `${p.label} (${p.total}, ${p.status})`).join(', ');
    flags.push({
      code: 'out-of-range',
      message: `${label}: outside the countable range ${sample.range.source}: ${list}`,
    });
  }
  const dropped = sample.plates.filter((p) => p.dropped);
  if (dropped.length > 0) {
    flags.push({
      code: 'plates-dropped',
      message: `${label}: dropped ${dropped.map((p) => p.label).join(', ')} (an in-range plate of the same sample exists)`,
    });
  }
  return flags;
}

type Strain = 'test' | 'reference';
type Sample = 'start' | 'end';

/** Which way W is bounded when one count was zero (see the file comment). */
function boundOf(strain: Strain, sample: Sample, mTest: number): Bound {
  // m is at most its value when the end count is at most the limit, at least when the start is.
  const m: Bound = sample === 'end' ? 'at-most' : 'at-least';
  if (strain === 'test') return m;
  // W = m_test / m_ref falls as m_ref rises when m_test ≥ 0.
  return (m === 'at-most') === mTest >= 0 ? 'at-least' : 'at-most';
}

const usedPlates = (s: SampleDensity) =>
  s.plates
    .filter((p) => !p.dropped)
    .map((p) => p.label)
    .join(', ');

/**
 * Computes one assay. Throws a FitnessError naming the assay (and the plates) when the numbers
 * cannot give a fitness: no plates, a bad plate, no colony of a strain in more than one sample,
 * D < 1, or a reference that did not grow (m_ref ≤ 0, so W is undefined). A declining test strain
 * (m_test ≤ 0) is a result, flagged 'test-declined'.
 */
export function computeAssay(input: AssayInput, options: AssayOptions = {}): AssayResult {
  const name = `assay ${input.assay}`;
  const D = input.foldDilutionSinceStart;
  if (!Number.isFinite(D) || D < 1) {
    throw new FitnessError(`${name}: fold dilution since start must be a number ≥ 1, got ${D}`);
  }
  if (!Number.isFinite(input.days) || input.days <= 0) {
    throw new FitnessError(`${name}: days must be > 0, got ${input.days}`);
  }
  const start = sampleDensity(input.start, `${name}, start sample`, options);
  const end = sampleDensity(input.end, `${name}, end sample`, options);
  const samples = { start, end };
  const zeros = (['test', 'reference'] as const).flatMap((strain) =>
    (['start', 'end'] as const)
      .filter((sample) => samples[sample][strain].colonies === 0)
      .map((sample) => ({ strain, sample })),
  );
  const zeroText = zeros.map(
    (z) => `no ${z.strain} colony in the ${z.sample} sample (${usedPlates(samples[z.sample])})`,
  );
  if (zeros.length > 1) {
    throw new FitnessError(
      `${name}: ${zeroText.join(' and ')}; with more than one zero count there is neither a fitness nor a bound (plate lower dilutions)`,
    );
  }
  const count = (sample: Sample, strain: Strain) =>
    samples[sample][strain].colonies || ZERO_COUNT_UPPER_95;
  const mOf = (strain: Strain) =>
    malthusian(count('start', strain), start.cultureMl, count('end', strain), end.cultureMl, D);
  const mTest = mOf('test');
  const mRef = mOf('reference');
  if (!(mRef > 0)) {
    const plates = [...start.plates, ...end.plates].map((p) => p.label).join(', ');
    throw new FitnessError(
      `${name}: the reference did not grow (m_ref = ${mRef.toFixed(4)} ≤ 0), so W = m_test/m_ref is undefined; check D and the plates (${plates})`,
    );
  }
  const W = mTest / mRef;
  const r = mTest - mRef;
  if (!Number.isFinite(W) || !Number.isFinite(r)) {
    throw new FitnessError(
      `${name}: the counts, volumes and dilutions give no finite fitness (m_test = ${mTest}, m_ref = ${mRef})`,
    );
  }
  const varMTest = start.test.logVariance + end.test.logVariance;
  const varMRef = start.reference.logVariance + end.reference.logVariance;
  // Var(W) ≈ (Var(m_test) + W²·Var(m_ref)) / m_ref², the delta method for a ratio.
  const seW = Math.sqrt(varMTest + W * W * varMRef) / mRef;
  const flags: Flag[] = [...rangeFlags('start', start), ...rangeFlags('end', end)];
  if (!(mTest > 0)) {
    flags.push({
      code: 'test-declined',
      message: `the test strain declined (m_test = ${mTest.toFixed(4)} ≤ 0)`,
    });
  }
  const zero = zeros[0];
  const bound = zero ? boundOf(zero.strain, zero.sample, mTest) : null;
  if (bound) {
    flags.push({
      code: 'bounded',
      message: `${zeroText[0]}: W is ${bound === 'at-most' ? 'at most' : 'at least'} ${W.toFixed(4)}, counting the zero as its one-sided 95 % Poisson limit (${ZERO_COUNT_UPPER_95.toFixed(2)} colonies); left out of means and tests`,
    });
  }
  const draws = bound ? 0 : (options.bootstrapDraws ?? DEFAULT_BOOTSTRAP_DRAWS);
  let W_ci: [number, number] | null = null;
  if (draws > 0) {
    const boot = bootstrapW(start, end, D, draws, hashSeed(input.assay, options.seed ?? 0));
    W_ci = boot.ci;
    if (boot.ci === null) {
      flags.push({
        code: 'ci-undefined',
        message: `no counting-noise interval: ${boot.failed} of ${draws} bootstrap draws had a zero count or no reference growth`,
      });
    } else if (boot.failed > 0) {
      flags.push({
        code: 'ci-partial',
        message: `${boot.failed} of ${draws} bootstrap draws had a zero count or no reference growth and were left out`,
      });
    }
  }
  const generationsRef = mRef / Math.LN2;
  const implausible = generationsWarning(generationsRef, input.days, D);
  if (implausible) flags.push({ code: 'generations-implausible', message: implausible });
  return {
    assay: input.assay,
    group: input.group,
    line: input.line,
    generation: input.generation,
    replicate: input.replicate,
    days: input.days,
    ...(input.testMarker ? { testMarker: input.testMarker } : {}),
    ...(input.block ? { block: input.block } : {}),
    D,
    start,
    end,
    mTest,
    mRef,
    W,
    r,
    rPerDay: r / input.days,
    generationsRef,
    sPerGeneration: r / generationsRef,
    countingSe: {
      mTest: Math.sqrt(varMTest),
      mRef: Math.sqrt(varMRef),
      W: seW,
      r: Math.sqrt(varMTest + varMRef),
      rPerDay: Math.sqrt(varMTest + varMRef) / input.days,
      // s = (W − 1)·ln 2 exactly, so its SE is ln 2 times that of W.
      sPerGeneration: Math.LN2 * seW,
    },
    W_ci,
    bound,
    flags,
  };
}
