import type { ColonyRecord } from '../../schema/records.ts';

/** One checked plate: the colonies the analysis found, and the colonies after the person's taps. */
export interface ReviewedPlate {
  found: readonly ColonyRecord[];
  corrected: readonly ColonyRecord[];
}

/** The person's corrections on one plate, in colonies (a clump counts for what it stands for). */
export interface Corrected {
  added: number;
  removed: number;
  switched: number;
}

export interface CountAccuracy {
  plates: number;
  /** Colonies added, removed and switched, summed over the plates. */
  corrections: number;
  correctedTotal: number;
  /**
   * Corrections over the colonies on the checked plates: every correction counts, so one colony
   * added and another removed are two errors, never a net zero.
   */
  correctionFraction: number;
  /** Median over plates of the relative error of the plate's total count. */
  medianTotalError: number;
}

/** What the person changed between the analysis's colonies and the corrected ones. */
export function correctionsOf(plate: ReviewedPlate): Corrected {
  const found = new Map(plate.found.map((c) => [c.id, c]));
  const kept = new Set<string>();
  const out: Corrected = { added: 0, removed: 0, switched: 0 };
  for (const c of plate.corrected) {
    const before = found.get(c.id);
    if (!before) out.added += c.count;
    else {
      kept.add(c.id);
      if (before.cls !== c.cls) out.switched += c.count;
    }
  }
  for (const c of plate.found) if (!kept.has(c.id)) out.removed += c.count;
  return out;
}

const total = (cs: readonly ColonyRecord[]) => cs.reduce((n, c) => n + c.count, 0);

export function countAccuracy(plates: readonly ReviewedPlate[]): CountAccuracy | null {
  if (plates.length === 0) return null;
  let corrections = 0;
  let correctedTotal = 0;
  const totalErrors: number[] = [];
  for (const p of plates) {
    const c = correctionsOf(p);
    corrections += c.added + c.removed + c.switched;
    const t = total(p.corrected);
    const found = total(p.found);
    correctedTotal += t;
    totalErrors.push(t === 0 ? (found === 0 ? 0 : 1) : Math.abs(found - t) / t);
  }
  totalErrors.sort((a, b) => a - b);
  const mid = totalErrors.length / 2;
  const median =
    totalErrors.length % 2
      ? totalErrors[Math.floor(mid)]!
      : (totalErrors[mid - 1]! + totalErrors[mid]!) / 2;
  return {
    plates: plates.length,
    corrections,
    correctedTotal,
    correctionFraction:
      correctedTotal === 0 ? (corrections === 0 ? 0 : 1) : corrections / correctedTotal,
    medianTotalError: median,
  };
}
