/**
 * The one place flag codes become words. The plate analysis and the fitness engine name their
 * remarks by code ("glare", "out-of-range"); people see the short label here beside a number,
 * and the full sentence (kept with the flag) when they open it.
 */

const PLATE_FLAG_LABELS: Record<string, string> = {
  'dish-not-found': 'dish not found',
  glare: 'lid glare',
  'clumps-estimated': 'clumps estimated',
  'low-confidence': 'unsure colours',
  'colour-outliers': 'odd colours left out',
  ink: 'writing on the lid',
  'out-of-focus': 'out of focus',
  'one-colour': 'one colour only',
};

const RESULT_FLAG_LABELS: Record<string, string> = {
  'out-of-range': 'plate outside the countable range',
  'plates-dropped': 'plates left out',
  'test-declined': 'evolved line declined',
  'ci-partial': 'interval from part of the draws',
  'ci-undefined': 'no interval',
  'marker-corrected': 'marker effect removed',
};

/** A code never seen before still reads as words: its dashes become spaces. */
function asWords(code: string): string {
  return code.replace(/-/g, ' ');
}

/** Short label of a remark the plate analysis made on one photo. */
export function plateFlagLabel(kind: string): string {
  return PLATE_FLAG_LABELS[kind] ?? asWords(kind);
}

/** Short label of a remark the fitness engine made on one assay. */
export function resultFlagLabel(code: string): string {
  return RESULT_FLAG_LABELS[code] ?? asWords(code);
}

/** "1 colony", "2 colonies": a count with its noun in the right number. */
export function counted(n: number, one: string, many: string): string {
  return `${n.toLocaleString('en')} ${n === 1 ? one : many}`;
}
