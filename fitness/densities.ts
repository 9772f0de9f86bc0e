/**
 * Colony counts to densities. Both marker colours are counted on the same plate, so a plate is one
 * volume of one dilution of the culture, carrying two counts.
 *
 * Density of one plate: CFU/mL = colonies × dilution fold / volume plated (mL).
 * Several plates of one sample (one or several dilutions) are pooled: N = ΣC / Σ(V_i / f_i), the
 * colonies over the volume of undiluted culture they came from. With equal volumes at two
 * successive ten-fold dilutions this is the standard plate-count weighted mean
 * N = ΣC / (V·(n1 + 0.1·n2)·d) of FDA BAM ch. 3 and ISO 7218.
 * Counting noise: ΣC is Poisson, so Var(ln N) = 1/ΣC (delta method), and N has the exact
 * Garwood interval of ΣC scaled by 1/Σ(V_i/f_i). A strain with no colony at all has density 0 and
 * an upper limit: the exact one-sided 95 % Poisson limit of a zero count, −ln 0.05 ≈ 3.0 colonies
 * (poisson.ts), over the same culture volume.
 */
import {
  type CountableRange,
  type CountableStatus,
  countableStatus,
  DEFAULT_COUNTABLE_RANGE,
  validateCountableRange,
} from './countable-range.ts';
import { FitnessError } from './errors.ts';
import { poissonExactInterval, ZERO_COUNT_UPPER_95 } from './poisson.ts';

export interface Plate {
  /** Names the plate in messages, e.g. 'row 12'. */
  label: string;
  /** Fold dilution of the culture before plating (1 = undiluted, 1000 = 10⁻³). */
  dilutionFold: number;
  /** Volume spread or poured, in mL. */
  volumeMl: number;
  testColonies: number;
  referenceColonies: number;
}

export interface PlateCheck {
  label: string;
  total: number;
  status: CountableStatus;
  /** True when the plate was left out of the pooled estimate. */
  dropped: boolean;
}

export interface StrainDensity {
  /** Colonies of this strain on the plates used. */
  colonies: number;
  /** Pooled CFU per mL of the sampled culture. */
  cfuPerMl: number;
  /** Exact Poisson 95 % interval of the density from counting noise alone. */
  ci95: [number, number];
  /** Var(ln density) from Poisson counting noise: 1 / colonies (1 / 3.0 for no colony). */
  logVariance: number;
  /**
   * No colony seen: the density is at most this (one-sided 95 % limit of a zero count over the
   * culture volume plated); null when colonies were seen.
   */
  atMostCfuPerMl: number | null;
}

export interface SampleDensity {
  plates: PlateCheck[];
  /** Σ V_i / f_i over the plates used: mL of undiluted culture on them. */
  cultureMl: number;
  test: StrainDensity;
  reference: StrainDensity;
  range: CountableRange;
}

export interface DensityOptions {
  range?: CountableRange;
  /**
   * The standard's exclusion: drop out-of-range plates when the same sample has an in-range
   * plate. Off by default (all plates are kept and the out-of-range ones flagged).
   */
  excludeOutOfRange?: boolean;
}

/** Checks one plate's numbers; throws a FitnessError naming the plate. */
export function validatePlate(plate: Plate, context: string): void {
  const where = `${context}, ${plate.label}`;
  if (!Number.isFinite(plate.dilutionFold) || plate.dilutionFold < 1) {
    throw new FitnessError(
      `${where}: dilution fold must be a number ≥ 1, got ${plate.dilutionFold}`,
    );
  }
  if (!Number.isFinite(plate.volumeMl) || plate.volumeMl <= 0) {
    throw new FitnessError(`${where}: plated volume must be > 0, got ${plate.volumeMl}`);
  }
  for (const [name, n] of [
    ['test colonies', plate.testColonies],
    ['reference colonies', plate.referenceColonies],
  ] as const) {
    if (!Number.isInteger(n) || n < 0) {
      throw new FitnessError(`${where}: ${name} must be a whole number ≥ 0, got ${n}`);
    }
  }
}

/** CFU per mL of one strain on one plate: colonies × dilution fold / volume (mL). */
export function plateDensity(colonies: number, dilutionFold: number, volumeMl: number): number {
  return (colonies * dilutionFold) / volumeMl;
}

/**
 * Pooled density of several plates of one sample: ΣC / Σ(V_i / f_i) CFU/mL. For equal volumes at
 * two successive ten-fold dilutions this is the plate-count weighted mean ΣC / (V·(n1 + 0.1·n2)·d).
 */
export function pooledCfuPerMl(
  plates: readonly { colonies: number; dilutionFold: number; volumeMl: number }[],
): number {
  let colonies = 0;
  let cultureMl = 0;
  for (const p of plates) {
    colonies += p.colonies;
    cultureMl += p.volumeMl / p.dilutionFold;
  }
  if (!(cultureMl > 0)) throw new FitnessError('no plated volume to pool');
  return colonies / cultureMl;
}

function strainDensity(colonies: number, cultureMl: number): StrainDensity {
  const [lo, hi] = poissonExactInterval(colonies);
  return {
    colonies,
    cfuPerMl: colonies / cultureMl,
    ci95: [lo / cultureMl, hi / cultureMl],
    logVariance: 1 / (colonies > 0 ? colonies : ZERO_COUNT_UPPER_95),
    atMostCfuPerMl: colonies > 0 ? null : ZERO_COUNT_UPPER_95 / cultureMl,
  };
}

/**
 * Pools the plates of one sample into densities of the two strains. `context` names the sample
 * in errors (e.g. 'assay A3, end sample'). Throws a FitnessError when there is no plate or a plate
 * is invalid. A strain with no colony gets density 0 and its upper limit (atMostCfuPerMl).
 */
export function sampleDensity(
  plates: readonly Plate[],
  context: string,
  options: DensityOptions = {},
): SampleDensity {
  const range = validateCountableRange(options.range ?? DEFAULT_COUNTABLE_RANGE);
  if (plates.length === 0) throw new FitnessError(`${context}: no plate`);
  for (const plate of plates) validatePlate(plate, context);
  const checks = plates.map((p) => {
    const total = p.testColonies + p.referenceColonies;
    return { label: p.label, total, status: countableStatus(total, range), dropped: false };
  });
  const anyCountable = checks.some((c) => c.status === 'countable');
  if (options.excludeOutOfRange && anyCountable) {
    for (const c of checks) c.dropped = c.status !== 'countable';
  }
  let cultureMl = 0;
  let test = 0;
  let reference = 0;
  plates.forEach((p, i) => {
    if (checks[i]!.dropped) return;
    cultureMl += p.volumeMl / p.dilutionFold;
    test += p.testColonies;
    reference += p.referenceColonies;
  });
  return {
    plates: checks,
    cultureMl,
    test: strainDensity(test, cultureMl),
    reference: strainDensity(reference, cultureMl),
    range,
  };
}
