import { useMemo } from 'react';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { experimentFitness } from '../results/experiment-fitness.ts';
import { AssayResults } from './AssayResults.tsx';
import { GroupResults } from './GroupResults.tsx';
import { TrajectoryCard } from './TrajectoryCard.tsx';

export function ResultsTab({ data }: { data: ExperimentData }) {
  const fit = useMemo(() => experimentFitness(data), [data]);
  const a = fit.analysis;
  return (
    <>
      {fit.error && <p className="banner alarm">{fit.error}</p>}
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
      {!a && !fit.error && (
        <p className="card muted">
          Count the start and end plates of an assay and its relative fitness appears here.
        </p>
      )}
      {a && (
        <>
          <AssayResults analysis={a} imageFlags={fit.imageFlags} />
          <GroupResults analysis={a} />
          {a.trajectories.map((t) => (
            <TrajectoryCard key={t.line} trajectory={t} assays={a.assays} />
          ))}
        </>
      )}
    </>
  );
}
