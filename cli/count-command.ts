/**
 * `rivalplate count [options] FILE|FOLDER...`: counts the colonies on plate photos with the same
 * analysis core the app runs in its worker.
 */
import { readdir, readFile, stat, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { extname, join } from 'node:path';
import { parseArgs } from 'node:util';
import type { LearnedModel, Palette } from '../cv/index.ts';
import { type CountableRange, DEFAULT_COUNTABLE_RANGE } from '../fitness/countable-range.ts';
import { countBatch } from './count-batch.ts';
import {
  type CountRecord,
  classCounts,
  countRecord,
  csvErrorRow,
  csvHeader,
  csvRow,
} from './count-record.ts';
import type { CommandIo } from './io.ts';
import { parseRange, UsageError, wholeNumber } from './options.ts';
import { readPaletteFile, writePaletteFile } from './palette-file.ts';

const HELP = () => `Usage: rivalplate count [options] FILE|FOLDER...

Finds the dish and counts the colonies of each marker colour on plate photos (JPEG, PNG, WebP;
EXIF orientation applied). Folders are searched for such files (not recursively).

Without --palette, the two colony colours are learned from the whole batch first and every plate
is classified against them, so a plate holding only one strain is not split in two.

Options:
  --json                 one JSON object per photo, one per line
  --csv                  one CSV row per photo, a count column per colour class (1 and 2)
  --names A,B            what to call colour 1 and colour 2 in the CSV columns and the summary
                         (default colour_1,colour_2); with --palette the classes keep the
                         palette's order, so the columns mean the same in every batch
  --palette FILE         classify against this palette (from --save-palette)
  --save-palette FILE    write the palette learned from this batch
  --model FILE           decide colonies and colours with an experiment's learned model (from
                         rivalplate learn); counts are named by its colours unless --names
  --out FILE             write the results to FILE instead of standard output
  --range NAME|MIN-MAX   countable range per plate: bam (25–250, default), sm9215 (30–300),
                         iso7218 (10–300), or MIN-MAX
  --dish-mm N            inner dish diameter in mm (default 90)
  --jobs N               photos read at once: this thread and N − 1 worker threads (default: the
                         machine's cores, here ${availableParallelism()}); the output is the same for any N
  -h, --help             show this help

A file that cannot be read is reported and skipped; the exit status is then 1.
Exit status: 0 all photos counted, 1 some could not be, 2 usage error.
`;

const PHOTO_EXTENSIONS = new Set(['.jpg', '.jpeg', '.png', '.webp']);

interface Options {
  format: 'json' | 'csv' | 'text';
  /** Names of colour class 0 and 1 (default: the model's colours, or colour_1, colour_2). */
  names?: [string, string];
  palette?: string;
  model?: string;
  savePalette?: string;
  out?: string;
  range: CountableRange;
  dishMm: number;
  jobs: number;
  inputs: string[];
}

export async function run(args: string[], io: CommandIo): Promise<number> {
  let options: Options;
  try {
    options = parseOptions(args);
  } catch (e) {
    if (e instanceof UsageError || e instanceof TypeError) {
      io.err(`rivalplate count: ${e.message}\n\n${HELP()}`);
      return 2;
    }
    throw e;
  }
  if (options.inputs.length === 0) {
    io.out(HELP());
    return 0;
  }
  const files = await expandInputs(options.inputs, io);
  // The cv core's pure parts (model files, palettes) without opencv.js: the photos are read in
  // workers, or countBatch loads opencv.js here for one job.
  const core = await import('../cv/index.ts');
  let palette: Palette | undefined;
  if (options.palette) {
    try {
      palette = await readPaletteFile(options.palette);
    } catch (e) {
      io.err(`rivalplate count: ${(e as Error).message}`);
      return 2;
    }
  }

  let model: LearnedModel | undefined;
  if (options.model) {
    try {
      model = core.parseModel(await readFile(options.model, 'utf8'));
    } catch (e) {
      io.err(`rivalplate count: ${options.model}: ${(e as Error).message}`);
      return 2;
    }
  }
  const names =
    options.names ??
    (model?.palette
      ? [model.palette.colours[0].name, model.palette.colours[1].name]
      : DEFAULT_NAMES);

  const batch = await countBatch(undefined, files, {
    dishMm: options.dishMm,
    jobs: options.jobs,
    ...(palette ? { palette } : {}),
    ...(model ? { model } : {}),
    onPhoto: (i, n, file) => io.status?.(`[${i}/${n} read] ${file}`.slice(0, 100)),
  });
  if (files.length > 0) io.status?.('');
  const { outcomes } = batch;
  palette = batch.palette;
  if (options.savePalette) {
    if (palette) await writePaletteFile(options.savePalette, palette);
    else io.err('rivalplate count: no palette saved: the batch shows only one colony colour');
  }

  const records = outcomes.map((o) =>
    'analysis' in o ? countRecord(o.file, o.analysis, o.ms, options.range) : o,
  );
  const text = render(records, options.format, names);
  if (options.out) await writeFile(options.out, text);
  else io.out(text);
  let failed = 0;
  for (const o of outcomes) {
    if ('error' in o) {
      failed++;
      io.err(`rivalplate count: ${o.file}: ${o.error}`);
    }
  }
  return failed > 0 || files.length === 0 ? 1 : 0;
}

function parseOptions(args: string[]): Options {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      json: { type: 'boolean' },
      csv: { type: 'boolean' },
      names: { type: 'string' },
      palette: { type: 'string' },
      'save-palette': { type: 'string' },
      model: { type: 'string' },
      out: { type: 'string' },
      range: { type: 'string' },
      'dish-mm': { type: 'string' },
      jobs: { type: 'string' },
      help: { type: 'boolean', short: 'h' },
    },
  });
  if (values.json && values.csv) throw new UsageError('choose one of --json and --csv');
  if (values.palette && values.model) throw new UsageError('choose one of --palette and --model');
  return {
    format: values.json ? 'json' : values.csv ? 'csv' : 'text',
    ...(values.names === undefined ? {} : { names: parseNames(values.names) }),
    ...(values.palette ? { palette: values.palette } : {}),
    ...(values.model ? { model: values.model } : {}),
    ...(values['save-palette'] ? { savePalette: values['save-palette'] } : {}),
    ...(values.out ? { out: values.out } : {}),
    range: values.range ? parseRange(values.range) : DEFAULT_COUNTABLE_RANGE,
    dishMm: values['dish-mm'] ? wholeNumber(values['dish-mm'], '--dish-mm', 20) : 90,
    jobs: values.jobs ? wholeNumber(values.jobs, '--jobs', 1) : availableParallelism(),
    inputs: values.help ? [] : positionals,
  };
}

