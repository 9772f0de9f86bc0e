/**
 * Planning helpers: which dilution and volume to plate, and how many replicate assays to run.
 */
import {
  type CountableRange,
  type CountableStatus,
  countableStatus,
  DEFAULT_COUNTABLE_RANGE,
  validateCountableRange,
} from './countable-range.ts';
import { studentTQuantile } from './distributions.ts';
import { FitnessError } from './errors.ts';

export interface DilutionRequest {
  /** Expected total density of the culture (both strains), CFU/mL. */
  cfuPerMl?: number;
  /** Optical density, used with cfuPerOd when cfuPerMl is not given. */
  od?: number;
  /** The lab's own calibration: CFU/mL per unit of OD. */
  cfuPerOd?: number;
  range?: CountableRange;
  /** Volumes the lab plates, µL; default 100. */
  volumesUl?: number[];
  /** Step of the dilution series; default 10 (ten-fold series). */
  seriesStep?: number;
  /** Largest dilution fold considered; default 10¹². */
  maxFold?: number;
}

export interface DilutionPlan {
  cfuPerMl: number;
  /** Colonies aimed at: the middle of the countable range, (min + max) / 2. */
  target: number;
  dilutionFold: number;
  volumeUl: number;
  expectedColonies: number;
  status: CountableStatus;
  range: CountableRange;
}

/**
 * Picks the dilution (a power of the series step) and volume whose expected colonies, density ×
 * volume / fold, come closest to the middle of the countable range on a log scale, among those
 * inside the range when there are any.
 */
export function planDilution(request: DilutionRequest): DilutionPlan {
  const range = validateCountableRange(request.range ?? DEFAULT_COUNTABLE_RANGE);
  let density = request.cfuPerMl;
  if (density === undefined) {
    if (request.od === undefined || request.cfuPerOd === undefined) {
      throw new FitnessError(
        'dilution planner: give a density, or an OD with the CFU-per-OD calibration',
      );
    }
    density = request.od * request.cfuPerOd;
  }
  if (!(density > 0) || !Number.isFinite(density)) {
    throw new FitnessError(`dilution planner: expected density must be > 0, got ${density}`);
  }
  const volumes = request.volumesUl ?? [100];
  if (volumes.length === 0 || volumes.some((v) => !(v > 0) || !Number.isFinite(v))) {
    throw new FitnessError(`dilution planner: volumes must be > 0 µL, got ${volumes.join(', ')}`);
  }
  const step = request.seriesStep ?? 10;
  if (!(step > 1) || !Number.isFinite(step)) {
    throw new FitnessError(`dilution planner: series step must be > 1, got ${step}`);
  }
  const maxFold = request.maxFold ?? 1e12;
  const target = (range.min + range.max) / 2;
  // A plate expected inside the range always beats one outside it, however near the middle the
  // other lands on a log scale (270 expected misses 137.5 by less than 54 does, but is not countable).
  let best: { fold: number; volumeUl: number; expected: number; miss: number } | null = null;
  for (let fold = 1; fold <= maxFold; fold *= step) {
    for (const volumeUl of volumes) {
      const expected = (density * volumeUl) / 1000 / fold;
      const outside = countableStatus(Math.round(expected), range) === 'countable' ? 0 : 1e6;
      const miss = outside + Math.abs(Math.log(expected / target));
      if (best === null || miss < best.miss - 1e-12) best = { fold, volumeUl, expected, miss };
    }
  }
  const chosen = best!;
  return {
    cfuPerMl: density,
    target,
    dilutionFold: chosen.fold,
    volumeUl: chosen.volumeUl,
    expectedColonies: chosen.expected,
    status: countableStatus(Math.round(chosen.expected), range),
    range,
  };
}

export interface ReplicatesRequest {
  /** Smallest difference in W worth detecting (against W = 1, or between two groups). */
  difference: number;
  /** SD of W between replicate assays seen so far (includes their counting noise). */
  assaySd: number;
  /** Mean counting-noise SE of W of those assays, removed from assaySd; default 0. */
  observedCountingSe?: number;
  /** Colonies of each strain planned in each sample (start and end). */
  plannedColonies: { start: number; end: number };
  /** Expected m_ref over the assay; default ln 100 (one 100-fold regrowth). */
  expectedMRef?: number;
  /** Expected W, for the counting noise; default 1. */
  expectedW?: number;
  design?: 'one-sample' | 'two-sample';
  alpha?: number;
  power?: number;
}

export interface ReplicatesPlan {
  /** Replicate assays needed (per group for the two-sample design). */
  n: number;
  /** SD of W per assay assumed: between-assay part and planned counting noise combined. */
  sdPerAssay: number;
  countingSe: number;
  betweenAssaySd: number;
}

