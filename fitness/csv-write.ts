/**
 * CSV text per RFC 4180. A field is quoted when it holds a comma, a quote or a line break; a
 * missing value (null) is written as `missing` (empty by default; "NA" for R's read.csv).
 */
function field(v: string | number | null, missing: string): string {
  if (v === null) return missing;
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(
  header: readonly string[],
  rows: readonly (readonly (string | number | null)[])[],
  missing = '',
): string {
  const line = (r: readonly (string | number | null)[]) =>
    r.map((v) => field(v, missing)).join(',');
  return `${[header, ...rows].map(line).join('\r\n')}\r\n`;
}
