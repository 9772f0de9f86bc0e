import type { Analysis } from '../../fitness/analysis.ts';
import { fixed3, interval, pValue } from '../results/format.ts';
import { LineComparisons } from './LineComparisons.tsx';

/**
 * Replicate groups (with the assays each left out, and a mark where one rests on photo counts
 * nobody checked), the marker effect when there are marker controls, the lab's comparisons of
 * lines, and the test across chosen groups.
 */
export function GroupResults({
  analysis,
  unchecked,
  onCorrect,
}: {
  analysis: Analysis;
  /** Groups with an assay resting on photo counts nobody checked. */
  unchecked: ReadonlySet<string>;
  /** Turns the marker correction on or off. */
  onCorrect: (on: boolean) => void;
}) {
  const m = analysis.markerEffect;
  const c = analysis.comparison;
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
      <LineComparisons comparisons={analysis.comparisons} corrected={Boolean(m?.applied)} />
      {m && (
        <p data-testid="marker-effect">
          <b>Marker effect</b> ({m.group}, n = {m.n}): mean W {fixed3(m.W.mean)}, 95% CI{' '}
          {interval(m.W.ci)}, p (W = 1) {pValue(m.W_vs_1?.p)}.{' '}
          {m.applied
            ? "The other assays were corrected by it (W divided by the controls' mean W, r less their mean r); intervals and tests carry the controls' uncertainty."
            : 'Not applied to the other assays.'}{' '}
          <button
            type="button"
            className="btn quiet"
            data-testid="correct-marker"
            aria-pressed={m.applied}
            onClick={() => onCorrect(!m.applied)}
          >
            {m.applied ? 'Show uncorrected values' : 'Correct for the marker effect'}
          </button>
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
