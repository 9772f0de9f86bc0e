/**
 * `rivalplate accuracy [options] FOLDER`: counts a folder of labelled plate photos (see
 * labelled-folder.ts for the truth format) with the same batch procedure as `count`, and prints
 * how far the counts are from the labels, per batch and over all.
 */
import { writeFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';
import type { LearnedModel } from '../cv/index.ts';
import { type PlateScore, type Summary, scorePlate, summarise } from './accuracy-score.ts';
import { countBatch, type Outcome } from './count-batch.ts';
import type { CommandIo } from './io.ts';
import { LabelError, type LabelledPhoto, readLabelledFolder } from './labelled-folder.ts';
import { type CheckedPlate, CheckedPlateError, learnFromPlates } from './learn-from-plates.ts';
import { loadCvCore } from './opencv-quiet.ts';
import { decimalBetween, UsageError, wholeNumber } from './options.ts';

const HELP = `Usage: rivalplate accuracy [options] FOLDER

Counts every labelled photo in FOLDER (a JSON truth file beside each photo) and compares the
counts with the labels: detection precision, recall and F1, median count error on countable
plates (25–300 colonies), colour agreement with one colour mapping per batch, the error of the
ratio of the two colours, and colonies reported on empty plates. Photos sharing a "batch" (or
"style") field are counted as one batch, as a lab counts one experiment.

Options:
  --plates            also print one line per photo
  --json-out FILE     write every figure, per photo and per batch, as JSON
  --dish-mm N         inner dish diameter in mm (default 90)
  --learn-first N     a learning trial: in each batch, correct the first N photos from their
                      labels (the visible colonies with their colours), learn a model from them
                      (as rivalplate learn does), and score the other photos before and after
                      (rows BATCH and BATCH+learned)
  --dish-scale F      scale every dish found by F (0.9 to 1.1) before reading the photo: a check
                      of how far the figures move by chance. 0.998 and 1.002 move the dish's
                      edge by about a pixel, which no colony notices; compare with a run
                      without it
  -h, --help          show this help

Exit status: 0 scored, 1 a photo could not be counted, 2 usage or truth-file error.
`;

interface PlateRow {
  photo: string;
  batch: string;
  score: PlateScore;
  flags: string[];
  error?: string;
}

export async function run(args: string[], io: CommandIo): Promise<number> {
  let options: {
    dir: string;
    plates: boolean;
    jsonOut?: string;
    dishMm: number;
    learnFirst: number;
    dishScale?: number;
  };
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      options: {
        plates: { type: 'boolean' },
        'json-out': { type: 'string' },
        'dish-mm': { type: 'string' },
        'learn-first': { type: 'string' },
        'dish-scale': { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    });
    if (values.help) {
      io.out(HELP);
      return 0;
    }
    if (positionals.length !== 1) throw new UsageError('give exactly one FOLDER');
    options = {
      dir: positionals[0]!,
      plates: Boolean(values.plates),
      ...(values['json-out'] ? { jsonOut: values['json-out'] } : {}),
      dishMm: values['dish-mm'] ? wholeNumber(values['dish-mm'], '--dish-mm', 20) : 90,
      learnFirst: values['learn-first']
        ? wholeNumber(values['learn-first'], '--learn-first', 1)
        : 0,
      ...(values['dish-scale']
        ? { dishScale: decimalBetween(values['dish-scale'], '--dish-scale', 0.9, 1.1) }
        : {}),
    };
  } catch (e) {
    if (e instanceof UsageError || e instanceof TypeError) {
      io.err(`rivalplate accuracy: ${e.message}\n\n${HELP}`);
      return 2;
    }
    throw e;
  }
  let labelled: LabelledPhoto[];
  try {
    labelled = await readLabelledFolder(options.dir);
  } catch (e) {
    if (!(e instanceof LabelError)) throw e;
    io.err(`rivalplate accuracy: ${e.message}`);
    return 2;
  }
  const core = await loadCvCore();
  const rows: PlateRow[] = [];
  const learnedRows: PlateRow[] = [];
  const batches = [...new Set(labelled.map((l) => l.batch))].sort();
  for (const batch of batches) {
    const members = labelled.filter((l) => l.batch === batch);
    const teach = members.slice(0, options.learnFirst);
    const scored = members.slice(teach.length);
    const count = async (model?: LearnedModel) => {
      const { outcomes } = await countBatch(
        core,
        scored.map((m) => m.photo),
        {
          dishMm: options.dishMm,
          jobs: 1,
          ...(model ? { model } : {}),
          ...(options.dishScale !== undefined ? { dishScale: options.dishScale } : {}),
          onPhoto: (i, n, file) => io.status?.(`[${batch} ${i}/${n}] ${basename(file)}`),
        },
      );
      return outcomes.map((o, i) => plateRow(scored[i]!, o));
    };
    rows.push(...(await count()));
    if (teach.length === 0) continue;
    try {
      const model = await learnFromPlates(
        core,
        teach.map(correctedFromTruth),
        colourNames(teach),
        options.dishMm,
      );
      learnedRows.push(...(await count(model)).map((r) => ({ ...r, batch: `${batch}+learned` })));
    } catch (e) {
      if (!(e instanceof CheckedPlateError || e instanceof core.ModelError)) throw e;
      io.err(`rivalplate accuracy: batch ${batch}: nothing learned: ${e.message}`);
    }
  }
  io.status?.('');
  const summaries = [...batches, ...batches.map((b) => `${b}+learned`)].flatMap((b) => {
    const own = [...rows, ...learnedRows].filter((r) => r.batch === b);
    return own.length ? [{ batch: b, ...summarise(own.map((r) => r.score)) }] : [];
  });
  // Over all: each batch keeps its own colour mapping (names are prefixed with the batch).
  const overAll = (list: readonly PlateRow[]) =>
    summarise(list.map((r) => withBatchNames(r.score, r.batch)));
  const all = overAll(rows);
  const totals = [
    { batch: 'all', ...all },
    ...(learnedRows.length ? [{ batch: 'all+learned', ...overAll(learnedRows) }] : []),
  ];
  const silent = rows.filter(
    (r) => r.score.detected === 0 && r.score.visible > 0 && r.flags.length === 0,
  );
  if (options.plates) io.out(plateTable([...rows, ...learnedRows]));
  if (options.learnFirst) {
    io.out(
      `The first ${options.learnFirst} photos of each batch were corrected from their labels and learned from; every figure is on the other photos.\n`,
    );
  }
  io.out(summaryTable([...summaries, ...totals], silent.length));
  if (options.jsonOut) {
    await writeFile(
      options.jsonOut,
      `${JSON.stringify({ plates: [...rows, ...learnedRows], batches: summaries, all, ...(learnedRows.length ? { allLearned: totals[1] } : {}), silentZeros: silent.map((s) => s.photo) }, null, 1)}\n`,
    );
  }
  const failed = rows.filter((r) => r.error);
  for (const f of failed) io.err(`rivalplate accuracy: ${f.photo}: ${f.error}`);
  return failed.length ? 1 : 0;
}

