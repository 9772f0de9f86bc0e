import { hrefOf } from '../app/route.ts';
import { useDraft } from '../app/use-draft.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { uncheckedGroups } from '../results/unchecked.ts';
import { useFitness } from '../results/use-fitness.ts';
import { counted } from '../words/counted.ts';
import { AssayResults } from './AssayResults.tsx';
import { GroupResults } from './GroupResults.tsx';
import { ReciprocalResults } from './ReciprocalResults.tsx';
import { SharedCurves } from './SharedCurves.tsx';
import { TrajectoryCard } from './TrajectoryCard.tsx';

export function ResultsTab({ data }: { data: ExperimentData }) {
  const [checkedOnly, setCheckedOnly] = useDraft(
    `results-checked-only.${data.experiment.id}`,
    () => false,
  );
  const [correctMarker, setCorrectMarker] = useDraft(
    `results-correct-marker.${data.experiment.id}`,
    () => false,
  );
  const computed = useFitness(data, { checkedOnly, correctMarker });
  if (computed.state === 'computing')
    return (
      <p className="card muted" role="status">
        Computing fitness…
      </p>
    );
  if (computed.state === 'failed')
    return (
      <div className="banner alarm">
        <p>Fitness could not be computed: {computed.error}</p>
        {correctMarker && (
          <button type="button" className="btn" onClick={() => setCorrectMarker(false)}>
            Show uncorrected values
          </button>
        )}
      </div>
    );
  const fit = computed.fit;
  const a = fit.analysis;
  return (
    <>
      {(fit.unchecked.size > 0 || checkedOnly) && (
        <section className="card stack" aria-label="Unchecked counts" data-testid="unchecked-note">
          <p style={{ margin: 0 }}>
            {checkedOnly
              ? `Showing checked counts only: ${counted(fit.hidden.length, 'assay', 'assays')} resting on photo counts nobody has checked ${fit.hidden.length === 1 ? 'is' : 'are'} left out.`
              : `${counted(fit.unchecked.size, 'assay rests', 'assays rest')} on photo counts nobody has checked yet: marked "unchecked" below, with ${fit.unchecked.size === 1 ? 'its group' : 'their groups'}.`}
          </p>
          <button
            type="button"
            className="btn"
            data-testid="checked-only"
            aria-pressed={checkedOnly}
            onClick={() => setCheckedOnly(!checkedOnly)}
          >
            {checkedOnly ? 'Show every assay' : 'Hide unchecked assays'}
          </button>
        </section>
      )}
      {fit.waiting.length > 0 && (
        <details className="card">
          <summary style={{ minHeight: 40 }}>
            {counted(fit.waiting.length, 'assay', 'assays')} waiting for counts
          </summary>
          <ul>
            {fit.waiting.map((w) => (
              <li key={w.assay}>
                {w.plateId ? (
                  <a
                    href={hrefOf({
                      screen: 'plate',
                      experimentId: data.experiment.id,
                      plateId: w.plateId,
                    })}
                  >
                    {w.assay}: {w.reason}
                  </a>
                ) : (
                  `${w.assay}: ${w.reason}`
                )}
              </li>
            ))}
          </ul>
        </details>
      )}
      {a?.errors.map((e) => (
        <p key={e.assay} className="banner alarm">
          {e.assay}: {e.message}
        </p>
      ))}
      {!a && (
        <p className="card muted">
          Count the start and end plates of an assay and its relative fitness appears here.
        </p>
      )}
      {a && (
        <>
          <AssayResults analysis={a} imageFlags={fit.imageFlags} unchecked={fit.unchecked} />
          <GroupResults
            analysis={a}
            unchecked={uncheckedGroups(a, fit.unchecked)}
            onCorrect={setCorrectMarker}
          />
          <ReciprocalResults analysis={a} />
          {a.trajectories.map((t) => (
            <TrajectoryCard key={t.line} trajectory={t} assays={a.assays} />
          ))}
          <SharedCurves tests={a.sharedCurves} />
        </>
      )}
    </>
  );
}
