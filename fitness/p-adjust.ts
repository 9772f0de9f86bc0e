/**
 * Adjusted p-values for a family of tests, as R's p.adjust() gives them:
 * - Holm (1979, Scand. J. Statist. 6:65): step-down, controls the family-wise error rate;
 *   p̃_(i) = max over j ≤ i of min(1, (m − j + 1)·p_(j)), p sorted ascending.
 * - Benjamini & Hochberg (1995, J. R. Statist. Soc. B 57:289): step-up, controls the false
 *   discovery rate; p̃_(i) = min over j ≥ i of min(1, m/j·p_(j)).
 * Values come back in the order given.
 */
function order(p: readonly number[], ascending: boolean): number[] {
  return p.map((_, i) => i).sort((a, b) => (ascending ? p[a]! - p[b]! : p[b]! - p[a]!) || a - b);
}

export function holm(p: readonly number[]): number[] {
  const m = p.length;
  const out = new Array<number>(m);
  let running = 0;
  order(p, true).forEach((i, rank) => {
    running = Math.max(running, Math.min(1, (m - rank) * p[i]!));
    out[i] = running;
  });
  return out;
}

export function benjaminiHochberg(p: readonly number[]): number[] {
  const m = p.length;
  const out = new Array<number>(m);
  let running = 1;
  order(p, false).forEach((i, rank) => {
    running = Math.min(running, Math.min(1, (m / (m - rank)) * p[i]!));
    out[i] = running;
  });
  return out;
}
