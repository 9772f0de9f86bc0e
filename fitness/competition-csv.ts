/**
 * The tidy competition CSV: one row per counted plate.
 *
 * Columns (case and surrounding spaces ignored; order free; unknown columns kept and ignored):
 *   assay, group, line, generation, replicate, sample (start | end), dilution_fold, volume_ul,
 *   test_colonies, reference_colonies, fold_dilution_since_start (required on end rows),
 *   days (optional, default 1), test_marker (optional: the marker the test strain carries, for
 *   reciprocal designs).
 * Rows are named by their line in the file (the header is line 1).
 */
import type { AssayInput } from './competition.ts';
import { parseCsv } from './csv.ts';
import type { Plate } from './densities.ts';
import { FitnessError } from './errors.ts';

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

export const OPTIONAL_COLUMNS = ['days', 'test_marker'] as const;

type Column = (typeof REQUIRED_COLUMNS)[number] | (typeof OPTIONAL_COLUMNS)[number];

export interface CompetitionTable {
  assays: AssayInput[];
  /** Columns present that the engine does not use. */
  ignoredColumns: string[];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const COUNT = /^\d+$/;

/** Thrown when the CSV has problems; `problems` lists each, naming its row. */
export class CsvInputError extends FitnessError {
  constructor(readonly problems: string[]) {
    super(problems.join('\n'));
  }
}

interface Row {
  line: number;
  /** 'row 12 (assay A3)', or 'row 12' when the assay column is blank. */
  where: string;
  get(column: Column): string;
}

function readNumber(
  row: Row,
  column: Column,
  problems: string[],
  rule: (v: number) => boolean,
  need: string,
) {
  const text = row.get(column);
  if (text === '') {
    problems.push(`${row.where}: ${column} is missing`);
    return null;
  }
  const value = Number(text);
  if (!NUMBER.test(text) || !Number.isFinite(value) || !rule(value)) {
    problems.push(`${row.where}: ${column} must be ${need}, got "${text}"`);
    return null;
  }
  return value;
}

function readCount(row: Row, column: Column, problems: string[]) {
  const text = row.get(column);
  if (!COUNT.test(text)) {
    problems.push(`${row.where}: ${column} must be a whole number ≥ 0, got "${text}"`);
    return null;
  }
  return Number(text);
}

interface Pending {
  input: AssayInput;
  lines: number[];
  startLines: number[];
  endLines: number[];
}

/** Parses the CSV text; throws CsvInputError listing every problem found (each names its row). */
export function readCompetitionCsv(text: string): CompetitionTable {
  const records = parseCsv(text);
  const header = records[0];
  if (!header) throw new CsvInputError(['the file is empty: expected a header row']);
  const names = header.fields.map((f) => f.trim().toLowerCase());
  const index = new Map<string, number>();
  names.forEach((n, i) => {
    if (!index.has(n)) index.set(n, i);
  });
  const missing = REQUIRED_COLUMNS.filter((c) => !index.has(c));
  if (missing.length > 0) {
    throw new CsvInputError([
      `header (line ${header.line}): missing column(s) ${missing.join(', ')}`,
    ]);
  }
  const known = new Set<string>([...REQUIRED_COLUMNS, ...OPTIONAL_COLUMNS]);
  const ignoredColumns = names.filter((n) => n !== '' && !known.has(n));
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
    const generation = readNumber(row, 'generation', problems, (v) => v >= 0, 'a number ≥ 0');
    const dilutionFold = readNumber(
      row,
      'dilution_fold',
      problems,
      (v) => v >= 1,
      'a fold ≥ 1 (1000 for a 10⁻³ dilution)',
    );
    const volumeUl = readNumber(row, 'volume_ul', problems, (v) => v > 0, 'a volume > 0 µL');
    const testColonies = readCount(row, 'test_colonies', problems);
    const referenceColonies = readCount(row, 'reference_colonies', problems);
    let D: number | null = null;
    if (sample === 'end' || row.get('fold_dilution_since_start') !== '') {
      D = readNumber(row, 'fold_dilution_since_start', problems, (v) => v >= 1, 'a fold ≥ 1');
    }
    let days = 1;
    if (row.get('days') !== '')
      days = readNumber(row, 'days', problems, (v) => v > 0, 'a number > 0') ?? 1;
    if (problems.length > before) continue;

    const plate: Plate = {
      label: `row ${row.line}`,
      dilutionFold: dilutionFold!,
      volumeMl: volumeUl! / 1000,
      testColonies: testColonies!,
      referenceColonies: referenceColonies!,
    };
    const marker = row.get('test_marker');
    const fields: Omit<AssayInput, 'start' | 'end' | 'foldDilutionSinceStart'> = {
      assay,
      group: row.get('group'),
      line: row.get('line'),
      generation: generation!,
      replicate: row.get('replicate'),
      days,
      ...(marker ? { testMarker: marker } : {}),
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
  return { assays: [...pending.values()].map((e) => e.input), ignoredColumns };
}
