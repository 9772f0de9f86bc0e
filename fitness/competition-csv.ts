/**
 * The tidy competition CSV: one row per counted plate.
 *
 * Columns (case and surrounding spaces ignored; order free; unknown columns kept and ignored):
 *   assay, group, line, generation, replicate, sample (start | end), dilution_fold, volume_ul,
 *   test_colonies, reference_colonies, fold_dilution_since_start (required on end rows),
 *   days (optional, default 1), test_marker (optional: the marker the test strain carries, for
 *   reciprocal designs), block (optional: the day or batch the assay was run in).
 * Rows are named by their line in the file (the header is line 1). The separator is the comma, or a
 * semicolon or tab when the header has no comma (then a decimal comma is read as a point). Rows
 * whose cells are all empty (spreadsheets export them) are skipped; a column named twice is refused.
 * Folds are read as written at the bench ("1e5", "10^5", "1:100000", fold-text.ts). Every value
 * has bounds wide enough for any real plate, so no number downstream can overflow.
 */
import type { AssayInput } from './competition.ts';
import { detectSeparator, parseCsv, type Separator } from './csv.ts';
import type { Plate } from './densities.ts';
import { FitnessError } from './errors.ts';
import { parseFold } from './fold-text.ts';

export const REQUIRED_COLUMNS = [
  'assay',
  'group',
  'line',
  'generation',
  'replicate',
  'sample',
  'dilution_fold',
  'volume_ul',
  'test_colonies',
  'reference_colonies',
  'fold_dilution_since_start',
] as const;

export const OPTIONAL_COLUMNS = ['days', 'test_marker', 'block'] as const;

type Column = (typeof REQUIRED_COLUMNS)[number] | (typeof OPTIONAL_COLUMNS)[number];
const KNOWN = new Set<string>([...REQUIRED_COLUMNS, ...OPTIONAL_COLUMNS]);

