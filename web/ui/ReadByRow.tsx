import type { Analysis, Experiment } from '../../schema/records.ts';
import { modelForReading } from '../analysis/learning.ts';
import { readByWords, rereadLabel } from '../words/learning-words.ts';
import { ConfirmButton } from './ConfirmButton.tsx';

/**
 * Which analysis read this plate, and a re-read with what the experiment has learned now. A
 * re-read replaces the colonies, so on a plate already corrected or checked it takes a second tap.
 */
export function ReadByRow({
  analysis,
  experiment,
  touched,
  busy,
  onReread,
}: {
  analysis: Analysis;
  experiment: Experiment;
  /** The plate carries corrections or is marked checked: a re-read would drop them. */
  touched: boolean;
  busy: boolean;
  onReread: () => void;
}) {
  const now = modelForReading(experiment);
  const label = rereadLabel(now.model?.plates ?? null);
  return (
    <section className="card stack" aria-label="What read this plate">
      <p style={{ margin: 0 }} data-testid="read-by">
        Read by: {readByWords(analysis.learnedFrom)}.
      </p>
      {now.error && (
        <p className="banner alarm">
          The experiment's learned model cannot be read ({now.error}): the default analysis reads
          its plates.
        </p>
      )}
      {touched ? (
        <ConfirmButton
          className="btn quiet"
          label={label}
          armed="Tap again: your corrections on this plate are dropped"
          testId="reread-model"
          disabled={busy}
          onConfirm={onReread}
        />
      ) : (
        <button
          type="button"
          className="btn quiet"
          data-testid="reread-model"
          disabled={busy}
          onClick={onReread}
        >
          {label}
        </button>
      )}
    </section>
  );
}
