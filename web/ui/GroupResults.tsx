import { type Analysis, DEFAULT_MARKER_CONTROL_GROUP } from '../../fitness/analysis.ts';
import { fixed3, interval, pValue } from '../results/format.ts';
import { generationComparisons } from '../results/generation-comparisons.ts';

/**
 * Replicate groups (each line against the ancestor: W = 1), the marker effect when there are
 * marker controls, and the lines compared with each other at each generation.
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
  const compared = generationComparisons(analysis.assays, m?.group ?? DEFAULT_MARKER_CONTROL_GROUP);
  return (
    <section className="card" aria-label="Groups">
      <h2>Replicate groups</h2>
      <div className="table-wrap">
        <table className="results num" data-testid="group-results">
          <thead>
            <tr>
              <th>Group</th>
              <th>n</th>
              <th>mean W ± SD</th>
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
                  {fixed3(g.W.mean)} ± {fixed3(g.W.sd)}
                </td>
                <td>{interval(g.W.ci)}</td>
                <td>{pValue(g.W_vs_1?.p)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <details>
        <summary>r per group (mean r, p for r = 0)</summary>
        <div className="table-wrap">
          <table className="results num">
            <thead>
              <tr>
                <th>Group</th>
                <th>mean r</th>
                <th>p (r = 0)</th>
              </tr>
            </thead>
            <tbody>
              {analysis.groups.map((g) => (
                <tr key={g.group}>
                  <td>{g.group}</td>
                  <td>{fixed3(g.r.mean)}</td>
                  <td>{pValue(g.r_vs_0?.p)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
      <p className="muted">Two-sided one-sample t-tests; intervals from Student's t.</p>
      {m && (
        <p data-testid="marker-effect">
          <b>Marker effect</b> ({m.group}, n = {m.n}): mean W {fixed3(m.W.mean)}, 95% CI{' '}
          {interval(m.W.ci)}, p (W = 1) {pValue(m.W_vs_1?.p)}.{' '}
          {m.applied
            ? 'The other assays were corrected by it.'
            : 'Not applied to the other assays.'}
        </p>
      )}
      {compared.map((c) => (
        <p key={c.generation} data-testid="generation-comparison">
          <b>Lines at generation {c.generation}</b> ({c.groups.join(', ')}):{' '}
          {c.test === 'welch' ? "Welch's t-test" : 'one-way ANOVA'} of W, p = {pValue(c.result.p)}.
        </p>
      ))}
    </section>
  );
}
