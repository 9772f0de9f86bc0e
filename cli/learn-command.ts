/**
 * `rivalplate learn CORRECTED.jsonl --out MODEL.json`: learns an experiment's model (which objects
 * are colonies, and its two colours under the lab's names) from checked plates.
 */
import { writeFile } from 'node:fs/promises';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';
import { CorrectedFileError, readCorrectedFile } from './corrected-file.ts';
import type { CommandIo } from './io.ts';
import { CheckedPlateError, learnFromPlates } from './learn-from-plates.ts';
import { loadCvCore } from './opencv-quiet.ts';
import { UsageError, wholeNumber } from './options.ts';

const HELP = `Usage: rivalplate learn [options] CORRECTED.jsonl --out MODEL.json

Learns which objects are colonies, and the two colours, from plates a person has checked.
CORRECTED.jsonl holds one JSON object per line, one per checked photo:

  {"file": "day1/plate_04.jpg", "colonies": [{"x": 812.5, "y": 440, "cls": "red"}, ...]}

x and y are pixels of the upright photo at full resolution; cls is the colony's colour, any
text, at most two names in the file (the model counts in those names); file is relative to
CORRECTED.jsonl or absolute. Use the model with: rivalplate count --model MODEL.json FILES...

Options:
  --out FILE        where to write the model (required)
  --dish-mm N       inner dish diameter in mm (default 90)
  -h, --help        show this help

Exit status: 0 learned, 1 the plates could not teach a model, 2 usage or input error.
`;

export async function run(args: string[], io: CommandIo): Promise<number> {
  let options: { input: string; out: string; dishMm: number };
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      options: {
        out: { type: 'string' },
        'dish-mm': { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    });
    if (values.help || (positionals.length === 0 && !values.out)) {
      io.out(HELP);
      return 0;
    }
    if (positionals.length !== 1) throw new UsageError('give exactly one CORRECTED.jsonl');
    if (!values.out) throw new UsageError('--out MODEL.json is required');
    options = {
      input: positionals[0]!,
      out: values.out,
      dishMm: values['dish-mm'] ? wholeNumber(values['dish-mm'], '--dish-mm', 20) : 90,
    };
  } catch (e) {
    if (e instanceof UsageError || e instanceof TypeError) {
      io.err(`rivalplate learn: ${e.message}\n\n${HELP}`);
      return 2;
    }
    throw e;
  }
  const core = await loadCvCore();
  let text: string;
  try {
    const { plates, names } = await readCorrectedFile(options.input);
    const model = await learnFromPlates(
      core,
      plates.map((p) => ({
        photo: p.photo,
        where: `${options.input}: line ${p.line}`,
        colonies: p.colonies,
      })),
      names,
      options.dishMm,
      (i, n, file) => io.status?.(`[${i}/${n}] ${basename(file)}`),
    );
    io.status?.('');
    text = core.modelToJson(model);
    const colours = model.palette
      ? `colours ${model.palette.colours.map((c) => `"${c.name}"`).join(' and ')}`
      : 'colours sorted as by default (the file does not name two colours on measured colonies)';
    const colonies = core.decidesColonies(model)
      ? 'it decides which objects are colonies'
      : `too few colonies to overrule the default rules on which objects are colonies (${core.coloniesNeeded(model)} needed): it sorts the colours only`;
    io.out(
      `learned from ${model.plates} checked ${model.plates === 1 ? 'plate' : 'plates'}: ${model.examples.colonies} colonies and ${model.examples.other} other objects; ${colours}; ${colonies}\n`,
    );
  } catch (e) {
    if (e instanceof CorrectedFileError || e instanceof CheckedPlateError) {
      io.err(`rivalplate learn: ${e.message}`);
      return 2;
    }
    if (e instanceof core.ModelError) {
      io.err(`rivalplate learn: ${options.input}: ${e.message}`);
      return 1;
    }
    throw e;
  }
  await writeFile(options.out, text);
  return 0;
}
