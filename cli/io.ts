/** What a command may touch of its process: injected so tests can capture output. */
export interface CommandIo {
  out(text: string): void;
  err(text: string): void;
  /** A progress line that overwrites itself on a terminal; absent when stderr is not one. */
  status?: (text: string) => void;
  /** True when stderr is a terminal, so progress lines may overwrite themselves. */
  isTty: boolean;
  cwd: string;
}

let pipeGuarded = false;

export function processIo(): CommandIo {
  if (!pipeGuarded) {
    // `rivalplate ... | head` closes the pipe early: that is the reader's choice, not an error.
    process.stdout.on('error', (e: NodeJS.ErrnoException) => {
      if (e.code === 'EPIPE') process.exit(0);
      throw e;
    });
    pipeGuarded = true;
  }
  const isTty = Boolean(process.stderr.isTTY);
  return {
    out: (text) => process.stdout.write(text.endsWith('\n') ? text : `${text}\n`),
    err: (text) => process.stderr.write(text.endsWith('\n') ? text : `${text}\n`),
    ...(isTty ? { status: (text: string) => process.stderr.write(`\r${text}\x1b[K`) } : {}),
    isTty,
    cwd: process.cwd(),
  };
}
