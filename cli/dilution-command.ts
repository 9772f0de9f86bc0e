/**
 * `rivalplate dilution`: which dilution and volume to plate so the colonies land in the
 * countable range, from the culture's expected density (or its OD and the lab's calibration).
 * Exit codes: 0 done; 1 the numbers cannot make a plan; 2 usage.
 */
import { parseArgs } from 'node:util';
import { FitnessError } from '../fitness/errors.ts';
import { type DilutionRequest, planDilution } from '../fitness/planning.ts';
import type { CommandIo } from './io.ts';
import { parseRange, UsageError } from './options.ts';

const HELP = `Usage: rivalplate dilution --cfu-per-ml N [options]
       rivalplate dilution --od X --cfu-per-od N [options]

Picks the dilution (a power of the series step) and the volume whose expected colonies,
density × volume / dilution, come closest to the middle of the countable range.

Options:
  --cfu-per-ml N           expected density of the culture, both strains together (e.g. 2e9)
  --od X --cfu-per-od N    or its optical density and the lab's CFU/mL per unit of OD
  --volumes UL[,UL...]     volumes the lab plates, in µL (default 100)
  --step N                 step of the dilution series (default 10)
  --range NAME|MIN-MAX     countable range: bam (25–250, default), sm9215, iso7218, or MIN-MAX
  --json                   print the plan as JSON
  -h, --help               show this help

Exit status: 0 done, 1 no plan from these numbers, 2 usage error.
`;

/** A positive number option such as 2e9 or 0.45, or a usage error naming it. */
function positive(text: string, option: string): number {
  const n = Number(text);
  if (!(n > 0) || !Number.isFinite(n))
    throw new UsageError(`${option}: expected a number above 0, got "${text}"`);
  return n;
}

function parse(
  args: string[],
): { help: true } | { help: false; json: boolean; request: DilutionRequest } {
  const { values, positionals } = parseArgs({
    args,
    allowPositionals: true,
    options: {
      'cfu-per-ml': { type: 'string' },
      od: { type: 'string' },
      'cfu-per-od': { type: 'string' },
      volumes: { type: 'string' },
      step: { type: 'string' },
      range: { type: 'string' },
      json: { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
  });
  if (values.help) return { help: true };
  if (positionals.length > 0) throw new UsageError(`unexpected "${positionals[0]}"`);
  const request: DilutionRequest = {};
  if (values['cfu-per-ml'] !== undefined)
    request.cfuPerMl = positive(values['cfu-per-ml'], '--cfu-per-ml');
  else if (values.od !== undefined && values['cfu-per-od'] !== undefined) {
    request.od = positive(values.od, '--od');
    request.cfuPerOd = positive(values['cfu-per-od'], '--cfu-per-od');
  } else throw new UsageError('give --cfu-per-ml, or --od with --cfu-per-od');
  if (values.volumes !== undefined)
    request.volumesUl = values.volumes.split(',').map((v) => positive(v.trim(), '--volumes'));
  if (values.step !== undefined) request.seriesStep = positive(values.step, '--step');
  if (values.range !== undefined) request.range = parseRange(values.range);
  return { help: false, json: Boolean(values.json), request };
}

export async function run(args: string[], io: CommandIo): Promise<number> {
  let parsed: ReturnType<typeof parse>;
  try {
    parsed = parse(args);
  } catch (e) {
    if (!(e instanceof UsageError) && !(e as { code?: string }).code?.startsWith('ERR_PARSE_ARGS'))
      throw e;
    io.err(`rivalplate dilution: ${(e as Error).message}\n\n${HELP}`);
    return 2;
  }
  if (parsed.help) {
    io.out(HELP);
    return 0;
  }
  try {
    const plan = planDilution(parsed.request);
    if (parsed.json) {
      io.out(`${JSON.stringify(plan, null, 2)}\n`);
      return 0;
    }
    const expected = Math.round(plan.expectedColonies);
    const verdict =
      plan.status === 'countable'
        ? 'countable'
        : `${plan.status === 'too-few' ? 'too few' : 'too many'} even at the best dilution`;
    io.out(
      `Plate ${plan.volumeUl} µL of the 1:${plan.dilutionFold.toLocaleString('en')} dilution: about ${expected} ${expected === 1 ? 'colony' : 'colonies'} (${verdict}; ${plan.range.source}).\n`,
    );
    return 0;
  } catch (e) {
    if (!(e instanceof FitnessError)) throw e;
    io.err(`rivalplate dilution: ${e.message}`);
    return 1;
  }
}
