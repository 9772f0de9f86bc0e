/**
 * Countable range of a plate: how many colonies (both marker colours together) a plate may carry
 * for its count to be used as is. Fewer and the Poisson noise dominates; more and colonies merge
 * or inhibit each other. The range is a lab setting; the defaults below are the published ones
 * (each checked against its source, named there, in countable-range.test.ts).
 */

export interface CountableRange {
  /** Fewest colonies on a countable plate, inclusive. */
  min: number;
  /** Most colonies on a countable plate, inclusive. */
  max: number;
  /** Where the range comes from, shown beside every out-of-range flag. */
  source: string;
}

export const COUNTABLE_RANGES: {
  bam: CountableRange;
  sm9215: CountableRange;
  iso7218: CountableRange;
} = {
  // FDA Bacteriological Analytical Manual ch. 3, Aerobic Plate Count (Maturin & Peeler 2001).
  bam: { min: 25, max: 250, source: 'FDA BAM ch. 3 (25–250)' },
  // APHA/AWWA/WEF Standard Methods 9215, heterotrophic plate count (pour and spread plates).
  sm9215: { min: 30, max: 300, source: 'Standard Methods 9215 (30–300)' },
  // ISO 7218:2007, 90 mm dishes.
  iso7218: { min: 10, max: 300, source: 'ISO 7218 (10–300)' },
};

export const DEFAULT_COUNTABLE_RANGE: CountableRange = COUNTABLE_RANGES.bam;

export type CountableStatus = 'countable' | 'too-few' | 'too-many';

/** Checks that a range is usable: finite, non-negative, min ≤ max. Throws a RangeError if not. */
export function validateCountableRange(range: CountableRange): CountableRange {
  const { min, max } = range;
  if (!Number.isFinite(min) || !Number.isFinite(max) || min < 0 || min > max) {
    throw new RangeError(
      `countable range ${range.source || '(unnamed)'}: need 0 ≤ min ≤ max, got ${min}–${max}`,
    );
  }
  return range;
}

/**
 * Where a plate's total colony count (test + reference colonies) falls against a countable range.
 * Both ends are inclusive: with 25–250, 25 and 250 are countable, 24 is too few, 251 too many.
 * Throws a RangeError for a negative, fractional or non-finite total.
 */
export function countableStatus(
  totalColonies: number,
  range: CountableRange = DEFAULT_COUNTABLE_RANGE,
): CountableStatus {
  if (!Number.isInteger(totalColonies) || totalColonies < 0) {
    throw new RangeError(`colony total must be a whole number ≥ 0, got ${totalColonies}`);
  }
  validateCountableRange(range);
  if (totalColonies < range.min) return 'too-few';
  if (totalColonies > range.max) return 'too-many';
  return 'countable';
}
