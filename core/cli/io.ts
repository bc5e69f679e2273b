/** Where a command writes, so commands can be run and checked in tests without a terminal. */
import { writeSync } from 'node:fs';
import { isatty } from 'node:tty';
import { escapeControls } from './safeText';

export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** True when stderr is an interactive terminal (progress bars go there). */
  isTty: boolean;
}

/** Exit codes shared by every command. */
export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_BAD_INPUT = 2;
/** The job ran but its output could not be written (disk full, I/O error); sysexits' EX_IOERR. */
export const EXIT_CANNOT_WRITE = 74;
/** Stopped by SIGINT (Ctrl-C) or SIGTERM: 128 + the signal number, as shells report it. */
export const EXIT_INTERRUPTED = { SIGINT: 130, SIGTERM: 143 } as const;

/** The words every help text and the usage give for the exit codes beyond 0, 1 and 2. */
export const EXIT_CODES_HELP =
  'Every command: exit 74 when an output (a file, or standard output) cannot be written, e.g. the disk is full, leaving any ' +
  'earlier file untouched; 130 or 143 when stopped by Ctrl-C or SIGTERM, writing nothing; 70 only for a fault in Tiltbench itself.';

/** A write that failed for a reason outside the program (ENOSPC, EIO, ...): exit 74, never 70. */
export class OutputError extends Error {
  constructor(
    readonly target: string,
    readonly code: string | undefined,
    detail: string,
  ) {
    super(`cannot write ${target}: ${detail}`);
  }
}

const WHY: Record<string, string> = {
  ENOSPC: 'no space left on the device',
  EDQUOT: 'the disk quota is used up',
  EFBIG: 'the file grew past the largest size allowed',
  EIO: 'an input/output error on the device',
  EROFS: 'the file system is read-only',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
};

/** A file-system error in words, with its code for a search: "no space left on the device (ENOSPC)". */
export function systemErrorWords(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code && WHY[code]) return `${WHY[code]} (${code})`;
  return code ? `${(e as Error).message}` : String((e as Error).message ?? e);
}

/**
 * Write all of `text` to a file descriptor. process.stdout.write reports a failed write (a
 * full disk under `> file`) later, as an 'error' event with no listener, which kills the
 * process with a stack trace; writing synchronously here makes it an OutputError at once.
 * A reader that went away (`| head`, EPIPE) is not an error: the rest is dropped.
 */
function writeAll(fd: number, text: string, what: string, closed: { value: boolean }): void {
  if (closed.value) return;
  const bytes = Buffer.from(text, 'utf8');
  let at = 0;
  while (at < bytes.length) {
    try {
      at += writeSync(fd, bytes, at, bytes.length - at);
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'EAGAIN') {
        // A non-blocking pipe is full: wait a moment for the reader.
        Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 5);
        continue;
      }
      if (code === 'EPIPE') {
        closed.value = true;
        return;
      }
      throw new OutputError(what, code, systemErrorWords(e));
    }
  }
}

export function processIo(): CliIo {
  const outClosed = { value: false };
  const errClosed = { value: false };
  return {
    out: (t) => writeAll(1, t, 'the standard output', outClosed),
    err: (t) => {
      try {
        writeAll(2, t, 'the standard error', errClosed);
      } catch {
        // Nowhere left to report a failure to report; the exit code still tells.
      }
    },
    // isatty, not process.stderr.isTTY: making that stream would switch a piped stderr to non-blocking.
    isTty: isatty(2),
  };
}

/**
 * The io every command is given: control characters escaped on both streams (text echoed from
 * a file or an argument cannot drive the terminal). A write that starts with a carriage return
 * keeps that one: it is the progress bar redrawing its line.
 */
export function safeIo(io: CliIo): CliIo {
  return {
    out: (t) => io.out(escapeControls(t)),
    err: (t) => io.err(t.startsWith('\r') ? '\r' + escapeControls(t.slice(1)) : escapeControls(t)),
    isTty: io.isTty,
  };
}

/** The plain caution every report carries (one wording, in core/report/caution.ts). */
export { SAFETY_CAUTION } from '../report/caution';
