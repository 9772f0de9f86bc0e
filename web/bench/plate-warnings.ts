import type { FlagRecord } from '../../schema/records.ts';
import { plateFlagLabel } from '../words/flag-words.ts';

/**
 * Remarks about the whole plate: the count as a whole may be wrong (no dish, glare over part of
 * the agar, out of focus, one colour only). Remarks about single objects (unsure colours,
 * clumps, writing on the lid, a few blobs of neither colour left out) are for the person to look
 * at where they are; they do not ask for a second tap, or a guard that fires on nearly every
 * plate would be tapped through unread. A plate with most of its objects set aside is a
 * whole-plate remark of its own ('many-rejected'), and so is a photo too coarse for small colonies.
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
