import { COUNTABLE_RANGES, type CountableRange } from '../fitness/countable-range.ts';

/** A command-line mistake: the command prints it with its usage and exits with status 2. */
export class UsageError extends Error {
  override name = 'UsageError';
}

/** `--range`: a named countable range (fitness/countable-range.ts) or the lab's own MIN-MAX. */
export function parseRange(text: string): CountableRange {
  if (text in COUNTABLE_RANGES) return COUNTABLE_RANGES[text as keyof typeof COUNTABLE_RANGES];
  const m = /^(\d+)-(\d+)$/.exec(text);
  if (m && Number(m[1]) <= Number(m[2])) {
    return { min: Number(m[1]), max: Number(m[2]), source: `lab setting (${m[1]}–${m[2]})` };
  }
  throw new UsageError(`--range: expected bam, sm9215, iso7218 or MIN-MAX, got "${text}"`);
}

export function wholeNumber(text: string, option: string, min: number): number {
  if (!/^\d+$/.test(text) || Number(text) < min) {
    throw new UsageError(`${option}: expected a whole number ≥ ${min}, got "${text}"`);
  }
  return Number(text);
}

/** A number in [min, max], written as a plain decimal (`--dish-scale 0.998`). */
export function decimalBetween(text: string, option: string, min: number, max: number): number {
  const value = Number(text);
  if (!/^\d+(\.\d+)?$/.test(text) || value < min || value > max) {
    throw new UsageError(`${option}: expected a number from ${min} to ${max}, got "${text}"`);
  }
  return value;
}
