import type { QualityFlag } from './types.ts';

/**
 * Doubts about a plate as a whole, so that the analysis is never wrong in silence. Each is
 * measured on the plate itself:
 *
 * - 'nothing-found': no colony was counted, yet more than NOTHING_FOREGROUND of the agar differs
 *   from the agar around it (colonies may be there and every one was rejected);
 * - 'many-rejected': more colony-sized objects were set aside (as writing, shading, or of neither
 *   colour) than were counted, and at least MANY_REJECTED of them;
 * - 'unstable-count': the count leans on the detection threshold. The share of counted colonies
 *   whose mean contrast lies within NEAR_THRESHOLD times the threshold is the share a stricter
 *   threshold of that factor would lose: the slope of the count against the threshold, read off
 *   the plate's own distribution of contrasts instead of counting twice.
 */
const NOTHING_FOREGROUND = 0.002;
const MANY_REJECTED = 10;
const NEAR_THRESHOLD = 1.5;
const UNSTABLE_SHARE = 0.3;
const UNSTABLE_MIN_COLONIES = 10;

export interface PlateEvidence {
  counted: number;
  /** Share of the counting area in the foreground. */
  foregroundShare: number;
  /** Colony-sized objects set aside. */
  setAside: number;
  /** Mean contrast of each counted colony, and the detection threshold (ΔE*ab). */
  contrasts: readonly number[];
  threshold: number;
}

export function plateDoubts(e: PlateEvidence): QualityFlag[] {
  const flags: QualityFlag[] = [];
  if (e.counted === 0 && e.foregroundShare > NOTHING_FOREGROUND)
    flags.push({ kind: 'nothing-found', foregroundShare: round3(e.foregroundShare) });
  if (e.setAside >= MANY_REJECTED && e.setAside > e.counted)
    flags.push({ kind: 'many-rejected', setAside: e.setAside, counted: e.counted });
  if (e.contrasts.length >= UNSTABLE_MIN_COLONIES) {
    const near = e.contrasts.filter((c) => c < NEAR_THRESHOLD * e.threshold).length;
    const share = near / e.contrasts.length;
    if (share > UNSTABLE_SHARE) flags.push({ kind: 'unstable-count', share: round3(share) });
  }
  return flags;
}

function round3(v: number): number {
  return Math.round(v * 1000) / 1000;
}
