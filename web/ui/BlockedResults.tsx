import type { AnovaRow, BlockedComparison } from '../../fitness/blocks.ts';
import { fixed3, pValue } from '../results/format.ts';

/**
 * The lines of one generation compared with the days or batches (blocks) taken into account:
 * the fixed-effects analysis aov(W ~ block + line) and the REML random-intercept model
 * lme(W ~ line, random = ~ 1 | block) (fitness/blocks.ts); `BlockedGuide` says when to read which.
 */
export function BlockedResults({
  generation,
  blocked: b,
}: {
  generation: number;
  blocked: BlockedComparison;
}) {
  const anova = b.anova;
  return (
    <div data-testid="blocked-results">
      <h4>
        Generation {generation} in blocks ({b.blocks.join(', ')})
      </h4>
      {'reason' in anova ? (
        <p className="muted">
          Block and line analysis of variance: not computable ({anova.reason}).
        </p>
      ) : (
        <div className="table-wrap">
          <table className="results num">
            <thead>
              <tr>
                <th>W ~ block + line</th>
                <th>df</th>
                <th>sum of squares</th>
                <th>F</th>
                <th>p</th>
              </tr>
            </thead>
            <tbody>
              {(['block', 'line'] as const).map((term) => (
                <tr key={term}>
                  <td>{term}</td>
                  <AnovaCells row={anova[term]} />
                </tr>
              ))}
              <tr>
                <td>residual</td>
                <td>{anova.residual.df}</td>
                <td>{anova.residual.ss.toPrecision(4)}</td>
                <td />
                <td />
              </tr>
            </tbody>
          </table>
        </div>
      )}
      {'reason' in b.mixed ? (
        <p className="muted">
          Mixed model (block as a random effect): not computable ({b.mixed.reason}).
        </p>
      ) : (
        <>
          <div className="table-wrap">
            <table className="results num">
              <thead>
                <tr>
                  <th>Mixed model, REML</th>
                  <th>estimate</th>
                  <th>SE</th>
                  <th>df</th>
                  <th>p</th>
                </tr>
              </thead>
              <tbody>
                {b.mixed.fixed.map((x) => (
                  <tr key={x.name}>
                    <td>{x.name}</td>
                    <td>{fixed3(x.estimate)}</td>
                    <td>{fixed3(x.se)}</td>
                    <td>{x.df}</td>
                    <td>{pValue(x.p)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <p className="muted">
            SD between blocks {fixed3(b.mixed.sdBlock)}, within a block {fixed3(b.mixed.sdResidual)}
            .
          </p>
        </>
      )}
    </div>
  );
}

/** A term with no df (blocks that the lines already tell apart) has no F and no p. */
function AnovaCells({ row }: { row: AnovaRow }) {
  return (
    <>
      <td>{row.df}</td>
      <td>{row.ss.toPrecision(4)}</td>
      <td>{row.df > 0 ? row.f.toFixed(2) : '—'}</td>
      <td>{row.df > 0 ? pValue(row.p) : '—'}</td>
    </>
  );
}

/** When to read which of the two blocked analyses (fitness/blocks.ts), said once under them. */
export function BlockedGuide() {
  return (
    <p className="muted">
      Read the analysis of variance when these blocks are the days of interest and every line ran in
      every block; read the mixed model when the blocks stand for days in general, when some lines
      miss some blocks, or to weigh the day-to-day spread against the spread within a day.
    </p>
  );
}
