/**
 * Reads a number as people write dilutions at the bench: "100000", "1e5", "10^5", "1:100000"
 * or "10-5" (meaning 10⁻⁵, a 100000-fold dilution). Returns null unless the result is a finite
 * number above 0 (or, with `whole`, a whole number ≥ 0).
 */
export function parseFold(text: string, whole = false): number | null {
  const t = text.trim().replace(/\s+/g, '').replace(',', '.');
  if (t === '') return null;
  let n: number;
  const power = /^10\^?(-?\d+)$/.exec(t);
  if (/^1:/.test(t)) n = Number(t.slice(2));
  else if (/^10-\d+$/.test(t)) n = 10 ** Number(t.slice(3));
  else if (power && t.includes('^')) n = 10 ** Math.abs(Number(power[1]));
  else n = Number(t);
  if (!Number.isFinite(n)) return null;
  if (whole) return Number.isInteger(n) && n >= 0 ? n : null;
  return n > 0 ? n : null;
}
