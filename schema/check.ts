/**
 * Field checks for records that arrive from outside the program's own memory (IndexedDB, a
 * backup file, the sync server). Each check either returns the value with its static type or
 * throws a SchemaError that names the field, so a bad record is reported, never half-used.
 */

export class SchemaError extends Error {
  constructor(
    readonly field: string,
    readonly problem: string,
  ) {
    super(`${field}: ${problem}`);
    this.name = 'SchemaError';
  }
}

export type Check<T> = (value: unknown, field: string) => T;

function shown(value: unknown): string {
  if (typeof value === 'string')
    return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}…` : value);
  if (value === null || typeof value !== 'object') return String(value);
  return Array.isArray(value) ? 'a list' : 'an object';
}

export const str: Check<string> = (v, f) => {
  if (typeof v !== 'string') throw new SchemaError(f, `expected text, got ${shown(v)}`);
  return v;
};

export const nonEmpty: Check<string> = (v, f) => {
  if (str(v, f).trim() === '') throw new SchemaError(f, 'must not be empty');
  return v as string;
};

export const bool: Check<boolean> = (v, f) => {
  if (typeof v !== 'boolean') throw new SchemaError(f, `expected true or false, got ${shown(v)}`);
  return v;
};

export const num: Check<number> = (v, f) => {
  if (typeof v !== 'number' || !Number.isFinite(v))
    throw new SchemaError(f, `expected a number, got ${shown(v)}`);
  return v;
};

export const positive: Check<number> = (v, f) => {
  if (num(v, f) <= 0) throw new SchemaError(f, `must be greater than 0, got ${shown(v)}`);
  return v as number;
};

export const count: Check<number> = (v, f) => {
  const n = num(v, f);
  if (!Number.isInteger(n) || n < 0)
    throw new SchemaError(f, `expected a whole number ≥ 0, got ${shown(v)}`);
  return n;
};

export const isoTime: Check<string> = (v, f) => {
  if (Number.isNaN(Date.parse(str(v, f))))
    throw new SchemaError(f, `expected an ISO 8601 time, got ${shown(v)}`);
  return v as string;
};

export function oneOf<const T extends readonly (string | number)[]>(
  ...options: T
): Check<T[number]> {
  return (v, f) => {
    if (!options.includes(v as T[number]))
      throw new SchemaError(f, `expected one of ${options.join(', ')}, got ${shown(v)}`);
    return v as T[number];
  };
}

export function nullable<T>(check: Check<T>): Check<T | null> {
  return (v, f) => (v === null || v === undefined ? null : check(v, f));
}

export function list<T>(check: Check<T>): Check<T[]> {
  return (v, f) => {
    if (!Array.isArray(v)) throw new SchemaError(f, `expected a list, got ${shown(v)}`);
    return v.map((item, i) => check(item, `${f}[${i}]`));
  };
}

export function pair<T>(check: Check<T>): Check<[T, T]> {
  return (v, f) => {
    const items = list(check)(v, f);
    if (items.length !== 2) throw new SchemaError(f, `expected 2 entries, got ${items.length}`);
    return [items[0]!, items[1]!];
  };
}

export function triple(v: unknown, f: string): [number, number, number] {
  const items = list(num)(v, f);
  if (items.length !== 3) throw new SchemaError(f, `expected 3 numbers, got ${items.length}`);
  return [items[0]!, items[1]!, items[2]!];
}

/** A Blob, recognised by shape because this realm has no DOM types. */
export function blob<B>(v: unknown, f: string): B {
  const b = v as { size?: unknown; type?: unknown; arrayBuffer?: unknown } | null;
  if (
    !b ||
    typeof b.size !== 'number' ||
    typeof b.type !== 'string' ||
    typeof b.arrayBuffer !== 'function'
  )
    throw new SchemaError(f, `expected binary data (a Blob), got ${shown(v)}`);
  return v as B;
}

type Shape<T> = { [K in keyof T]-?: Check<T[K]> };

/** An object with exactly the checked fields (unknown extra fields are dropped). */
export function object<T>(shape: Shape<T>): Check<T> {
  return (v, f) => {
    if (v === null || typeof v !== 'object' || Array.isArray(v))
      throw new SchemaError(f, `expected an object, got ${shown(v)}`);
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(shape) as (keyof T & string)[]) {
      out[key] = shape[key]((v as Record<string, unknown>)[key], f ? `${f}.${key}` : key);
    }
    return out as T;
  };
}
