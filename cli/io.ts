/**
 * Where the commands write: the process's streams or a recording for tests, and a progress line
 * on stderr that shows only on a terminal.
 */

/** Where a command writes: stdout for results, stderr for messages and progress. */
export interface Io {
  out(text: string): void;
  err(text: string): void;
  /** Whether stderr is a terminal (progress is shown only then). */
  readonly errIsTTY: boolean;
  /** Directory that relative output paths are resolved against. */
  readonly cwd: string;
}

/** The process's own streams. */
export function processIo(): Io {
  return {
    out: (t) => process.stdout.write(t),
    err: (t) => process.stderr.write(t),
    errIsTTY: Boolean(process.stderr.isTTY),
    cwd: process.cwd(),
  };
}

/** An Io that records everything, for tests and for commands run inside other commands. */
export function memoryIo(cwd = process.cwd()): Io & { stdout: string; stderr: string } {
  const io = {
    stdout: '',
    stderr: '',
    errIsTTY: false,
    cwd,
    out(t: string) {
      io.stdout += t;
    },
    err(t: string) {
      io.stderr += t;
    },
  };
  return io;
}

/**
 * A one-line progress indicator on stderr, redrawn in place; silent unless stderr is a terminal.
 */
export function progress(io: Io, label: string): { update(done: number, total: number): void; end(): void } {
  if (!io.errIsTTY) return { update() {}, end() {} };
  let last = -1;
  return {
    update(done, total) {
      const pct = Math.floor((100 * done) / Math.max(1, total));
      if (pct === last) return;
      last = pct;
      io.err(`\r${label} ${pct}%`);
    },
    end() {
      io.err(`\r${' '.repeat(label.length + 6)}\r`);
    },
  };
}