export interface CompetitionTable {
  assays: AssayInput[];
  /** Columns present that the engine does not use. */
  ignoredColumns: string[];
  /** The separator the file was read with. */
  separator: Separator;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const COUNT = /^\d+$/;

/** Colonies on one plate: far above any countable plate, far below where sums lose precision. */
export const MAX_COLONIES = 10_000_000;
/** Largest fold accepted for a dilution before plating. */
export const MAX_DILUTION_FOLD = 1e30;
/** Largest fold accepted for D (a hundred 1000-fold transfers stay below it). */
export const MAX_FOLD_SINCE_START = 1e300;
export const VOLUME_RANGE_UL: [number, number] = [1e-3, 1e6];
export const MAX_GENERATION = 1e7;
export const MAX_DAYS = 1e4;

/** A cell as quoted in a message: long ones are cut, saying how long they were. */
function shown(text: string): string {
  return text.length <= 24 ? `"${text}"` : `"${text.slice(0, 12)}…" (${text.length} characters)`;
}

/** Thrown when the CSV has problems; `problems` lists each, naming its row. */
export class CsvInputError extends FitnessError {
  constructor(readonly problems: string[]) {
    super(problems.join('\n'));
  }
}

interface Row {
  line: number;
  separator: Separator;
  /** 'row 12 (assay A3)', or 'row 12' when the assay column is blank. */
  where: string;
  get(column: Column): string;
}

/** A plain number; a decimal comma is read as a point when the separator is not the comma. */
function plainNumber(text: string, separator: Separator): number | null {
  const t = separator === ',' ? text : text.replace(',', '.');
  return NUMBER.test(t) ? Number(t) : null;
}

function readNumber(
  row: Row,
  column: Column,
  problems: string[],
  rule: (v: number) => boolean,
  need: string,
  parse: (text: string) => number | null = (t) => plainNumber(t, row.separator),
) {
  const text = row.get(column);
  if (text === '') {
    problems.push(`${row.where}: ${column} is missing`);
    return null;
  }
  const value = parse(text);
  if (value === null || !Number.isFinite(value) || !rule(value)) {
    problems.push(`${row.where}: ${column} must be ${need}, got ${shown(text)}`);
    return null;
  }
  return value;
}

/** A fold as written at the bench, with the comma-separated file's comma never a decimal mark. */
const readFold = (row: Row) => (text: string) =>
  row.separator === ',' && text.includes(',') ? null : parseFold(text);

function readCount(row: Row, column: Column, problems: string[]) {
  const text = row.get(column);
  if (!COUNT.test(text) || Number(text) > MAX_COLONIES) {
    problems.push(
      `${row.where}: ${column} must be a whole number from 0 to ${MAX_COLONIES} (colonies on one plate), got ${shown(text)}`,
    );
    return null;
  }
  return Number(text);
}

/** Column names read from the header, refusing one the engine reads that appears twice. */
function columnIndex(names: readonly string[], headerLine: number): Map<string, number> {
  const index = new Map<string, number>();
  const problems: string[] = [];
  names.forEach((n, i) => {
    const first = index.get(n);
    if (first === undefined) index.set(n, i);
    else if (KNOWN.has(n)) {
      problems.push(
        `header (line ${headerLine}): column "${n}" appears twice (columns ${first + 1} and ${i + 1}); keep one`,
      );
    }
  });
  if (problems.length > 0) throw new CsvInputError(problems);
  return index;
}

/** The missing-columns message, with a word on the separator when the header is one cell. */
function missingColumns(missing: readonly string[], header: readonly string[], line: number) {
  const message = `header (line ${line}): missing column(s) ${missing.join(', ')}`;
  if (header.length > 1) return message;
  return `${message}. The header was read as one column: the file must separate its columns with commas (or semicolons or tabs, which are detected)`;
}

interface Pending {
  input: AssayInput;
  lines: number[];
  startLines: number[];
  endLines: number[];
}

/** Parses the CSV text; throws CsvInputError listing every problem found (each names its row). */
export function readCompetitionCsv(text: string): CompetitionTable {
  const separator = detectSeparator(text);
  const records = parseCsv(text, separator).filter((r) => r.fields.some((f) => f.trim() !== ''));
  const header = records[0];
  if (!header) throw new CsvInputError(['the file is empty: expected a header row']);
  const names = header.fields.map((f) => f.trim().toLowerCase());
  const index = columnIndex(names, header.line);
  const missing = REQUIRED_COLUMNS.filter((c) => !index.has(c));
  if (missing.length > 0) {
    throw new CsvInputError([missingColumns(missing, names, header.line)]);
  }
  const ignoredColumns = names.filter((n) => n !== '' && !KNOWN.has(n));
  const problems: string[] = [];
  const pending = new Map<string, Pending>();

  for (const record of records.slice(1)) {
    if (record.fields.length !== names.length) {
      problems.push(
        `row ${record.line}: has ${record.fields.length} field(s), the header has ${names.length}`,
      );
      continue;
    }
    const get = (c: Column) => {
      const i = index.get(c);
      return i === undefined ? '' : record.fields[i]!.trim();
    };
    const id = get('assay');
    const row: Row = {
      line: record.line,
      separator,
      where: `row ${record.line}${id ? ` (assay ${id})` : ''}`,
      get,
    };
    const before = problems.length;
    const assay = row.get('assay');
    if (assay === '') problems.push(`row ${row.line}: assay is missing`);
    const sample = row.get('sample').toLowerCase();
    if (sample !== 'start' && sample !== 'end') {
      problems.push(`${row.where}: sample must be "start" or "end", got "${row.get('sample')}"`);
    }
    const generation = readNumber(
      row,
      'generation',
      problems,
      (v) => v >= 0 && v <= MAX_GENERATION,
      `a number from 0 to ${MAX_GENERATION}`,
    );
    const dilutionFold = readNumber(
      row,
      'dilution_fold',
      problems,
      (v) => v >= 1 && v <= MAX_DILUTION_FOLD,
      'a fold ≥ 1 (1000, 1e3, 10^3 or 1:1000 for a 10⁻³ dilution)',
      readFold(row),
    );
    const [minUl, maxUl] = VOLUME_RANGE_UL;
    const volumeUl = readNumber(
      row,
      'volume_ul',
      problems,
      (v) => v >= minUl && v <= maxUl,
      `a volume from ${minUl} to ${maxUl} µL`,
    );
    const testColonies = readCount(row, 'test_colonies', problems);
    const referenceColonies = readCount(row, 'reference_colonies', problems);
    let D: number | null = null;
    if (sample === 'end' || row.get('fold_dilution_since_start') !== '') {
      D = readNumber(
        row,
        'fold_dilution_since_start',
        problems,
        (v) => v >= 1 && v <= MAX_FOLD_SINCE_START,
        'a fold ≥ 1 (1 when both samples come from the same flask)',
        readFold(row),
      );
    }
    let days = 1;
    if (row.get('days') !== '')
      days =
        readNumber(
          row,
          'days',
          problems,
          (v) => v > 0 && v <= MAX_DAYS,
          `a number of days > 0 and ≤ ${MAX_DAYS}`,
        ) ?? 1;
    if (problems.length > before) continue;

    const plate: Plate = {
      label: `row ${row.line}`,
      dilutionFold: dilutionFold!,
      volumeMl: volumeUl! / 1000,
      testColonies: testColonies!,
      referenceColonies: referenceColonies!,
    };
    const marker = row.get('test_marker');
    const block = row.get('block');
    const fields: Omit<AssayInput, 'start' | 'end' | 'foldDilutionSinceStart'> = {
      assay,
      group: row.get('group'),
      line: row.get('line'),
      generation: generation!,
      replicate: row.get('replicate'),
      days,
      ...(marker ? { testMarker: marker } : {}),
      ...(block ? { block } : {}),
    };
    let entry = pending.get(assay);
    if (!entry) {
      entry = {
        input: { ...fields, foldDilutionSinceStart: Number.NaN, start: [], end: [] },
        lines: [],
        startLines: [],
        endLines: [],
      };
      pending.set(assay, entry);
    } else {
      const first = entry.lines[0];
      for (const key of [
        'group',
        'line',
        'generation',
        'replicate',
        'days',
        'testMarker',
        'block',
      ] as const) {
        if (entry.input[key] !== fields[key]) {
          problems.push(
            `row ${row.line}: assay ${assay} has ${key} "${fields[key] ?? ''}" here but "${entry.input[key] ?? ''}" on row ${first}`,
          );
        }
      }
    }
    entry.lines.push(row.line);
    if (sample === 'start') {
      entry.input.start.push(plate);
      entry.startLines.push(row.line);
    } else {
      entry.input.end.push(plate);
      entry.endLines.push(row.line);
      if (Number.isNaN(entry.input.foldDilutionSinceStart)) entry.input.foldDilutionSinceStart = D!;
      else if (entry.input.foldDilutionSinceStart !== D) {
        problems.push(
          `row ${row.line}: assay ${assay} has fold_dilution_since_start ${D} here but ${entry.input.foldDilutionSinceStart} on row ${entry.endLines[0]}`,
        );
      }
    }
  }
  for (const [assay, entry] of pending) {
    const rows = entry.lines.join(', ');
    if (entry.startLines.length === 0)
      problems.push(`assay ${assay} (rows ${rows}): no start plate`);
    if (entry.endLines.length === 0) problems.push(`assay ${assay} (rows ${rows}): no end plate`);
  }
  if (records.length === 1) problems.push('no data row after the header');
  if (problems.length > 0) throw new CsvInputError(problems);
  return { assays: [...pending.values()].map((e) => e.input), ignoredColumns, separator };
}
