import type { FlagRecord } from '../../schema/records.ts';
import { plateFlagLabel } from '../words/flag-words.ts';

/**
 * Remarks about the whole plate: the count as a whole may be wrong (no dish, glare over part of
 * the agar, out of focus, one colour only). Remarks about single objects (unsure colours,
 * clumps, writing on the lid, a few blobs of neither colour left out) are for the person to look
 * at where they are; they do not ask for a second tap, or a guard that fires on nearly every
 * plate would be tapped through unread. (How many blobs were left out is only in the remark's
 * sentence for now; once flags carry their numbers, a plate with most of its objects left out
 * belongs with the whole-plate warnings.)
 */
const LOCAL_REMARKS = new Set(['low-confidence', 'clumps-estimated', 'ink', 'colour-outliers']);

/**
 * What the person must have looked at before a plate's count may be trusted: every remark on the
 * whole plate, and a plate with no colony at all. Empty when a single tap may mark the plate
 * checked; otherwise marking it takes a second tap that names these.
 */
export function plateWarnings(flags: readonly FlagRecord[], total: number): string[] {
  const words = flags.filter((f) => !LOCAL_REMARKS.has(f.kind)).map((f) => plateFlagLabel(f.kind));
  return total === 0 ? ['no colonies found', ...words] : words;
}
