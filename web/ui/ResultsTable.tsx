import type { ReactNode } from 'react';

export interface ResultRow {
  key: string;
  cells: ReactNode[];
}

/**
 * A folded table of results: a summary line that opens it, a header row, one row per result.
 * The Fitness tab's tables of comparisons share this shape.
 */
export function ResultsTable({
  summary,
  testId,
  head,
  rows,
}: {
  summary: ReactNode;
  testId: string;
  head: readonly string[];
  rows: readonly ResultRow[];
}) {
  return (
    <details>
      <summary>{summary}</summary>
      <div className="table-wrap">
        <table className="results num" data-testid={testId}>
          <thead>
            <tr>
              {head.map((h) => (
                <th key={h}>{h}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.key}>
                {r.cells.map((c, i) => (
                  // Cells have no identity of their own: their place in the row is their key.
                  // biome-ignore lint/suspicious/noArrayIndexKey: see above
                  <td key={i}>{c}</td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
