import { counted } from './counted.ts';

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
  'coarse-photo': 'photo too coarse',
  'one-colour': 'one colour only',
  'nothing-found': 'nothing counted, something there',
  'many-rejected': 'most objects set aside',
  'unstable-count': 'count leans on the threshold',
  'learned-differs': 'learning disagrees',
  'learned-recolours': 'learned colours disagree',
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

/** The sentence for a stored remark: worded now from its code and numbers (older records kept theirs). */
export function storedFlagSentence(f: {
  kind: string;
  values: Record<string, number | string>;
  detail: string | null;
}): string {
  return f.detail ?? plateFlagSentence({ ...f.values, kind: f.kind });
}

/** Short label of a remark the fitness engine made on one assay. */
export function resultFlagLabel(code: string): string {
  return RESULT_FLAG_LABELS[code] ?? asWords(code);
}

/**
 * The short labels of one assay's remarks, each once: the fitness engine's, then those of its
 * plates (which plate each belongs to is said in the sentences).
 */
export function assayFlagLabels(
  resultFlags: readonly { code: string }[],
  plateFlags: readonly { kind: string }[],
): string[] {
  return [
    ...new Set([
      ...resultFlags.map((f) => resultFlagLabel(f.code)),
      ...plateFlags.map((f) => plateFlagLabel(f.kind)),
    ]),
  ];
}

/** A remark of the plate analysis: its code and the numbers that go with it. */
export interface PlateFlagCode {
  kind: string;
  [value: string]: unknown;
}

const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : 0);

/** The sentence a person reads about a remark on one photo: what was seen, what to do. */
export function plateFlagSentence(flag: PlateFlagCode): string {
  switch (flag.kind) {
    case 'dish-not-found':
      return 'Dish not found: drag the dish outline into place and re-read.';
    case 'glare':
      return `Lid glare over ${Math.round(num(flag.fraction) * 100)}% of the agar: check the colonies under it, faint ones may be missed and their colour is the least sure.`;
    case 'clumps-estimated':
      return `${counted(num(flag.clumps), 'clump', 'clumps')} that could not be split, counted from their shape as ${counted(num(flag.colonies), 'colony', 'colonies')}.`;
    case 'low-confidence':
      return `${counted(num(flag.colonies), 'colony', 'colonies')} with an uncertain colour: check them (Unsure).`;
    case 'out-of-focus':
      return `The photo looks out of focus (edges ${num(flag.edgeWidthMm).toFixed(2)} mm wide).`;
    case 'coarse-photo':
      return `The photo resolves the dish in only ${num(flag.pxPerMm).toFixed(1)} pixels per mm: small colonies may be missed. Take it closer, the dish filling the frame.`;
    case 'ink':
      return `Writing on the lid left out in ${counted(num(flag.pieces), 'piece', 'pieces')}: check for colonies under it.`;
    case 'colour-outliers':
      return `${counted(num(flag.colonies), 'blob', 'blobs')} of neither marker colour left out: check them.`;
    case 'one-colour':
      return `One colour only: ${String(flag.reason ?? '')}`;
    case 'nothing-found':
      return `No colony counted, yet ${(num(flag.foregroundShare) * 100).toFixed(1)}% of the agar differs from the agar round it: look for colonies and add them.`;
    case 'many-rejected':
      return `${counted(num(flag.setAside), 'object', 'objects')} set aside as writing, shading or of neither colour, more than the ${counted(num(flag.counted), 'colony', 'colonies')} counted: check what was set aside.`;
    case 'unstable-count':
      return `${Math.round(num(flag.share) * 100)}% of the colonies are barely darker or lighter than the agar: a stricter reading would drop them. Check the faint ones.`;
    case 'learned-differs':
      return `What the experiment learned disagrees with the usual rules here (${counted(num(flag.added), 'object', 'objects')} added, ${num(flag.dropped)} dropped): check the colonies.`;
    case 'learned-recolours':
      return `Sorted by this plate's own two colours: the experiment's learned colours would sort ${counted(num(flag.recoloured), 'colony', 'colonies')} of ${num(flag.colonies)} otherwise. Check the colours.`;
    default: {
      // A remark added to the analysis after this list was written: shown with its numbers.
      const { kind, ...values } = flag;
      const detail = Object.entries(values)
        .map(([k, v]) => `${k} ${String(v)}`)
        .join(', ');
      return `${asWords(kind)}${detail ? `: ${detail}` : ''}`;
    }
  }
}
