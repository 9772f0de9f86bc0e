import type { Analysis, ReciprocalResult } from '../../fitness/analysis.ts';
import { fixed3 } from '../results/format.ts';

/**
 * Lines competed with the marker both ways round (a reciprocal design): W with the evolved line
 * in each colour, and their average, which weighs each colour the same so a cost of the marker
 * itself cancels (common practice).
 */
export function ReciprocalResults({ analysis }: { analysis: Analysis }) {
  if (analysis.reciprocal.length === 0) return null;
  return (
    <section className="card" aria-label="Both colours">
      <h2>Both colours</h2>
      <div className="table-wrap">
        <table className="results num">
          <thead>
            <tr>
              <th>Line</th>
              <th>Generation</th>
              <th>Evolved line in</th>
              <th>mean W</th>
              <th>average W</th>
              <th>average r</th>
            </tr>
          </thead>
          <tbody>
            {analysis.reciprocal.map((r) => (
              <ReciprocalRow key={`${r.line}/${r.generation}`} result={r} />
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}

function ReciprocalRow({ result: r }: { result: ReciprocalResult }) {
  const colours = [...r.byMarker].sort((x, y) => x.marker.localeCompare(y.marker));
  return (
    <tr>
      <td>{r.line}</td>
      <td>{r.generation}</td>
      <td>
        {colours.map((m) => (
          <div key={m.marker}>
            {m.marker} (n = {m.n})
          </div>
        ))}
      </td>
      <td>
        {colours.map((m) => (
          <div key={m.marker}>{fixed3(m.meanW)}</div>
        ))}
      </td>
      <td>{fixed3(r.meanW)}</td>
      <td>{fixed3(r.meanR)}</td>
    </tr>
  );
}
