/** Where a command writes, so commands can be run and checked in tests without a terminal. */
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** True when stderr is an interactive terminal (progress bars go there). */
  isTty: boolean;
}

export function processIo(): CliIo {
  return {
    out: (t) => process.stdout.write(t),
    err: (t) => process.stderr.write(t),
    isTty: Boolean(process.stderr.isTTY),
  };
}

/** Exit codes shared by every command. */
export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_BAD_INPUT = 2;

/** The plain caution every report carries. */
export const SAFETY_CAUTION =
  'CAUTION: Tiltbench is a design aid. Steering and suspension are safety-critical: confirm every result by ' +
  'measurement and testing, have welded and bolted parts properly engineered, and follow local vehicle ' +
  'regulations and licensed engineering practice first.';
