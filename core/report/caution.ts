/**
 * The plain caution every report carries: the CLI prints it under every result
 * (core/cli/io.ts re-exports it) and the workshop report puts it on its first page.
 */
export const SAFETY_CAUTION =
  'CAUTION: Tiltbench is a design aid. Steering and suspension are safety-critical: confirm every result by ' +
  'measurement and testing, have welded and bolted parts properly engineered, and follow local vehicle ' +
  'regulations and licensed engineering practice first.';
