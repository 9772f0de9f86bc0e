/** One CSV field per RFC 4180: quoted when it holds a comma, a quote or a line break. */
function field(v: string | number | null): string {
  if (v === null) return '';
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function toCsv(
  header: readonly string[],
  rows: readonly (readonly (string | number | null)[])[],
): string {
  return `${[header, ...rows].map((r) => r.map(field).join(',')).join('\r\n')}\r\n`;
}
