/**
 * `tiltbench fit`: the hardpoint coordinates that may be off on a built vehicle, found from
 * measurements taken on it (core/studies/fit.ts).
 */
import { readInputFile } from '../readInputFile';
import { checkOutputPath, writeWholeOutput, type OutputTarget } from '../outputFile';
import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError, unreadableDesign } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, parseArgs } from '../args';
import { problemLines } from '../safeText';
import type { FitReport } from '../../studies/fit';
import { studyProgressBar, table } from './studyArgs';

/** A workshop's measurement sheet is a few kilobytes. */
export const MAX_MEASUREMENT_BYTES = 1024 * 1024;
/** At most this many coordinates in one fit. */
export const MAX_FIT_VARIABLES = 24;

export const fitHelp = `tiltbench fit <design.tiltsheet> --measurements FILE.csv --vary ID[,ID...] --out FITTED.tiltsheet [--json]
  Finds where the named hardpoint coordinates of a built vehicle really are, from measurements
  taken on it: the coordinates are moved until the model reproduces the measurements (weighted
  least squares). The CSV has the columns lean_deg, handlebar_deg, travel_mm, side (left or
  right), quantity (toe_deg, camber_deg or road_wheel_angle_deg, signs as in the README), value
  and an optional weight; lines starting with # are comments. --vary takes the ids that
  \`tiltbench tune --list-variables\` lists (e.g. steering.tieRodJoint.right:y). Prints each
  coordinate's move with its standard error, the residual of every measurement, and names any
  coordinate the measurements cannot pin down (it is left where it was). Writes the fitted
  design to --out, never over an input.
  Exit 0 when fitted, 1 when the fitted design does not assemble at a measured pose, 2 for bad
  input (a CSV error names its line and column).`;

const f = (x: number | null, digits = 3) => (x === null ? '-' : x.toFixed(digits));

export function formatFit(r: FitReport, out: string): string {
  const lines = [`fit: ${r.measurements.length} measurements, ${r.variables.length} coordinates; ${r.iterations} iterations, ${r.evaluations} solves of the measured poses, ${r.seconds.toFixed(1)} s`, ''];
  lines.push('coordinates (mm):');
  lines.push(...table([['coordinate', 'moved', 'standard error'], ...r.variables.map((v) => [v.words, v.identifiable ? f(v.movedMm, 3) : 'cannot be pinned down', f(v.standardErrorMm, 3)])], [0]).map((l) => '  ' + l));
  lines.push('', `weighted RMS residual: ${f(r.rmsBeforeDeg, 4)} deg before, ${f(r.rmsAfterDeg, 4)} deg after`, 'measurements (deg):');
  lines.push(
    ...table([['line', 'pose', 'wheel', 'quantity', 'measured', 'before', 'fitted', 'residual'], ...r.measurements.map((m) => [String(m.line), m.pose, m.side, m.quantity.replace(/_deg$/, '').replace(/_/g, ' '), f(m.measured), f(m.before), f(m.modelled), f(m.residual, 4)])], [1, 2, 3]).map((l) => '  ' + l),
  );
  if (r.notes.length > 0) lines.push('', 'notes:', ...r.notes.map((n) => '  ' + n));
  lines.push('', `fitted design written to ${out}`);
  return lines.join('\n') + '\n';
}


export async function runFitCommand(argv: string[], io: CliIo): Promise<number> {
  let designPath: string;
  let csvPath: string;
  let ids: string[];
  let json: boolean;
  let target: OutputTarget;
  try {
    const args = parseArgs(argv, { flags: ['json'], values: ['measurements', 'vary', 'out'] });
    if (args.positionals.length !== 1) throw new ArgError(`expected one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    const m = args.options.get('measurements') as string | undefined;
    const vary = args.options.get('vary') as string | undefined;
    const out = args.options.get('out') as string | undefined;
    if (!m || !vary || !out) throw new ArgError('give --measurements FILE.csv, --vary ID[,ID...] and --out FITTED.tiltsheet');
    csvPath = m;
    ids = vary.split(',').map((s) => s.trim());
    if (ids.some((s) => s === '')) throw new ArgError('--vary: an empty id; separate ids by commas');
    if (new Set(ids).size < ids.length) throw new ArgError('--vary: an id is given twice');
    if (ids.length > MAX_FIT_VARIABLES) throw new ArgError(`--vary: ${ids.length} ids; at most ${MAX_FIT_VARIABLES}`);
    if (!out.toLowerCase().endsWith('.tiltsheet')) throw new ArgError('--out: the fitted design is written to a .tiltsheet file');
    json = args.options.has('json');
    target = checkOutputPath(out, '--out', [{ path: designPath, what: 'design' }, { path: csvPath, what: 'measurement file' }]);
  } catch (e) {
    if (e instanceof ArgError && unreadableDesign(argv, io)) return EXIT_BAD_INPUT;
    return reportArgError(e, io, 'fit', fitHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  const read = readInputFile(csvPath, MAX_MEASUREMENT_BYTES, 'a measurement file');
  if (!read.ok) {
    io.err(`tiltbench fit: ${read.message}\n`);
    return EXIT_BAD_INPUT;
  }
  const { prepareFit } = await import('../../studies/fitInput');
  const { runFit, FitInputError } = await import('../../studies/fit');
  const input = prepareFit(loaded.file, read.text, csvPath, ids);
  if (!input.ok) {
    for (const line of problemLines(input.problems)) io.err(`tiltbench fit: ${line}\n`);
    return EXIT_BAD_INPUT;
  }
  const bar = studyProgressBar(io, 'fit', 'iterations');
  let report: FitReport;
  try {
    report = runFit(loaded.file, input.measurements, input.variables, { onProgress: (d, t) => bar.update(d, t) });
  } catch (e) {
    bar.end();
    if (e instanceof FitInputError) {
      io.err(`tiltbench fit: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  } finally {
    bar.end();
  }
  writeWholeOutput(target, JSON.stringify({ ...report.fitted, notes: [report.fitted.notes ?? '', `Fitted by tiltbench fit to ${report.measurements.length} measurements (${csvPath.split(/[\\/]/).pop()}).`].filter((x) => x).join('\n') }, null, 2) + '\n');
  const assembled = report.measurements.every((m) => m.modelled !== null);
  if (json) {
    const { fitted, ...rest } = report;
    io.out(JSON.stringify({ tiltbench: 'fit', design: loaded.path, out: target.given, fittedName: fitted.name, ...rest, caution: SAFETY_CAUTION }, null, 2) + '\n');
  } else {
    io.out(`${loaded.file.name}\n` + formatFit(report, target.given) + '\n' + SAFETY_CAUTION + '\n');
  }
  return assembled ? EXIT_OK : EXIT_FAILED;
}
