import type { Analysis } from '../../fitness/analysis.ts';
import { fixed3, interval, pValue } from '../results/format.ts';

/**
 * Replicate groups (with the assays each left out, and a mark where one rests on photo counts
 * nobody checked), the marker effect when there are marker controls, the lab's comparisons of
 * lines, and the test across chosen groups.
 */
export function GroupResults({
  analysis,
  unchecked,
}: {
  analysis: Analysis;
  /** Groups with an assay resting on photo counts nobody checked. */
  unchecked: ReadonlySet<string>;
}) {
  const m = analysis.markerEffect;
  const c = analysis.comparison;
  const lab = analysis.comparisons;
  return (
    <section className="card" aria-label="Groups">
      <h2>Replicate groups</h2>
      <div className="table-wrap">
        <table className="results num" data-testid="group-results">
          <thead>
            <tr>
              <th>Group</th>
              <th>n</th>
              <th>left out</th>
              <th>mean W</th>
              <th>SD</th>
              <th>95% CI (t)</th>
              <th>p (W = 1)</th>
            </tr>
          </thead>
          <tbody>
            {analysis.groups.map((g) => (
              <tr key={g.group}>
                <td>
                  {g.group}
                  {unchecked.has(g.group) && <span className="flag">unchecked</span>}
                </td>
                <td>{g.W.n}</td>
                <td>
                  {[
                    ...(g.bounded ? [`${g.bounded} bounded`] : []),
                    ...(g.dropped ? [`${g.dropped} not computable`] : []),
                  ].join(', ') || '—'}
                </td>
                <td>{fixed3(g.W.mean)}</td>
                <td>{fixed3(g.W.sd)}</td>
                <td>{interval(g.W.ci)}</td>
                <td>{pValue(g.W_vs_1?.p)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="muted">
        Two-sided one-sample t-tests; intervals from Student's t. Assays whose W is only a bound (a
        strain had no colony) or that could not be computed are left out and counted.
      </p>
      {lab.byGeneration.length > 0 && (
        <>
          <h3>Lines within each generation</h3>
          <div className="table-wrap">
            <table className="results num" data-testid="lines-by-generation">
              <thead>
                <tr>
                  <th>Generation</th>
                  <th>Lines</th>
                  <th>ANOVA p</th>
                  <th>Welch ANOVA p</th>
                  <th>Pairs apart (Tukey p &lt; 0.05)</th>
                </tr>
              </thead>
              <tbody>
                {lab.byGeneration.map((g) => (
                  <tr key={g.generation}>
                    <td>{g.generation}</td>
                    <td>{g.lines.length}</td>
                    <td>{pValue(g.anova?.p)}</td>
                    <td>{pValue(g.welch?.p)}</td>
                    <td style={{ textAlign: 'left' }}>
                      {g.tukey
                        ?.filter((t) => t.pAdjusted < 0.05)
                        .map((t) => `${t.first}–${t.second}`)
                        .join(', ') || '—'}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
      {lab.vsAncestor.length > 0 && (
        <details>
          <summary>Each line against the ancestor (W = 1), adjusted for many tests</summary>
          <div className="table-wrap">
            <table className="results num">
              <thead>
                <tr>
                  <th>Line</th>
                  <th>Generation</th>
                  <th>mean W</th>
                  <th>p</th>
                  <th>p Holm</th>
                  <th>p BH</th>
                </tr>
              </thead>
              <tbody>
                {lab.vsAncestor.map((x) => (
                  <tr key={`${x.line}@${x.generation}`}>
                    <td>{x.line}</td>
                    <td>{x.generation}</td>
                    <td>{fixed3(x.meanW)}</td>
                    <td>{pValue(x.test?.p)}</td>
                    <td>{pValue(x.pHolm)}</td>
                    <td>{pValue(x.pBH)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      )}
      {m && (
        <p data-testid="marker-effect">
          <b>Marker effect</b> ({m.group}, n = {m.n}): mean W {fixed3(m.W.mean)}, 95% CI{' '}
          {interval(m.W.ci)}, p (W = 1) {pValue(m.W_vs_1?.p)}.{' '}
          {m.applied
            ? 'The other assays were corrected by it.'
            : 'Not applied to the other assays.'}
        </p>
      )}
      {c?.W && (
        <p>
          <b>{c.test === 'welch' ? "Welch's t-test" : 'One-way ANOVA'}</b> of W across{' '}
          {c.groups.length} groups: p = {pValue(c.W.p)}.
        </p>
      )}
    </section>
  );
}
