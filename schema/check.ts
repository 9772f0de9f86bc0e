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

/**
 * The most bytes (UTF-8) a text field may take. Without a cap, one record could make a server
 * store megabytes of a name once per revision; the caps are far above anything typed at a bench.
 */
export const TEXT_BYTES = {
  /** Record, photo and colony ids (the app makes 36-character UUIDs). */
  id: 128,
  /** Names: experiments, lines, colours, a phone's device id. */
  name: 512,
  /** Any other text field. */
  text: 16 * 1024,
} as const;

/**
 * The length of `s` in UTF-8, or -1 when it holds a lone UTF-16 surrogate: such text has no UTF-8
 * form, so a database would store it altered and never find it again under its own id.
 */
export function utf8Bytes(s: string): number {
  let bytes = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) bytes += 1;
    else if (c < 0x800) bytes += 2;
    else if (c < 0xd800 || c > 0xdfff) bytes += 3;
    else {
      const next = s.charCodeAt(i + 1);
      if (c > 0xdbff || !(next >= 0xdc00 && next <= 0xdfff)) return -1;
      bytes += 4;
      i += 1;
    }
  }
  return bytes;
}

/** Text of valid Unicode, at most `maxBytes` in UTF-8. */
export function textOf(maxBytes: number): Check<string> {
  return (v, f) => {
    if (typeof v !== 'string') throw new SchemaError(f, `expected text, got ${shown(v)}`);
    const bytes = utf8Bytes(v);
    if (bytes < 0)
      throw new SchemaError(f, 'is not valid Unicode text (it holds a lone surrogate)');
    if (bytes > maxBytes)
      throw new SchemaError(f, `is ${bytes} bytes long in UTF-8; at most ${maxBytes} are allowed`);
    return v;
  };
}

function filled(check: Check<string>): Check<string> {
  return (v, f) => {
    if (check(v, f).trim() === '') throw new SchemaError(f, 'must not be empty');
    return v as string;
  };
}

export const str: Check<string> = textOf(TEXT_BYTES.text);

export const nonEmpty: Check<string> = filled(str);

/** An id: not empty, at most `TEXT_BYTES.id` bytes. */
export const idText: Check<string> = filled(textOf(TEXT_BYTES.id));

/** A name: not empty, at most `TEXT_BYTES.name` bytes. */
export const nameText: Check<string> = filled(textOf(TEXT_BYTES.name));

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

const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;

/**
 * A time in the one form `Date.prototype.toISOString` writes (RFC 3339, UTC, milliseconds):
 * times are compared as text to find the latest edit, which is right only when all share it.
 * The round trip also turns away dates that do not exist, such as February 30.
 */
export const isoTime: Check<string> = (v, f) => {
  const text = str(v, f);
  if (!ISO_UTC.test(text) || new Date(text).toISOString() !== text)
    throw new SchemaError(f, `expected a UTC time as YYYY-MM-DDTHH:MM:SS.sssZ, got ${shown(v)}`);
  return text;
};

/** The numbers (or short words) that go with a code: at most 8, finite, short. */
export const codeValues: Check<Record<string, number | string>> = (v, f) => {
  if (v === undefined || v === null) return {};
  if (typeof v !== 'object' || Array.isArray(v))
    throw new SchemaError(f, `expected an object of numbers, got ${shown(v)}`);
  const entries = Object.entries(v as Record<string, unknown>);
  if (entries.length > 8)
    throw new SchemaError(f, `expected at most 8 values, got ${entries.length}`);
  return Object.fromEntries(
    entries.map(([k, x]) => [
      textOf(TEXT_BYTES.name)(k, `${f} key`),
      typeof x === 'number' ? num(x, `${f}.${k}`) : textOf(TEXT_BYTES.name)(x, `${f}.${k}`),
    ]),
  );
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
