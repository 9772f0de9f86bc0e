import { describe, expect, it } from 'vitest';
import { formatForReport, roundForReport } from './rounding.ts';

describe('roundForReport', () => {
  it('follows the FDA BAM ch. 3 examples', () => {
    // FDA Bacteriological Analytical Manual, ch. 3 (Aerobic Plate Count), table "Calculated Count /
    // APC".
    expect(roundForReport(12_700, 'bam')).toBe(13_000);
    expect(roundForReport(12_400, 'bam')).toBe(12_000);
    expect(roundForReport(15_500, 'bam')).toBe(16_000);
    expect(roundForReport(14_500, 'bam')).toBe(14_000);
    // BAM worked example: 537/0.022 = 24,409 reported as 24,000.
    expect(roundForReport(537 / 0.022, 'bam')).toBe(24_000);
  });

  it('rounds a third digit of 5 up under ISO 7218', () => {
    expect(roundForReport(14_500, 'iso7218')).toBe(15_000);
    // GOST ISO 21149-2020 §12.3.3: 26,682 → 27,000; ISO/TS 19036 Ex. 2: 281.8 → 280.
    expect(roundForReport(587 / 0.022, 'iso7218')).toBe(27_000);
    expect(roundForReport(31 / 0.11, 'iso7218')).toBe(280);
  });

  it('handles decades, small values and zero', () => {
    expect(roundForReport(996, 'iso7218')).toBe(1000);
    expect(roundForReport(0.0145, 'bam')).toBe(0.014);
    expect(roundForReport(0, 'bam')).toBe(0);
    expect(roundForReport(-12_700, 'bam')).toBe(-13_000);
    expect(formatForReport(537 / 0.022)).toBe('2.4×10^4');
    expect(() => roundForReport(Number.NaN)).toThrow(RangeError);
  });
});