/** The plate's colour names prefixed with its batch, so each batch keeps its own mapping. */
function withBatchNames(s: PlateScore, batch: string): PlateScore {
  const named = (counts: Record<string, number>) =>
    Object.fromEntries(Object.entries(counts).map(([k, v]) => [`${batch}:${k}`, v]));
  return {
    ...s,
    pairs: s.pairs.map(([d, t]) => [`${batch}:${d}`, `${batch}:${t}`]),
    detectedByClass: named(s.detectedByClass),
    visibleByClass: named(s.visibleByClass),
  };
}

/** A labelled photo as a person would leave it after checking: its visible colonies. */
function correctedFromTruth(l: LabelledPhoto): CheckedPlate {
  return {
    photo: l.photo,
    where: l.truthFile,
    colonies: l.colonies.filter((c) => c.visible).map(({ x, y, cls }) => ({ x, y, cls })),
  };
}

function colourNames(labelled: readonly LabelledPhoto[]): string[] {
  return [...new Set(labelled.flatMap((l) => l.colonies.map((c) => c.cls)))];
}

function plateRow(label: LabelledPhoto, o: Outcome): PlateRow {
  if ('error' in o) {
    return {
      photo: label.photo,
      batch: label.batch,
      score: scorePlate(label.colonies, []),
      flags: [],
      error: o.error,
    };
  }
  const names = o.analysis.classes;
  const detections = o.analysis.colonies.flatMap((c) =>
    Array.from({ length: c.count }, () => ({
      x: c.x,
      y: c.y,
      cls: names[c.cls]?.name ?? String(c.cls),
    })),
  );
  return {
    photo: label.photo,
    batch: label.batch,
    score: scorePlate(label.colonies, detections),
    flags: o.analysis.flags.map((f) => f.kind),
  };
}

const pct = (v: number | null) => (v === null ? '—' : `${(100 * v).toFixed(1)}%`);
const fixed = (v: number | null, d = 3) => (v === null ? '—' : v.toFixed(d));

function summaryTable(rows: (Summary & { batch: string })[], silentZeros: number): string {
  const head = 'batch    plates  F1     P      R      count err  colour  ln-ratio  on empty';
  const lines = rows.map((s) =>
    [
      s.batch.padEnd(8),
      String(s.plates).padStart(6),
      fixed(s.f1).padStart(6),
      fixed(s.precision).padStart(6),
      fixed(s.recall).padStart(6),
      pct(s.medianCountError).padStart(10),
      fixed(s.colourAccuracy).padStart(7),
      fixed(s.logRatioError, 2).padStart(9),
      String(s.emptyPlateColonies).padStart(9),
    ].join(' '),
  );
  return [
    head,
    ...lines,
    `plates with visible colonies read as 0 without a flag: ${silentZeros}`,
    '',
  ].join('\n');
}

function plateTable(rows: readonly PlateRow[]): string {
  const lines = rows.map((r) => {
    const s = r.score;
    const err = s.visible ? `${((100 * (s.detected - s.visible)) / s.visible).toFixed(1)}%` : '';
    return `${basename(r.photo).padEnd(16)} ${r.batch.padEnd(4)} visible ${String(s.visible).padStart(4)} found ${String(s.detected).padStart(4)} ${err.padStart(7)} tp ${s.truePositives} fp ${s.falsePositives} fn ${s.falseNegatives} ${JSON.stringify(s.detectedByClass)} ${JSON.stringify(s.visibleByClass)} ${r.flags.join(',')}${r.error ? ` error: ${r.error}` : ''}`;
  });
  return `${lines.join('\n')}\n`;
}
