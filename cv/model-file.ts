import { FEATURE_NAMES, MIN_REACH, MODEL_VERSION, ModelError } from './learned-model.ts';
import type { FeatureRange, LearnedModel, Palette } from './types.ts';

/**
 * The learned model as a file: JSON with its fields in a fixed order, so the same model always
 * gives the same bytes. Reading refuses, naming the field, a file that is not such a model, is
 * damaged, or comes from a newer version than this one reads.
 */
export function modelToJson(m: LearnedModel): string {
  const ordered: LearnedModel = {
    format: m.format,
    version: m.version,
    plates: m.plates,
    examples: {
      colonies: m.examples.colonies,
      other: m.examples.other,
      ...(m.examples.found === undefined ? {} : { found: m.examples.found }),
      ...(m.examples.removed === undefined ? {} : { removed: m.examples.removed }),
    },
    features: m.features,
    mean: m.mean,
    sd: m.sd,
    colonyRange: { low: m.colonyRange.low, high: m.colonyRange.high },
    removedRange: m.removedRange && { low: m.removedRange.low, high: m.removedRange.high },
    intercept: m.intercept,
    weights: m.weights,
    lambda: m.lambda,
    reach: m.reach,
    palette: m.palette && {
      version: 1,
      colours: [0, 1].map((k) => {
        const c = m.palette!.colours[k as 0 | 1];
        return { name: c.name, hex: c.hex, deltaLab: c.deltaLab, spread: c.spread };
      }) as unknown as Palette['colours'],
    },
  };
  return `${JSON.stringify(ordered, null, 1)}\n`;
}

export function parseModel(text: string): LearnedModel {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new ModelError(`not a model: not JSON (${(e as Error).message})`);
  }
  if (!isRecord(raw) || raw.format !== 'rivalplate-model') {
    throw new ModelError('not a model: "format" is not "rivalplate-model"');
  }
  if (typeof raw.version !== 'number' || !Number.isInteger(raw.version) || raw.version < 1) {
    throw new ModelError('damaged model: "version" is not a whole number from 1');
  }
  if (raw.version > MODEL_VERSION) {
    throw new ModelError(
      `model version ${raw.version} was made by a newer Rivalplate; this one reads version ${MODEL_VERSION}: update Rivalplate or learn the model again`,
    );
  }
  const n = FEATURE_NAMES.length;
  const features = raw.features;
  if (
    !Array.isArray(features) ||
    features.length !== n ||
    features.some((f, i) => f !== FEATURE_NAMES[i])
  ) {
    throw new ModelError(`damaged model: "features" must be ${FEATURE_NAMES.join(', ')}`);
  }
  const examples = raw.examples;
  if (!isRecord(examples)) throw new ModelError('damaged model: "examples" is missing');
  const model: LearnedModel = {
    format: 'rivalplate-model',
    version: 1,
    plates: count(raw.plates, 'plates'),
    examples: {
      colonies: count(examples.colonies, 'examples.colonies'),
      other: count(examples.other, 'examples.other'),
      ...(examples.found === undefined ? {} : { found: count(examples.found, 'examples.found') }),
      ...(examples.removed === undefined
        ? {}
        : { removed: count(examples.removed, 'examples.removed') }),
    },
    features: [...FEATURE_NAMES],
    mean: numbers(raw.mean, 'mean', n),
    sd: numbers(raw.sd, 'sd', n),
    colonyRange: range(raw.colonyRange, 'colonyRange', n),
    removedRange: raw.removedRange === null ? null : range(raw.removedRange, 'removedRange', n),
    intercept: finite(raw.intercept, 'intercept'),
    weights: numbers(raw.weights, 'weights', n),
    lambda: finite(raw.lambda, 'lambda'),
    reach: reachOf(raw.reach),
    palette: raw.palette === null ? null : palette(raw.palette),
  };
  if (model.sd.some((s) => s <= 0)) throw new ModelError('damaged model: "sd" holds a value ≤ 0');
  return model;
}

function palette(v: unknown): Palette {
  if (!isRecord(v) || v.version !== 1 || !Array.isArray(v.colours) || v.colours.length !== 2) {
    throw new ModelError('damaged model: "palette" must be null or hold two colours');
  }
  const colours = v.colours.map((c: unknown, k: number) => {
    const at = `palette.colours[${k}]`;
    if (!isRecord(c)) throw new ModelError(`damaged model: "${at}" is not an object`);
    if (typeof c.name !== 'string' || c.name === '') {
      throw new ModelError(`damaged model: "${at}.name" is not a name`);
    }
    if (typeof c.hex !== 'string' || !/^#[0-9a-f]{6}$/i.test(c.hex)) {
      throw new ModelError(`damaged model: "${at}.hex" is not a #rrggbb colour`);
    }
    const d = numbers(c.deltaLab, `${at}.deltaLab`, 3);
    return {
      name: c.name,
      hex: c.hex,
      deltaLab: [d[0]!, d[1]!, d[2]!] as const,
      spread: finite(c.spread, `${at}.spread`),
    };
  });
  if (colours[0]!.name === colours[1]!.name) {
    throw new ModelError('damaged model: the two palette colours share one name');
  }
  return { version: 1, colours: [colours[0]!, colours[1]!] };
}

function range(v: unknown, field: string, n: number): FeatureRange {
  if (!isRecord(v)) throw new ModelError(`damaged model: "${field}" is not an object`);
  return { low: numbers(v.low, `${field}.low`, n), high: numbers(v.high, `${field}.high`, n) };
}

function numbers(v: unknown, field: string, length: number): number[] {
  if (!Array.isArray(v) || v.length !== length) {
    throw new ModelError(`damaged model: "${field}" must hold ${length} numbers`);
  }
  return v.map((x, i) => finite(x, `${field}[${i}]`));
}

function finite(v: unknown, field: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) {
    throw new ModelError(`damaged model: "${field}" is not a number`);
  }
  return v;
}

function count(v: unknown, field: string): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0) {
    throw new ModelError(`damaged model: "${field}" is not a whole number`);
  }
  return v;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** A model written before the search could reach further searched with the defaults (1). */
function reachOf(v: unknown): number {
  if (v === undefined) return 1;
  if (typeof v !== 'number' || !(v >= MIN_REACH && v <= 1)) {
    throw new ModelError(`damaged model: "reach" is not a number from ${MIN_REACH} to 1`);
  }
  return v;
}
