/** An odd kernel size of at least `min` pixels, nearest to `v` (opencv kernels need a centre pixel). */
export function oddAtLeast(min: number, v: number): number {
  const n = Math.max(min, Math.round(v));
  return n % 2 === 1 ? n : n + 1;
}