/** Counting-noise SE of W for planned colony numbers (delta method, as in competition.ts). */
export function plannedCountingSe(
  colonies: { start: number; end: number },
  mRef = Math.log(100),
  W = 1,
): number {
  if (!(colonies.start > 0 && colonies.end > 0)) {
    throw new FitnessError('replicates planner: planned colonies must be > 0');
  }
  if (!(mRef > 0)) throw new FitnessError('replicates planner: expected m_ref must be > 0');
  const varM = 1 / colonies.start + 1 / colonies.end;
  return Math.sqrt(varM + W * W * varM) / mRef;
}

/**
 * Replicate assays needed for a two-sided t-test at level alpha to detect `difference` with the
 * given power. σ² = (assaySd² − observedCountingSe²)⁺ + counting SE² at the planned colonies;
 * n is the smallest with δ ≥ (t(1 − α/2; ν) + t(power; ν))·σ·√(c/n), c = 1 (one-sample, ν = n − 1)
 * or 2 (two groups of n, ν = 2n − 2): the usual iterative central-t approximation to the
 * noncentral-t power, which errs by at most about one assay.
 */
export function planReplicates(request: ReplicatesRequest): ReplicatesPlan {
  const { difference, assaySd } = request;
  if (!(difference !== 0) || !Number.isFinite(difference)) {
    throw new FitnessError(
      `replicates planner: difference must be a non-zero number, got ${difference}`,
    );
  }
  if (!(assaySd >= 0) || !Number.isFinite(assaySd)) {
    throw new FitnessError(`replicates planner: assay SD must be ≥ 0, got ${assaySd}`);
  }
  const alpha = request.alpha ?? 0.05;
  const power = request.power ?? 0.8;
  if (!(alpha > 0 && alpha < 1) || !(power > 0 && power < 1)) {
    throw new FitnessError('replicates planner: alpha and power must lie in (0, 1)');
  }
  const countingSe = plannedCountingSe(
    request.plannedColonies,
    request.expectedMRef,
    request.expectedW,
  );
  const observed = request.observedCountingSe ?? 0;
  const betweenAssaySd = Math.sqrt(Math.max(0, assaySd ** 2 - observed ** 2));
  const sd = Math.sqrt(betweenAssaySd ** 2 + countingSe ** 2);
  const n = replicatesNeeded(difference, sd, request.design ?? 'one-sample', alpha, power);
  return { n, sdPerAssay: sd, countingSe, betweenAssaySd };
}

/**
 * Smallest n with |δ| ≥ (t(1 − α/2; ν) + t(power; ν))·σ·√(c/n) (see planReplicates). At least 2.
 */
export function replicatesNeeded(
  difference: number,
  sd: number,
  design: 'one-sample' | 'two-sample',
  alpha = 0.05,
  power = 0.8,
): number {
  const c = design === 'two-sample' ? 2 : 1;
  for (let n = 2; n <= 100_000; n++) {
    const df = c === 2 ? 2 * n - 2 : n - 1;
    const needed =
      (studentTQuantile(1 - alpha / 2, df) + studentTQuantile(power, df)) * sd * Math.sqrt(c / n);
    if (Math.abs(difference) >= needed) return n;
  }
  throw new FitnessError('replicates planner: more than 100,000 assays would be needed');
}

/** The numbers of replicate assays seen so far that the replicates planner needs. */
export interface ObservedSpread {
  /** SD of W between replicate assays (within a group, or pooled over groups). */
  sd: number;
  /** Mean W, for the counting noise. */
  meanW: number;
  /** Counting-noise SE of W of each assay. */
  countingSe: number[];
  /** Colonies of each strain in each sample, averaged over the assays. */
  colonies: { start: number; end: number };
  /** Mean m_ref of the assays. */
  mRef: number;
}

/**
 * Replicates needed to detect `difference` in W in a new group (two groups compared, or one
 * against W = 1) plated at the same colony numbers: the observed SD minus its counting noise
 * (root mean square of the per-assay counting SEs) is the between-assay part.
 */
export function replicatesFromSpread(
  spread: ObservedSpread,
  difference: number,
  design: 'one-sample' | 'two-sample' = 'two-sample',
): ReplicatesPlan {
  const se = spread.countingSe;
  const rms = Math.sqrt(se.reduce((s, e) => s + e * e, 0) / se.length);
  return planReplicates({
    difference,
    assaySd: spread.sd,
    observedCountingSe: rms,
    plannedColonies: spread.colonies,
    expectedMRef: spread.mRef,
    expectedW: spread.meanW,
    design,
  });
}
