/** Numbers in the results tables: three decimals; a dash for a statistic that does not exist. */
export const fixed3 = (v: number | null | undefined): string =>
  v === null || v === undefined ? '—' : v.toFixed(3);

export const pValue = (v: number | null | undefined): string =>
  v === null || v === undefined ? '—' : v < 0.001 ? '<0.001' : v.toFixed(3);

export const interval = (ci: readonly [number, number] | null | undefined): string =>
  ci ? `${fixed3(ci[0])}–${fixed3(ci[1])}` : '—';
