/**
 * Rounding for publication: two significant figures, as plate counts are reported. Display only:
 * never feed a rounded number into a later calculation.
 *
 * - 'bam' (FDA BAM ch. 3): keep two significant digits; a third digit above 5 raises the second,
 *   below 5 keeps it, and exactly 5 rounds the second digit to even (12,700 → 13,000;
 *   12,400 → 12,000; 15,500 → 16,000; 14,500 → 14,000). Digits after the third are ignored.
 * - 'iso7218' (ISO 7218): two significant figures, a third digit < 5 keeps, ≥ 5 raises.
 */
export type RoundingRule = 'bam' | 'iso7218';

export function roundForReport(value: number, rule: RoundingRule = 'bam'): number {
  if (!Number.isFinite(value)) throw new RangeError(`cannot round ${value}`);
  if (value === 0) return 0;
  const sign = Math.sign(value);
  const x = Math.abs(value);
  let exponent = Math.floor(Math.log10(x));
  // First three significant digits as an integer 100–999; the tiny nudge absorbs binary error
  // (e.g. 0.145 stored as 0.14499999…).
  let three = Math.floor(x / 10 ** (exponent - 2) + 1e-9);
  if (three >= 1000) {
    exponent += 1;
    three = Math.floor(three / 10);
  }
  const two = Math.floor(three / 10);
  const third = three % 10;
  let kept = two;
  if (third > 5) kept += 1;
  else if (third === 5) kept += rule === 'iso7218' || two % 2 === 1 ? 1 : 0;
  return sign * Number((kept * 10 ** (exponent - 1)).toPrecision(2));
}

/** The value rounded for report, written as a.b×10ⁿ (e.g. 24,409 → '2.4×10^4'). */
export function formatForReport(value: number, rule: RoundingRule = 'bam'): string {
  const rounded = roundForReport(value, rule);
  if (rounded === 0) return '0';
  const exponent = Math.floor(Math.log10(Math.abs(rounded)) + 1e-12);
  const mantissa = rounded / 10 ** exponent;
  return `${mantissa.toFixed(1)}×10^${exponent}`;
}