/** Column names when none are given: by class, never by a colour measured on the photos. */
const DEFAULT_NAMES: [string, string] = ['colour_1', 'colour_2'];

function parseNames(text: string): [string, string] {
  const names = text.split(',').map((n) => n.trim());
  if (names.length !== 2 || names.some((n) => !n) || names[0] === names[1])
    throw new UsageError(`--names takes two different names, e.g. red,white (got "${text}")`);
  return [names[0]!, names[1]!];
}

/** Files as given; folders replaced by their photo files in name order. */
async function expandInputs(inputs: readonly string[], io: CommandIo): Promise<string[]> {
  const files: string[] = [];
  for (const input of inputs) {
    const info = await stat(input).catch(() => null);
    if (info?.isDirectory()) {
      const names = (await readdir(input)).filter((n) =>
        PHOTO_EXTENSIONS.has(extname(n).toLowerCase()),
      );
      if (names.length === 0)
        io.err(`rivalplate count: ${input}: no JPEG, PNG or WebP files in this folder`);
      files.push(...names.sort().map((n) => join(input, n)));
    } else {
      files.push(input); // missing or unreadable files are reported by countBatch, in order
    }
  }
  return files;
}

function render(
  records: readonly (CountRecord | { file: string; error: string })[],
  format: Options['format'],
  names: readonly [string, string],
): string {
  if (format === 'json') {
    return records.map((r) => JSON.stringify(r)).join('\n') + (records.length ? '\n' : '');
  }
  if (format === 'csv') {
    const rows = records.map((r) =>
      'error' in r ? csvErrorRow(r.file, r.error, names) : csvRow(r),
    );
    return `${[csvHeader(names), ...rows].join('\n')}\n`;
  }
  const lines = records.map((r) => {
    if ('error' in r) return `${r.file}\n  not counted: ${r.error}`;
    const byClass = classCounts(r);
    const counts = names.map((n, i) => `${n} ${byClass[i]}`).join(', ');
    const flags = r.flags.length ? `; ${r.flags.map((f) => f.kind).join(', ')}` : '';
    const countable =
      r.countable.status === 'countable' ? '' : `; ${r.countable.status} for ${r.countable.range}`;
    return `${r.file}\n  ${r.total} colonies (${counts})${countable}${flags}; ${r.ms} ms`;
  });
  return `${lines.join('\n')}\n`;
}
