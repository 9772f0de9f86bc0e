import type { LabComparisons } from '../../fitness/lab-comparisons.ts';
import { fixed3, interval, pValue } from '../results/format.ts';
import { BlockedGuide, BlockedResults } from './BlockedResults.tsx';
import { ResultsTable } from './ResultsTable.tsx';

/**
 * The lab's comparisons of its lines (fitness/lab-comparisons.ts): lines against each other within
 * each generation (and with the blocks taken into account where assays name them), each line
 * against the ancestor, and each line's change between measured generations.
 */
export function LineComparisons({
  comparisons: lab,
  corrected,
}: {
  comparisons: LabComparisons;
  /** The marker correction was applied: intervals and tests carry the controls' uncertainty. */
  corrected: boolean;
}) {
  return (
    <>
      {lab.byGeneration.length > 0 && (
        <>
          <h3>Lines within each generation</h3>
          <div className="table-wrap">
            <table className="results num" data-testid="lines-by-generation">
              <thead>
                <tr>
                  <th>Generation</th>
                  <th>Lines</th>
                  <th>ANOVA F (df)</th>
                  <th>SS between / within</th>
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
                    <td>
                      {g.anova
                        ? `${g.anova.f.toFixed(2)} (${g.anova.dfBetween}, ${g.anova.dfWithin})`
                        : '—'}
                    </td>
                    <td>
                      {g.anova
                        ? `${g.anova.ssBetween.toPrecision(3)} / ${g.anova.ssWithin.toPrecision(3)}`
                        : '—'}
                    </td>
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
          {lab.byGeneration.some((g) => g.tukey) && (
            <details>
              <summary>Every pair of lines, Tukey's HSD (95% family-wise)</summary>
              <div className="table-wrap">
                <table className="results num" data-testid="tukey-pairs">
                  <thead>
                    <tr>
                      <th>Generation</th>
                      <th>Pair</th>
                      <th>difference in W</th>
                      <th>95% CI</th>
                      <th>adjusted p</th>
                    </tr>
                  </thead>
                  <tbody>
                    {lab.byGeneration.flatMap((g) =>
                      (g.tukey ?? []).map((t) => (
                        <tr key={`${g.generation}:${t.first}-${t.second}`}>
                          <td>{g.generation}</td>
                          <td>
                            {t.first} − {t.second}
                          </td>
                          <td>{fixed3(t.diff)}</td>
                          <td>{interval(t.ci)}</td>
                          <td>{pValue(t.pAdjusted)}</td>
                        </tr>
                      )),
                    )}
                  </tbody>
                </table>
              </div>
            </details>
          )}
          {lab.byGeneration.map(
            (g) =>
              g.blocked && (
                <BlockedResults key={g.generation} generation={g.generation} blocked={g.blocked} />
              ),
          )}
          {lab.byGeneration.some((g) => g.blocked) && <BlockedGuide />}
        </>
      )}
      {lab.vsAncestor.length > 0 && (
        <ResultsTable
          summary="Each line against the ancestor (W = 1), adjusted for many tests"
          testId="lines-vs-ancestor"
          head={['Line', 'Generation', 'mean W', '95% CI', 'p', 'p Holm', 'p BH']}
          rows={lab.vsAncestor.map((x) => ({
            key: `${x.line}@${x.generation}`,
            cells: [
              x.line,
              x.generation,
              fixed3(x.meanW),
              interval(x.ci),
              pValue(x.test?.p),
              pValue(x.pHolm),
              pValue(x.pBH),
            ],
          }))}
        />
      )}
      {lab.changes.length > 0 && (
        <ResultsTable
          summary="Each line's change between measured generations, adjusted for many tests"
          testId="line-changes"
          head={['Line', 'From', 'To', 'change in W', '95% CI', 'p (Welch)', 'p Holm', 'p BH']}
          rows={lab.changes.map((x) => ({
            key: `${x.line}@${x.from}-${x.to}`,
            cells: [
              x.line,
              x.from,
              x.to,
              fixed3(x.diff),
              interval(x.ci),
              pValue(x.test?.p),
              pValue(x.pHolm),
              pValue(x.pBH),
            ],
          }))}
        />
      )}
      {corrected && (lab.vsAncestor.length > 0 || lab.changes.length > 0) && (
        <p className="muted">
          Corrected for the marker effect: these intervals and the tests against the ancestor carry
          the uncertainty of the marker controls' mean (delta method, Welch–Satterthwaite df).
        </p>
      )}
    </>
  );
}
