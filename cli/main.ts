/**
 * `rivalplate COMMAND ...`: dispatches to one module per command. Each command module exports
 * `run(args, io)` and resolves to the process exit code.
 */
import type { CommandIo } from './io.ts';
import { processIo } from './io.ts';

type Command = {
  summary: string;
  load: () => Promise<{ run: (args: string[], io: CommandIo) => Promise<number> }>;
};

const COMMANDS: Record<string, Command> = {
  count: {
    summary: 'count the colonies of each marker colour on plate photos',
    load: () => import('./count-command.ts'),
  },
  learn: {
    summary: "learn which objects are colonies, and the colours, from a lab's checked plates",
    load: () => import('./learn-command.ts'),
  },
  accuracy: {
    summary: 'score the counter on a folder of photos labelled by hand',
    load: () => import('./accuracy-command.ts'),
  },
  fitness: {
    summary: 'relative fitness, replicate statistics and trajectories from a CSV of plate counts',
    load: () => import('./fitness-command.ts'),
  },
  dilution: {
    summary: 'which dilution and volume to plate so the colonies land in the countable range',
    load: () => import('./dilution-command.ts'),
  },
  server: {
    summary: "the lab's sync server: start it, add labs, make, list and revoke their tokens",
    load: () => import('./server-command.ts'),
  },
};

function usage(): string {
  const lines = Object.entries(COMMANDS).map(([name, c]) => `  ${name.padEnd(10)} ${c.summary}`);
  return ['Usage: rivalplate COMMAND [options]', '', 'Commands:', ...lines, ''].join('\n');
}

export async function main(argv: string[], io: CommandIo = processIo()): Promise<number> {
  const [name, ...rest] = argv;
  if (!name || name === '--help' || name === '-h') {
    io.out(usage());
    return name ? 0 : 2;
  }
  const command = COMMANDS[name];
  if (!command) {
    io.err(`rivalplate: unknown command "${name}"\n\n${usage()}`);
    return 2;
  }
  const mod = await command.load();
  return mod.run(rest, io);
}
