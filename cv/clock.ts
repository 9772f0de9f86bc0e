// cv/ compiles without DOM or Node types; both runtimes have performance.now(), declared here alone.
declare const performance: { now(): number };

export function now(): number {
  return performance.now();
}
