import type { FlagRecord } from '../../schema/records.ts';
import { plateFlagLabel, storedFlagSentence } from '../words/flag-words.ts';

/** The analysis's remarks on this plate: short labels in one line, the sentences on a tap. */
export function PlateFlags({ flags }: { flags: readonly FlagRecord[] }) {
  if (flags.length === 0) return null;
  return (
    <details className="banner plate-flags" data-testid="plate-flags">
      <summary>
        {flags.map((f) => (
          <span key={f.kind} className="flag">
            {plateFlagLabel(f.kind)}
          </span>
        ))}
      </summary>
      {flags.map((f) => (
        <div key={f.kind}>{storedFlagSentence(f)}</div>
      ))}
    </details>
  );
}
