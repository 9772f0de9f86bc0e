import { useRef } from 'react';
import type { AnalysedAssay, LineTrajectory } from '../../fitness/analysis.ts';
import { saveBlob } from '../exchange/download.ts';
import { svgFile } from '../exchange/svg-file.ts';
import { generationSpan, MODEL_NAMES, modelDoubt, modelNamed } from '../results/model-trust.ts';
import { TrajectoryPlot } from './TrajectoryPlot.tsx';

/**
 * One line over generations: the plot, and the models side by side with their parameters when
 * they may be read as results; otherwise why not.
 */
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
      {[t.hyperbolic, t.powerLaw, t.step].map((m) => {
        const name = MODEL_NAMES[m.model] ?? m.model;
        const doubt = modelDoubt(t, m);
        if (doubt)
          return (
            <p key={m.model} className="muted" data-testid="model-doubt">
              {name}: not shown ({doubt})
            </p>
          );
        if ('reason' in m) return null;
        return 'parameters' in m ? (
          <p key={m.model} className="muted">
            {name}, {m.formula}:{' '}
            {m.parameters
              .map(
                (q) =>
                  `${q.name} = ${q.estimate.toPrecision(3)} (95% ${q.ci[0].toPrecision(3)} to ${q.ci[1].toPrecision(3)})${q.poorlyDetermined ? ' (poorly determined: the interval contains 0)' : ''}`,
              )
              .join(', ')}
            {(() => {
              const vs = m.model === 'hyperbolic' ? t.vsNull.hyperbolic : t.vsNull.powerLaw;
              return vs
                ? `; against W = 1: F(${vs.df1}, ${vs.df2}) = ${vs.f.toFixed(2)}, p ${vs.p < 0.001 ? '< 0.001' : `= ${vs.p.toFixed(3)}`}`
                : '';
            })()}
          </p>
        ) : (
          <p key={m.model} className="muted">
            {name}:{' '}
            {m.segments
              .map((s) => `W ${s.w.toFixed(3)} over ${generationSpan(s.from, s.to)}`)
              .join('; ')}
          </p>
        );
      })}
      {t.ranking.every((r) => !modelDoubt(t, modelNamed(t, r.model))) && (
        <div className="table-wrap">
          <table className="results num">
            <thead>
              <tr>
                <th>Model</th>
                <th>AIC</th>
                <th>AICc</th>
                <th>BIC</th>
                <th>ΔAIC</th>
              </tr>
            </thead>
            <tbody>
              {t.ranking.map((r) => (
                <tr key={r.model}>
                  <td>{MODEL_NAMES[r.model] ?? r.model}</td>
                  <td>{r.aic.toFixed(1)}</td>
                  <td>{r.aicc === null ? '—' : r.aicc.toFixed(1)}</td>
                  <td>{r.bic.toFixed(1)}</td>
                  <td>{r.deltaAic.toFixed(1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
