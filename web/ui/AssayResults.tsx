import type { Analysis } from '../../fitness/analysis.ts';
import type { FitnessInputs } from '../results/assay-inputs.ts';
import { fixed3, interval } from '../results/format.ts';
import { assayFlagLabels } from '../words/flag-words.ts';

/**
 * Per assay: W with its counting-noise interval, r per day with its SE, every flag in words, and
 * a mark on the assays resting on photo counts nobody checked.
 */
export function AssayResults({
  analysis,
  imageFlags,
  unchecked,
}: {
  analysis: Analysis;
  imageFlags: FitnessInputs['imageFlags'];
  unchecked: ReadonlySet<string>;
}) {
  const flagged = analysis.assays.some((x) => x.flags.length || imageFlags.get(x.assay)?.length);
  return (
    <details className="card" aria-label="Assays" open={analysis.assays.length <= 12}>
      <summary>
        <h2 style={{ display: 'inline' }}>Relative fitness per assay ({analysis.assays.length})</h2>
      </summary>
      <p className="muted">
        W = m_test / m_ref (realised Malthusian parameters), interval from counting noise
        (bootstrap, 95%); r per day = (m_test − m_ref) / days, ± its counting SE. ≤ or ≥ marks a
        bound: a strain had no colony, counted as 3.0 (its 95% Poisson limit); bounds are left out
        of means and tests.
      </p>
      <div className="table-wrap">
        <table className="results num" data-testid="assay-results">
          <thead>
            <tr>
              <th>Assay</th>
              <th>W</th>
              <th>95% CI</th>
              <th>r/day ± SE</th>
            </tr>
          </thead>
          <tbody>
            {analysis.assays.flatMap((x) => {
              const labels = assayFlagLabels(x.flags, imageFlags.get(x.assay) ?? []);
              return [
                <tr key={x.assay} data-testid={`result-${x.assay}`}>
                  <td>{x.assay}</td>
                  <td
                    data-testid="W"
                    title={x.bound ? 'a bound: a strain had no colony' : undefined}
                  >
                    {x.bound ? `${x.bound === 'at-most' ? '≤' : '≥'} ${fixed3(x.W)}` : fixed3(x.W)}
                  </td>
                  <td>{interval(x.W_ci)}</td>
                  <td>
                    {fixed3(x.rPerDay)} ± {fixed3(x.countingSe.r / x.days)}
                  </td>
                </tr>,
                (unchecked.has(x.assay) || labels.length > 0) && (
                  <tr key={`${x.assay}-flags`} className="flags-row">
                    <td colSpan={4}>
                      {unchecked.has(x.assay) && (
                        <span className="flag" data-testid="unchecked">
                          unchecked
                        </span>
                      )}
                      {labels.map((l) => (
                        <span key={l} className="flag">
                          {l}
                        </span>
                      ))}
                    </td>
                  </tr>
                ),
              ];
            })}
          </tbody>
        </table>
      </div>
      {flagged && (
        <details>
          <summary>What the flags say</summary>
          <ul className="muted">
            {analysis.assays.flatMap((x) => [
              ...x.flags.map((fl) => (
                <li key={`${x.assay}-${fl.code}`}>
                  {x.assay}: {fl.message}
                </li>
              )),
              ...(imageFlags.get(x.assay) ?? []).map((fl) => (
                <li key={`${fl.plate}-${fl.kind}`}>
                  {fl.plate}: {fl.detail}
                </li>
              )),
            ])}
          </ul>
        </details>
      )}
    </details>
  );
}
