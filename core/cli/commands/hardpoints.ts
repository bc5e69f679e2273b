/**
 * `tiltbench hardpoints`: the design's hardpoint table out as CSV for the workshop or a
 * spreadsheet, and an edited table back in as a new design (core/design/hardpointCsv.ts).
 * Both outputs go through the CLI's one output path (temporary file, flushed, renamed), never
 * over an input; a table with any error is refused whole, naming line and column.
 */
import type { CliIo } from '../io';
import { EXIT_BAD_INPUT, EXIT_OK } from '../io';
import { ArgError, parseArgs } from '../args';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { formatIssues } from '../formatIssue';
import { readInputFile } from '../readInputFile';
import { checkOutputPath, writeWholeOutput, type OutputTarget } from '../outputFile';
import { exportHardpointCsv, importHardpointCsv } from '../../design/hardpointCsv';
import { clip, MAX_ECHOED_NAME } from '../safeText';

/** A hardpoint table is a few kilobytes; anything near this is not one. */
export const MAX_TABLE_BYTES = 1024 * 1024;

export const hardpointsHelp = `tiltbench hardpoints <design.tiltsheet> --out TABLE.csv
tiltbench hardpoints <design.tiltsheet> --in TABLE.csv --out NEW.tiltsheet
  The first form writes the design's hardpoint table as CSV (RFC 4180): a header
  "point,side,x_mm,y_mm,z_mm", then one row per hardpoint in the order of the file format;
  side is right or left for a point of each side (a point written once for both sides gets
  both rows) and centre for a single point. Millimetres, ISO 8855 axes (x forward, y left,
  z up). Numbers read back to the same value.
  The second form reads such a table (edited in a spreadsheet, for instance) for the same
  design and writes the design with those hardpoints. Columns are found by name in any
  order; a "note" column is allowed and ignored; the older "point,x_mm,y_mm,z_mm" table
  (".right"/".left" on the point) is still read. Every hardpoint must be listed exactly
  once; unknown points or columns, wrong sides, repeated points and bad numbers are refused
  with their line and column, and nothing is written. A side given as an exact mirror of the other stays written once.
  Neither form writes over its inputs. Exit 0 when written, 2 for bad input.`;


export async function runHardpointsCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let tablePath: string | undefined;
  let target: OutputTarget;
  try {
    const args = parseArgs(argv, { flags: [], values: ['in', 'out'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    tablePath = args.options.get('in') as string | undefined;
    const outPath = args.options.get('out') as string | undefined;
    if (!outPath) throw new ArgError(tablePath ? 'give --out NEW.tiltsheet' : 'give --out TABLE.csv');
    const wants = tablePath ? '.tiltsheet' : '.csv';
    if (!outPath.toLowerCase().endsWith(wants)) throw new ArgError(`--out: ${tablePath ? 'the new design' : 'the table'} is written to a ${wants} file, found "${clip(outPath, 80)}"`);
    target = checkOutputPath(outPath, '--out', [{ path: designPath, what: 'design' }, ...(tablePath ? [{ path: tablePath, what: 'table' }] : [])]);
  } catch (e) {
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'hardpoints', hardpointsHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const name = clip(loaded.file.name, MAX_ECHOED_NAME);

  if (!tablePath) {
    const csv = exportHardpointCsv(loaded.file);
    writeWholeOutput(target, csv);
    io.out(`${name}: wrote ${csv.trimEnd().split('\n').length - 1} hardpoints to ${target.given}\n`);
    return EXIT_OK;
  }

  const read = readInputFile(tablePath, MAX_TABLE_BYTES, 'a hardpoint table');
  if (!read.ok) {
    io.err(`${read.message}\n`);
    return EXIT_BAD_INPUT;
  }
  const imported = importHardpointCsv(loaded.file, read.text, tablePath);
  if (!imported.ok) {
    for (const line of formatIssues(imported.issues)) io.err(line + '\n');
    io.err(`nothing was written\n`);
    return EXIT_BAD_INPUT;
  }
  writeWholeOutput(target, JSON.stringify(imported.design, null, 2) + '\n');
  io.out(`${name}: wrote the design with the table's hardpoints to ${target.given}\n`);
  return EXIT_OK;
}
