/**
 * A warning when the reference strain's generations over an assay do not fit the assay's length
 * and its fold dilution D, as when a two-day assay is entered with D = 1.
 *
 * The reference's generations are g = m_ref / ln 2. In a serial-transfer assay the start sample is
 * taken on the first day and the end sample on the last, with one transfer between each pair of
 * days, so D spreads over days − 1 transfers and each day's regrowth makes up that day's dilution:
 * log₂(D) / (days − 1) generations per day, which should be close to g / days. Two rules (common
 * practice in serial-transfer work, thresholds chosen here, from memory of typical protocols
 * of 100- to 1000-fold daily transfers: 6.6 to 10 generations a day):
 *   - g / days outside 1–15 generations per day;
 *   - with two days or more, log₂(D) / (days − 1) less than half or more than twice g / days.
 */
export const GENERATIONS_PER_DAY: [number, number] = [1, 15];

export function generationsWarning(generationsRef: number, days: number, D: number): string | null {
  const perDay = generationsRef / days;
  const [low, high] = GENERATIONS_PER_DAY;
  const seen = `the reference went through ${generationsRef.toFixed(2)} generations in ${days} day(s)`;
  if (perDay < low || perDay > high) {
    return `${seen} (${perDay.toFixed(2)} a day, plausible ${low}–${high}): check days, fold_dilution_since_start and the plates`;
  }
  if (days >= 2) {
    const fromD = Math.log2(D) / (days - 1);
    if (fromD < perDay / 2 || fromD > perDay * 2) {
      return `${seen}, but D = ${D} over ${days - 1} transfer(s) accounts for ${fromD.toFixed(2)} a day: check days and fold_dilution_since_start`;
    }
  }
  return null;
}
