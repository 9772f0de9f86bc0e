/**
 * `rivalplate fitness [options] FILE.csv`: relative fitness from a CSV of plate counts.
 * Exit codes: 0 done; 1 the data had problems (listed, each naming its row or assay); 2 usage.
 */
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import {
  type AnalysisOptions,
  analyse,
  DEFAULT_MARKER_CONTROL_GROUP,
} from '../fitness/analysis.ts';
import { DEFAULT_BOOTSTRAP_DRAWS } from '../fitness/competition.ts';
import { readCompetitionCsv } from '../fitness/competition-csv.ts';
import { SEPARATOR_NAMES } from '../fitness/csv.ts';
import { FitnessError } from '../fitness/errors.ts';
import { analysisJson, assertAllFinite } from '../fitness/report.ts';
import { tidyCsv, tidyTables } from '../fitness/tidy-tables.ts';
import { analysisText, type TextOptions } from './fitness-format.ts';
import type { CommandIo } from './io.ts';
import { parseRange, UsageError, wholeNumber } from './options.ts';

const HELP = `Usage: rivalplate fitness [options] FILE.csv

Relative fitness from competition plates: one CSV row per counted plate, with the columns
  assay, group, line, generation, replicate, sample (start|end), dilution_fold, volume_ul,
  test_colonies, reference_colonies, fold_dilution_since_start (required on end rows),
  and optionally days (default 1) and test_marker (for reciprocal designs).

Options:
  --json                   print one JSON document instead of tables
  --csv-dir DIR            also write the results as tidy CSV tables into DIR (assays, groups,
                           comparisons, models, model_parameters, curve_points; NA = missing)
  --range NAME|MIN-MAX     countable range per plate: bam (25–250, default), sm9215 (30–300),
                           iso7218 (10–300), or two numbers such as 30-300
  --exclude-out-of-range   drop out-of-range plates where the sample has an in-range plate
  --control-group NAME     group of marker-control assays (default "${DEFAULT_MARKER_CONTROL_GROUP}")
  --correct-marker         correct the other assays by the marker effect (off by default)
  --compare A,B[,C...]     also test across these groups (2: Welch t-test; more: one-way
                           ANOVA); lines are always compared within each generation, against
                           W = 1, and between generations
  --round bam|iso7218      round densities in the tables to two significant figures
  --draws N                bootstrap draws for the counting-noise interval of W (default ${DEFAULT_BOOTSTRAP_DRAWS})
  --seed N                 mixed into each assay's bootstrap seed (default 0)
  --max-change-points N    largest number of steps tried by the step model (default 3)
  --detect DIFF            also say, per group, how many replicate assays a new group like it
                           would need to tell a difference of DIFF in W (80% power, α = 0.05)
  -h, --help               show this help

Exit status: 0 done, 1 the data had problems (each names its row or assay), 2 usage error.
`;

function parse(args: string[]) {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      json: { type: 'boolean' },
      'csv-dir': { type: 'string' },
      range: { type: 'string' },
      'exclude-out-of-range': { type: 'boolean' },
      'control-group': { type: 'string' },
      'correct-marker': { type: 'boolean' },
      compare: { type: 'string' },
      round: { type: 'string' },
      draws: { type: 'string' },
      seed: { type: 'string' },
      'max-change-points': { type: 'string' },
      detect: { type: 'string' },
      help: { type: 'boolean', short: 'h' },
    },
  });
  if (values.help) return { help: true as const };
  if (positionals.length !== 1) throw new UsageError('expected exactly one CSV file');
  const round = values.round ?? 'none';
  if (round !== 'none' && round !== 'bam' && round !== 'iso7218') {
    throw new UsageError(`--round: expected bam or iso7218, got "${round}"`);
  }
  const rounding: TextOptions['rounding'] = round;
  const options: AnalysisOptions = {
    excludeOutOfRange: Boolean(values['exclude-out-of-range']),
    correctMarker: Boolean(values['correct-marker']),
  };
  if (values.range) options.range = parseRange(values.range);
  if (values['control-group']) options.markerControlGroup = values['control-group'];
  if (values.compare) options.compare = values.compare.split(',').map((s) => s.trim());
  if (values.draws) options.bootstrapDraws = wholeNumber(values.draws, '--draws', 0);
  if (values.seed) options.seed = wholeNumber(values.seed, '--seed', 0);
  if (values['max-change-points']) {
    options.maxChangePoints = wholeNumber(values['max-change-points'], '--max-change-points', 0);
  }
  if (values.detect !== undefined) {
    const d = Number(values.detect);
    if (!(d > 0) || !Number.isFinite(d)) {
      throw new UsageError(`--detect: expected a difference in W > 0, got "${values.detect}"`);
    }
    options.detectDifference = d;
  }
  return {
    help: false as const,
    file: positionals[0]!,
    json: Boolean(values.json),
    csvDir: values['csv-dir'],
    rounding,
    options,
  };
}

export async function run(args: string[], io: CommandIo): Promise<number> {
  let parsed: ReturnType<typeof parse>;
  try {
    parsed = parse(args);
  } catch (e) {
    io.err(`rivalplate fitness: ${(e as Error).message}\n\n${HELP}`);
    return 2;
  }
  if (parsed.help) {
    io.out(HELP);
    return 0;
  }
  const path = resolve(io.cwd, parsed.file);
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (e) {
    io.err(`rivalplate fitness: cannot read ${parsed.file}: ${(e as Error).message}`);
    return 1;
  }
  try {
    const table = readCompetitionCsv(text);
    const analysis = analyse(table.assays, parsed.options);
    if (parsed.csvDir !== undefined) {
      const dir = resolve(io.cwd, parsed.csvDir);
      try {
        await mkdir(dir, { recursive: true });
        for (const t of tidyTables(analysis)) {
          await writeFile(join(dir, `${t.name}.csv`), tidyCsv(t));
        }
      } catch (e) {
        io.err(
          `rivalplate fitness: cannot write the tables into ${parsed.csvDir}: ${(e as Error).message}`,
        );
        return 1;
      }
    }
    if (parsed.json) {
      const doc = analysisJson(analysis);
      assertAllFinite(doc);
      io.out(`${JSON.stringify(doc, null, 2)}\n`);
    } else {
      io.out(analysisText(analysis, { rounding: parsed.rounding }));
      if (table.ignoredColumns.length > 0)
        io.out(`Columns not used: ${table.ignoredColumns.join(', ')}\n`);
      if (table.separator !== ',')
        io.out(
          `Read as ${SEPARATOR_NAMES[table.separator]}-separated (the header has no comma).\n`,
        );
    }
    for (const e of analysis.errors) io.err(`rivalplate fitness: ${e.message}`);
    return analysis.errors.length > 0 ? 1 : 0;
  } catch (e) {
    if (!(e instanceof FitnessError)) throw e;
    io.err(`rivalplate fitness: ${parsed.file}:\n${e.message}`);
    return 1;
  }
}
