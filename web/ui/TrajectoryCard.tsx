import { useRef } from 'react';
import type { AnalysedAssay, LineTrajectory } from '../../fitness/analysis.ts';
import { saveBlob } from '../exchange/download.ts';
import { svgFile } from '../exchange/svg-file.ts';
import { TrajectoryPlot } from './TrajectoryPlot.tsx';

/** One line over generations: the plot, the models side by side, and their parameters. */
export function TrajectoryCard({
  trajectory: t,
  assays,
}: {
  trajectory: LineTrajectory;
  assays: readonly AnalysedAssay[];
}) {
  const plot = useRef<SVGSVGElement>(null);
  return (
    <section className="card" aria-label={`Line ${t.line}`}>
      <h2>Line {t.line} over generations</h2>
      <TrajectoryPlot trajectory={t} assays={assays} svgRef={plot} />
      <button
        type="button"
        className="btn quiet"
        onClick={() => {
          if (plot.current) saveBlob(svgFile(plot.current), `line-${t.line}-fitness.svg`);
        }}
      >
        Save plot (SVG)
      </button>
      <div className="table-wrap">
        <table className="results num">
          <thead>
            <tr>
              <th>Model</th>
              <th>AIC</th>
              <th>BIC</th>
              <th>ΔAIC</th>
            </tr>
          </thead>
          <tbody>
            {t.ranking.map((r) => (
              <tr key={r.model}>
                <td>{r.model}</td>
                <td>{r.aic.toFixed(1)}</td>
                <td>{r.bic.toFixed(1)}</td>
                <td>{r.deltaAic.toFixed(1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {[t.hyperbolic, t.powerLaw, t.step].map((m) =>
        'reason' in m ? (
          <p key={m.model} className="muted">
            {m.model}: not fitted ({m.reason})
          </p>
        ) : 'parameters' in m ? (
          <p key={m.model} className="muted">
            {m.formula}:{' '}
            {m.parameters
              .map(
                (q) =>
                  `${q.name} = ${q.estimate.toPrecision(3)} ± ${q.se.toPrecision(2)}${q.poorlyDetermined ? ' (poorly determined)' : ''}`,
              )
              .join(', ')}
          </p>
        ) : (
          <p key={m.model} className="muted">
            steps:{' '}
            {m.segments
              .map((s) => `W ${s.w.toFixed(3)} over generations ${s.from}–${s.to}`)
              .join('; ')}
          </p>
        ),
      )}
    </section>
  );
}
