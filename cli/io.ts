/** What a command may touch of its process: injected so tests can capture output. */
export interface CommandIo {
  out(text: string): void;
  err(text: string): void;
  /** True when stderr is a terminal, so progress lines may overwrite themselves. */
  isTty: boolean;
  cwd: string;
}

export function processIo(): CommandIo {
  return {
    out: (text) => process.stdout.write(text.endsWith('\n') ? text : `${text}\n`),
    err: (text) => process.stderr.write(text.endsWith('\n') ? text : `${text}\n`),
    isTty: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
  };
}
