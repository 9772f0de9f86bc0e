import type { FlagRecord } from '../../schema/records.ts';
import { plateFlagLabel } from '../words/flag-words.ts';

/**
 * What the person must have looked at before a plate's count may be trusted: every remark the
 * analysis made on the whole plate, and a plate with no colony at all. Empty when a single tap
 * may mark the plate checked; otherwise marking it takes a second tap that names these.
 */
export function plateWarnings(flags: readonly FlagRecord[], total: number): string[] {
  const words = flags.map((f) => plateFlagLabel(f.kind));
  return total === 0 ? ['no colonies found', ...words] : words;
}
