import { useMemo } from 'react';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { experimentFitness } from '../results/experiment-fitness.ts';
import { TrajectoryPlot } from './TrajectoryPlot.tsx';

const f3 = (v: number | null | undefined) => (v === null || v === undefined ? '—' : v.toFixed(3));
const p = (v: number | null | undefined) =>
  v === null || v === undefined ? '—' : v < 0.001 ? '<0.001' : v.toFixed(3);

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
          <details className="card" aria-label="Assays" open={a.assays.length <= 12}>
            <summary>
              <h2 style={{ display: 'inline' }}>Relative fitness per assay ({a.assays.length})</h2>
            </summary>
            <p className="muted">
              W = m_test / m_ref (realised Malthusian parameters); interval from counting noise
              (bootstrap, 95%). r per day.
            </p>
            <div className="table-wrap">
              <table className="results num" data-testid="assay-results">
                <thead>
                  <tr>
                    <th>Assay</th>
                    <th>W</th>
                    <th>95% CI</th>
                    <th>r/day</th>
                    <th>Flags</th>
                  </tr>
                </thead>
                <tbody>
                  {a.assays.map((x) => (
                    <tr key={x.assay} data-testid={`result-${x.assay}`}>
                      <td>{x.assay}</td>
                      <td data-testid="W">{f3(x.W)}</td>
                      <td>{x.W_ci ? `${f3(x.W_ci[0])}–${f3(x.W_ci[1])}` : '—'}</td>
                      <td>{f3(x.rPerDay)}</td>
                      <td style={{ textAlign: 'left' }}>
                        {x.flags.map((fl) => (
                          <span key={fl.code} className="flag" title={fl.message}>
                            {fl.code}
                          </span>
                        ))}
                        {fit.imageFlags.get(x.assay)?.map((fl) => (
                          <span
                            key={fl.plate + fl.kind}
                            className="flag"
                            title={`${fl.plate}: ${fl.detail}`}
                          >
                            {fl.kind}
                          </span>
                        ))}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            {a.assays.some((x) => x.flags.length || fit.imageFlags.get(x.assay)?.length) && (
              <details>
                <summary>What the flags say</summary>
                <ul className="muted">
                  {a.assays.flatMap((x) => [
                    ...x.flags.map((fl) => (
                      <li key={`${x.assay}-${fl.code}`}>
                        {x.assay}: {fl.message}
                      </li>
                    )),
                    ...(fit.imageFlags.get(x.assay) ?? []).map((fl) => (
                      <li key={`${fl.plate}-${fl.kind}`}>
                        {fl.plate}: {fl.detail}
                      </li>
                    )),
                  ])}
                </ul>
              </details>
            )}
          </details>
          <section className="card" aria-label="Groups">
            <h2>Replicate groups</h2>
            <div className="table-wrap">
              <table className="results num">
                <thead>
                  <tr>
                    <th>Group</th>
                    <th>n</th>
                    <th>mean W</th>
                    <th>SD</th>
                    <th>95% CI (t)</th>
                    <th>p (W = 1)</th>
                  </tr>
                </thead>
                <tbody>
                  {a.groups.map((g) => (
                    <tr key={g.group}>
                      <td>{g.group}</td>
                      <td>{g.W.n}</td>
                      <td>{f3(g.W.mean)}</td>
                      <td>{f3(g.W.sd)}</td>
                      <td>{g.W.ci ? `${f3(g.W.ci[0])}–${f3(g.W.ci[1])}` : '—'}</td>
                      <td>{p(g.W_vs_1?.p)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>
          {a.trajectories.map((t) => (
            <section key={t.line} className="card" aria-label={`Line ${t.line}`}>
              <h2>Line {t.line} over generations</h2>
              <TrajectoryPlot trajectory={t} assays={a.assays} />
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
                ) : null,
              )}
            </section>
          ))}
        </>
      )}
    </>
  );
}
