import { useState } from 'react';
import { readModelText } from '../../worker/learning.ts';
import { refitModel, resetLearning, setLearning } from '../analysis/learning.ts';
import { useServices } from '../app/services.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { learningSentence, notLearnedSentence } from '../words/learning-words.ts';
import { ConfirmButton } from './ConfirmButton.tsx';

/** What the experiment learned from its checked plates, and the person's say over it. */
export function LearningCard({ data }: { data: ExperimentData }) {
  const { store, worker } = useServices();
  const [note, setNote] = useState<string | null>(null);
  const { experiment } = data;
  const { learning } = experiment;
  const read = learning.model === null ? null : readModelText(learning.model);
  const failed = (what: string) => (e: unknown) =>
    setNote(`${what}: ${e instanceof Error ? e.message : String(e)}`);

  // Turned back on, the plates checked while it was off teach too.
  const turnOn = () =>
    setLearning(store, experiment, true)
      .then(() => refitModel(store, worker, experiment.id))
      .then((fit) => setNote(fit && !fit.ok ? notLearnedSentence(fit.reason) : null))
      .catch(failed('Learning not turned on'));

  return (
    <section className="card" aria-label="Learning from checked plates">
      <h3 style={{ marginTop: 0 }}>Learning from checked plates</h3>
      <p className="muted" data-testid="learning-state">
        {learningSentence(learning, read)}
      </p>
      <div className="row">
        {learning.enabled ? (
          <button
            type="button"
            className="btn quiet"
            data-testid="learning-off"
            onClick={() =>
              setLearning(store, experiment, false).catch(failed('Learning not turned off'))
            }
          >
            Turn learning off
          </button>
        ) : (
          <button type="button" className="btn quiet" data-testid="learning-on" onClick={turnOn}>
            Turn learning on
          </button>
        )}
        {learning.model !== null && (
          <ConfirmButton
            label="Reset learning"
            armed="Tap again: forget what was learned"
            testId="learning-reset"
            onConfirm={() =>
              resetLearning(store, experiment).then(
                () =>
                  setNote(
                    'Forgotten. Plates read from now on use the default analysis, and the plates you check from now on teach anew; plates already read keep their counts until you re-read them.',
                  ),
                failed('Not reset'),
              )
            }
          />
        )}
      </div>
      {note && (
        <p className="muted" role="status">
          {note}
        </p>
      )}
    </section>
  );
}
