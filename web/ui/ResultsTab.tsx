import type { ExperimentData } from '../bench/experiment-data.ts';
import { useFitness } from '../results/use-fitness.ts';
import { AssayResults } from './AssayResults.tsx';
import { GroupResults } from './GroupResults.tsx';
import { ReciprocalResults } from './ReciprocalResults.tsx';
import { TrajectoryCard } from './TrajectoryCard.tsx';

export function ResultsTab({ data }: { data: ExperimentData }) {
  const computed = useFitness(data);
  if (computed.state === 'computing')
    return (
      <p className="card muted" role="status">
        Computing fitness…
      </p>
    );
  if (computed.state === 'failed')
    return <p className="banner alarm">Fitness could not be computed: {computed.error}</p>;
  const fit = computed.fit;
  const a = fit.analysis;
  return (
    <>
      {fit.waiting.length > 0 && (
        <details className="card">
          <summary style={{ minHeight: 40 }}>
            {fit.waiting.length} assays waiting for counts
          </summary>
          <ul>
            {fit.waiting.map((w) => (
              <li key={w.assay}>
                {w.assay}: {w.reason}
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
          <AssayResults analysis={a} imageFlags={fit.imageFlags} />
          <GroupResults analysis={a} />
          <ReciprocalResults analysis={a} />
          {a.trajectories.map((t) => (
            <TrajectoryCard key={t.line} trajectory={t} assays={a.assays} />
          ))}
        </>
      )}
    </>
  );
}
